import { afterEach, describe, expect, it, vi } from 'vitest';
import { projectApi } from '../../src/lib/api/index';

function answer(body: unknown, status = 200) {
	const calls: { url: string; method: string; body: unknown }[] = [];
	vi.stubGlobal('fetch', async (url: string, init: RequestInit) => {
		calls.push({ url, method: String(init.method), body: init.body === undefined ? undefined : JSON.parse(String(init.body)) });
		return status === 204 ? new Response(null, { status }) : new Response(JSON.stringify(body), { status });
	});
	return calls;
}

afterEach(() => {
	vi.unstubAllGlobals();
});

describe('projectApi(projectId)', () => {
	it('projectApi(id).units() GETs the project\'s units and unwraps the envelope', async () => {
		const calls = answer({ units: [{ id: 'u1' }] });
		expect(await projectApi('p1').units()).toEqual([{ id: 'u1' }]);
		expect(calls).toEqual([{ url: '/api/v1/projects/p1/units', method: 'GET', body: undefined }]);
	});

	it('projectApi(id) encodes path segments, so an id cannot reach another path', async () => {
		const calls = answer({ variograms: [] });
		await projectApi('p/1').variograms('../x?y');
		expect(calls[0].url).toBe('/api/v1/projects/p%2F1/domains/..%2Fx%3Fy/variograms');
	});

	it('projectApi(id) sends bodies as the endpoints read them', async () => {
		const calls = answer({ contact: { soundingId: 's', unitId: 'u', topElevation: 1 } });
		await projectApi('p').putContact({ soundingId: 's', unitId: 'u', topElevation: 1 });
		const next = answer(null, 204);
		await projectApi('p').deleteContact('s', 'u');
		expect(calls[0]).toEqual({ url: '/api/v1/projects/p/contacts', method: 'PUT', body: { soundingId: 's', unitId: 'u', topElevation: 1 } });
		expect(next[0]).toEqual({ url: '/api/v1/projects/p/contacts', method: 'DELETE', body: { soundingId: 's', unitId: 'u' } });
	});

	it('projectApi(id).section(property) passes the property as a query parameter', async () => {
		const calls = answer({ soundings: [] });
		await projectApi('p').section('Qtn');
		expect(calls[0].url).toBe('/api/v1/projects/p/section?property=Qtn');
	});

	it('projectApi(id).restoreVariogram(d, v) sends no body without a note, and { note } with one', async () => {
		const calls = answer({ variogram: { id: 'v2' } }, 201);
		expect(await projectApi('p').restoreVariogram('d', 'v1')).toEqual({ id: 'v2' });
		await projectApi('p').restoreVariogram('d', 'v1', 'Back to v1');
		expect(calls.map((c) => [c.url, c.body])).toEqual([
			['/api/v1/projects/p/domains/d/variograms/v1/restore', undefined],
			['/api/v1/projects/p/domains/d/variograms/v1/restore', { note: 'Back to v1' }]
		]);
	});

	it('projectApi(id).summary(r, stat, threshold) sends the threshold only for below; realization(r) and recipe.json by path', async () => {
		const calls = answer({ values: [] });
		await projectApi('p').summary('r1', 'below', 62.5);
		await projectApi('p').summary('r1', 'mean', 62.5);
		await projectApi('p').realization('r1', 7);
		await projectApi('p').recipeDocument('r1');
		expect(calls.map((c) => c.url)).toEqual([
			'/api/v1/projects/p/recipes/r1/summary?stat=below&threshold=62.5',
			'/api/v1/projects/p/recipes/r1/summary?stat=mean',
			'/api/v1/projects/p/recipes/r1/realizations/7',
			'/api/v1/projects/p/recipes/r1/recipe.json'
		]);
	});

	it('projectApi(id).editContacts(edit) PATCHes the edits and answers what changed', async () => {
		const calls = answer({ changed: { set: 1, removed: 0, interpolated: 0 }, contacts: [] });
		const r = await projectApi('p').editContacts({ set: [{ soundingId: 's', unitId: 'u', topElevation: 1 }] });
		expect(r.changed.set).toBe(1);
		expect(calls[0]).toEqual({ url: '/api/v1/projects/p/contacts', method: 'PATCH', body: { set: [{ soundingId: 's', unitId: 'u', topElevation: 1 }] } });
	});

	it('projectApi(id).csv names the CSV downloads with encoded ids', () => {
		const csv = projectApi('p 1').csv;
		expect(csv.contacts).toBe('/api/v1/projects/p%201/contacts.csv');
		expect(csv.readings(['a', 'b/c'])).toBe('/api/v1/projects/p%201/soundings/readings.csv?s=a,b%2Fc');
		expect(csv.domainStatistics('d')).toBe('/api/v1/projects/p%201/domains/d/statistics.csv');
		expect(csv.zonationStatistics('z')).toBe('/api/v1/projects/p%201/zonations/z/statistics.csv');
	});
});
