// The undo of picked contacts, against an in-memory stand-in for PATCH /contacts that keeps the rules the
// service keeps (editing stops a sounding following its neighbours; interpolate makes it follow again).
import { describe, expect, it } from 'vitest';
import { ContactPicks } from '../../../../src/routes/projects/[id]/contact-picks.svelte';

type Edit = { set?: { soundingId: string; unitId: string; topElevation: number }[]; remove?: { soundingId: string; unitId: string }[]; interpolate?: string[] };

function fakeApi(initial: Record<string, number>, following: string[]) {
	const tops = new Map(Object.entries(initial));
	const follows = new Set(following);
	const calls: Edit[] = [];
	const api = {
		async editContacts(e: Edit) {
			calls.push(e);
			for (const c of e.set ?? []) {
				tops.set(`${c.soundingId}|${c.unitId}`, c.topElevation);
				follows.delete(c.soundingId);
			}
			for (const c of e.remove ?? []) {
				tops.delete(`${c.soundingId}|${c.unitId}`);
				follows.delete(c.soundingId);
			}
			for (const s of e.interpolate ?? []) {
				follows.add(s);
				tops.set(`${s}|sand`, -1.5); // what the neighbours give
			}
			return { changed: { set: 0, removed: 0, interpolated: 0 }, contacts: [] };
		}
	};
	return { api, tops, follows, calls };
}

const unit = (topElevation: number | null, topSource: 'measured' | 'interpolated' | 'ground' | null) => ({ id: 'sand', name: 'Sand', topElevation, topSource });

describe('ContactPicks', () => {
	it('undo() puts back the measured top a pick replaced', async () => {
		const f = fakeApi({ 's1|sand': -2 }, []);
		const picks = new ContactPicks(f.api);
		await picks.pick({ id: 's1', name: 'LV-01', contactsInterpolated: false }, unit(-2, 'measured'), -2.4);
		expect(f.tops.get('s1|sand')).toBe(-2.4);
		expect(picks.last?.before).toBe(-2);
		expect((await picks.undo())?.soundingName).toBe('LV-01');
		expect(f.tops.get('s1|sand')).toBe(-2);
		expect(picks.last).toBeNull();
		expect(await picks.undo()).toBeNull();
	});

	it('undo() removes a contact that did not exist before, and lets a sounding that followed its neighbours follow them again', async () => {
		const f = fakeApi({ 's2|sand': -1.5 }, ['s2']);
		const picks = new ContactPicks(f.api);
		await picks.pick({ id: 's1', name: 'LV-01', contactsInterpolated: false }, unit(null, null), -3);
		await picks.pick({ id: 's2', name: 'LV-02', contactsInterpolated: true }, unit(-1.5, 'interpolated'), -1.8);
		expect(f.follows.has('s2')).toBe(false);
		await picks.undo();
		expect(f.follows.has('s2')).toBe(true);
		expect(f.tops.get('s2|sand')).toBe(-1.5);
		await picks.undo();
		expect(f.tops.has('s1|sand')).toBe(false);
		expect(f.calls.slice(-2)).toEqual([{ interpolate: ['s2'] }, { remove: [{ soundingId: 's1', unitId: 'sand' }] }]);
	});

	it('a pick of the top unit over its ground default is undone by removing the stored top', async () => {
		const f = fakeApi({}, []);
		const picks = new ContactPicks(f.api);
		await picks.pick({ id: 's1', name: 'LV-01', contactsInterpolated: false }, unit(4, 'ground'), 3.5);
		expect(picks.last?.before).toBeNull();
		await picks.undo();
		expect(f.tops.size).toBe(0);
	});

	it('a refused pick is not remembered', async () => {
		const picks = new ContactPicks({
			editContacts: async () => {
				throw new Error('The top elevation 9 lies above the ground surface of LV-01 (4).');
			}
		});
		await expect(picks.pick({ id: 's1', name: 'LV-01', contactsInterpolated: false }, unit(-2, 'measured'), 9)).rejects.toThrow(/above the ground/);
		expect(picks.done).toEqual([]);
	});
});
