import { beforeEach, describe, expect, it } from 'vitest';
import {
	createUnit,
	createZoneBoundary,
	deleteContact,
	deleteUnit,
	listContacts,
	listUnits,
	putContact,
	sectionContacts,
	updateUnit,
	DEFAULT_UNIT_COLOURS
} from '../../../src/lib/server/services/stratigraphy';
import {
	createDomain,
	createZonation,
	deleteZonation,
	getDomain,
	listZonations,
	updateDomain
} from '../../../src/lib/server/services/zonations';
import { domainSamples } from '../../../src/lib/server/services/domains';
import { getSite, updateSite } from '../../../src/lib/server/services/site';
import { ServiceError } from '../../../src/lib/server/errors';
import { projects } from '../../../src/lib/server/db/schema';
import { eq } from 'drizzle-orm';
import { createRecipe } from '../../../src/lib/geostat/index';
import { addSounding, siteTestProject, type SiteTestProject } from './site-db';

let t: SiteTestProject;
beforeEach(() => {
	t = siteTestProject();
});

function expectServiceError(fn: () => unknown, status: number, message?: RegExp): void {
	try {
		fn();
	} catch (err) {
		expect(err).toBeInstanceOf(ServiceError);
		expect((err as ServiceError).status).toBe(status);
		if (message) expect((err as ServiceError).message).toMatch(message);
		return;
	}
	expect.fail(`expected a ServiceError ${status}`);
}

describe('units and contacts', () => {
	it('createUnit(p, input) stacks at the bottom with the next free default colour; a position inserts', () => {
		const a = createUnit(t.projectId, { name: 'Clay' }, t.db);
		const b = createUnit(t.projectId, { name: 'Sand' }, t.db);
		const c = createUnit(t.projectId, { name: 'Peat', position: 0 }, t.db);
		expect([a.colour, b.colour, c.colour]).toEqual([DEFAULT_UNIT_COLOURS[0], DEFAULT_UNIT_COLOURS[1], DEFAULT_UNIT_COLOURS[2]]);
		expect(listUnits(t.projectId, t.db).map((u) => [u.name, u.position])).toEqual([
			['Peat', 0],
			['Clay', 1],
			['Sand', 2]
		]);
		expectServiceError(() => createUnit(t.projectId, { name: 'clay' }, t.db), 409, /already exists/);
	});

	it('listUnits(p) keeps zone names saved before a boundary exists, and uses them once one does', () => {
		const u = createUnit(t.projectId, { name: 'Sand', zoneNames: ['West', 'East'] }, t.db);
		expect(listUnits(t.projectId, t.db)[0]).toMatchObject({ zoneNames: ['Sand'], savedZoneNames: ['West', 'East'] });
		createZoneBoundary(t.projectId, { unitId: u.id, chainageTop: 50, elevationTop: 0, chainageBottom: 50, elevationBottom: -10 }, t.db);
		expect(listUnits(t.projectId, t.db)[0]).toMatchObject({ zoneNames: ['West', 'East'], savedZoneNames: ['West', 'East'] });
	});

	it('updateUnit(p, u, {position}) moves a unit and renumbers; deleteUnit closes the gap', () => {
		const a = createUnit(t.projectId, { name: 'A' }, t.db);
		createUnit(t.projectId, { name: 'B' }, t.db);
		const c = createUnit(t.projectId, { name: 'C' }, t.db);
		updateUnit(t.projectId, c.id, { position: 0, nkt: 16 }, t.db);
		expect(listUnits(t.projectId, t.db).map((u) => u.name)).toEqual(['C', 'A', 'B']);
		expect(listUnits(t.projectId, t.db)[0].nkt).toBe(16);
		deleteUnit(t.projectId, a.id, t.db);
		expect(listUnits(t.projectId, t.db).map((u) => [u.name, u.position])).toEqual([
			['C', 0],
			['B', 1]
		]);
		expectServiceError(() => updateUnit(t.projectId, 'nope', { nkt: 10 }, t.db), 404);
	});

	it('putContact(p, c) creates then replaces; it refuses a top above the ground and foreign ids', () => {
		const u = createUnit(t.projectId, { name: 'Sand' }, t.db);
		const s = addSounding(t.db, t.projectId, 'S-1', { groundElevation: 2 });
		putContact(t.projectId, { soundingId: s, unitId: u.id, topElevation: 1 }, t.db);
		putContact(t.projectId, { soundingId: s, unitId: u.id, topElevation: 0.5 }, t.db);
		expect(listContacts(t.projectId, t.db)).toEqual([{ soundingId: s, soundingName: 'S-1', unitId: u.id, topElevation: 0.5, interpolated: false }]);
		expectServiceError(() => putContact(t.projectId, { soundingId: s, unitId: u.id, topElevation: 2.5 }, t.db), 422, /above the ground/);
		expectServiceError(() => putContact(t.projectId, { soundingId: 'x', unitId: u.id, topElevation: 0 }, t.db), 404);
		deleteContact(t.projectId, s, u.id, t.db);
		expect(listContacts(t.projectId, t.db)).toEqual([]);
		expectServiceError(() => deleteContact(t.projectId, s, u.id, t.db), 404);
	});

	it('sectionContacts(p) orders stations by chainage, starts the top unit at the ground and breaks lines where a unit is absent', () => {
		const clay = createUnit(t.projectId, { name: 'Clay' }, t.db);
		const u = createUnit(t.projectId, { name: 'Sand' }, t.db);
		const s1 = addSounding(t.db, t.projectId, 'S-1', { chainage: 0, groundElevation: 1 });
		const s2 = addSounding(t.db, t.projectId, 'S-2', { chainage: 20 });
		const s3 = addSounding(t.db, t.projectId, 'S-3', { chainage: 10 });
		const s4 = addSounding(t.db, t.projectId, 'S-4', { chainage: 30 });
		putContact(t.projectId, { soundingId: s1, unitId: u.id, topElevation: -1 }, t.db);
		putContact(t.projectId, { soundingId: s3, unitId: u.id, topElevation: -2 }, t.db);
		putContact(t.projectId, { soundingId: s4, unitId: u.id, topElevation: -3 }, t.db);
		// The sand is absent at S-2: someone removed its (interpolated) contact there.
		deleteContact(t.projectId, s2, u.id, t.db);
		const [top, line] = sectionContacts(t.projectId, t.db);
		expect(top.unitId).toBe(clay.id);
		expect(top.stations.map((s) => [s.topElevation, s.source])).toEqual([
			[1, 'ground'],
			[0, 'ground'],
			[0, 'ground'],
			[0, 'ground']
		]);
		expect(line.stations.map((s) => s.soundingId)).toEqual([s1, s3, s2, s4]);
		expect(line.stations.map((s) => s.source)).toEqual(['measured', 'measured', null, 'measured']);
		expect(line.lines).toEqual([
			[
				[0, -1],
				[10, -2]
			],
			[[30, -3]]
		]);
	});

	it('updateSite(p, input) stores the settings and refuses a line without two distinct points', () => {
		updateSite(t.projectId, { sectionLine: [[0, 0], [100, 0]], groundwaterElevation: -1 }, t.db);
		expect(getSite(t.projectId, t.db)).toMatchObject({ geometry: '2d', offLineTolerance: 25, groundwaterElevation: -1, lengthUnit: 'm' });
		expectServiceError(() => updateSite(t.projectId, { sectionLine: [[1, 1], [1, 1]] }, t.db), 422, /two distinct points/);
	});
});

describe('zonations and domains', () => {
	function sandSplit() {
		const clay = createUnit(t.projectId, { name: 'Clay', property: 'suRatio' }, t.db);
		const sand = createUnit(t.projectId, { name: 'Sand', zoneNames: ['West', 'East'] }, t.db);
		createZoneBoundary(t.projectId, { unitId: sand.id, chainageTop: 50, elevationTop: 5, chainageBottom: 50, elevationBottom: -20 }, t.db);
		return { clay, sand };
	}

	it('createZonation(p, input) stores domains with named members and lists them', () => {
		const { clay, sand } = sandSplit();
		const z = createZonation(
			t.projectId,
			{
				name: 'Split',
				description: '',
				domains: [
					{ name: 'Clay', property: 'suRatio', members: [{ unitId: clay.id, zone: -1 }] },
					{ name: 'West', property: 'qc1Ncs', members: [{ unitId: sand.id, zone: 0 }] },
					{ name: 'East', property: 'qc1Ncs', members: [{ unitId: sand.id, zone: 1 }] }
				]
			},
			t.db
		);
		expect(z.domains.map((d) => d.name)).toEqual(['Clay', 'West', 'East']);
		expect(z.domains[2].members).toEqual([{ unitId: sand.id, unitName: 'Sand', zone: 1, zoneName: 'East' }]);
		expect(z.domains[0].members[0].zoneName).toBe('whole unit');
		expect(listZonations(t.projectId, t.db).length).toBe(1);
		expectServiceError(() => createZonation(t.projectId, { name: 'split', description: '', domains: [] }, t.db), 409);
	});

	it('createZonation(p, input) refuses a unit or zone in two domains, and zones a unit does not have', () => {
		const { clay, sand } = sandSplit();
		const twice = {
			name: 'Bad',
			description: '',
			domains: [
				{ name: 'All sand', property: 'qc1Ncs' as const, members: [{ unitId: sand.id, zone: -1 }] },
				{ name: 'East', property: 'qc1Ncs' as const, members: [{ unitId: sand.id, zone: 1 }] }
			]
		};
		expectServiceError(() => createZonation(t.projectId, twice, t.db), 409, /at most one domain/);
		const noZone = { name: 'Bad2', description: '', domains: [{ name: 'C', property: 'suRatio' as const, members: [{ unitId: clay.id, zone: 1 }] }] };
		expectServiceError(() => createZonation(t.projectId, noZone, t.db), 422, /zone 1 does not exist/);
		expect(listZonations(t.projectId, t.db)).toEqual([]);
	});

	it('createDomain(p, z, input) starts with 0.2 m means and 40 m declustering cells; null keeps every reading and equal weights', () => {
		const z = createZonation(t.projectId, { name: 'Z', description: '', domains: [{ name: 'A', property: 'qc1Ncs' }] }, t.db);
		expect(z.domains[0]).toMatchObject({ cellHeight: 0.2, averaging: 'mean', declusterCell: { x: 40, y: 40, z: null } });
		const raw = createDomain(t.projectId, z.id, { name: 'B', property: 'qc1Ncs', cellHeight: null, declusterCell: null }, t.db);
		expect(raw).toMatchObject({ cellHeight: null, averaging: 'none', declusterCell: null });
		t.db.update(projects).set({ lengthUnit: 'ft' }).where(eq(projects.id, t.projectId)).run();
		const ft = createDomain(t.projectId, z.id, { name: 'C', property: 'suRatio' }, t.db);
		expect(ft).toMatchObject({ cellHeight: 0.5, averaging: 'mean', declusterCell: { x: 130, y: 130, z: null } });
	});

	it('createDomain and updateDomain(p, d, {members}) keep members exclusive within a zonation only', () => {
		const { sand } = sandSplit();
		const a = createZonation(t.projectId, { name: 'A', description: '', domains: [] }, t.db);
		const b = createZonation(t.projectId, { name: 'B', description: '', domains: [] }, t.db);
		const west = createDomain(t.projectId, a.id, { name: 'West', property: 'qc1Ncs', members: [{ unitId: sand.id, zone: 0 }] }, t.db);
		// Another zonation may group the same sand differently.
		createDomain(t.projectId, b.id, { name: 'All', property: 'qc1Ncs', members: [{ unitId: sand.id, zone: -1 }] }, t.db);
		const east = createDomain(t.projectId, a.id, { name: 'East', property: 'qc1Ncs' }, t.db);
		expectServiceError(() => updateDomain(t.projectId, east.id, { members: [{ unitId: sand.id, zone: 0 }] }, t.db), 409, /West/);
		const updated = updateDomain(
			t.projectId,
			east.id,
			{ members: [{ unitId: sand.id, zone: 1 }], cellHeight: 0.5, averaging: 'median', declusterCell: { x: 30, y: 30, z: null } },
			t.db
		);
		expect(updated).toMatchObject({ cellHeight: 0.5, averaging: 'median', declusterCell: { x: 30, y: 30, z: null } });
		expect(getDomain(t.projectId, west.id, t.db).zonation.name).toBe('A');
		deleteZonation(t.projectId, a.id, t.db);
		expectServiceError(() => getDomain(t.projectId, west.id, t.db), 404);
	});

	it('domainSamples(p, d) reads the domain from stored soundings, contacts and boundaries', () => {
		const { clay, sand } = sandSplit();
		updateSite(t.projectId, { groundwaterElevation: -0.5 }, t.db);
		for (const [name, c] of [
			['S-1', 10],
			['S-2', 20],
			['S-3', 80]
		] as const) {
			const s = addSounding(t.db, t.projectId, name, { chainage: c, maxDepth: 3 });
			putContact(t.projectId, { soundingId: s, unitId: clay.id, topElevation: 0 }, t.db);
			putContact(t.projectId, { soundingId: s, unitId: sand.id, topElevation: -1 }, t.db);
		}
		const z = createZonation(
			t.projectId,
			{
				name: 'Z',
				description: '',
				domains: [{ name: 'West', property: 'qc1Ncs', members: [{ unitId: sand.id, zone: 0 }], cellHeight: null, declusterCell: { x: 50, y: 50, z: null } }]
			},
			t.db
		);
		const r = domainSamples(t.projectId, z.domains[0].id, t.db);
		expect(r.domain).toMatchObject({ name: 'West', zonationName: 'Z', property: 'qc1Ncs' });
		expect(r.property).toEqual({ key: 'qc1Ncs', label: 'qc1Ncs', unit: '–' });
		expect(r.geometry).toBe('2d');
		// Readings at depths 1.0 … 3.0 m lie in the sand (the one at 1.0 m sits on the contact): 21 per western sounding.
		expect(r.soundings.map((s) => [s.name, s.n])).toEqual([
			['S-1', 21],
			['S-2', 21]
		]);
		expect(new Set(r.samples.x)).toEqual(new Set([10, 20]));
		expect(r.samples.y.every((v) => v === 0)).toBe(true);
		expect(r.weights.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 14); // weights sum to 1 within 1e-14
		expect(r.stats.n).toBe(42);
		expect(r.cdf.p[r.cdf.p.length - 1]).toBeLessThan(1);
	});

	/**
	 * Rules on stored soundings: readings every 0.1 m from 0.1 to 3.0 m, ground 0, clay on top, sand from −1 m
	 * (the reading at −1.0 m lies on the contact and counts in the sand). The sand domain keeps depths ≥ 1.15 m
	 * and leaves out 0.25 m either side of the contact: of 21 sand readings per sounding (1.0 … 3.0 m), 1.0 and
	 * 1.1 m are too shallow (the first rule that applies counts), 1.2 m lies 0.2 m from the contact: 18 kept.
	 * S-2 is left out by name (its 21 readings), S-4 has no contacts.
	 */
	it('domainSamples(p, d) applies the domain\'s rules, counts what each removed, and names the soundings left out', () => {
		const { clay, sand } = sandSplit();
		for (const [name, c] of [
			['S-1', 10],
			['S-2', 20],
			['S-3', 80]
		] as const) {
			const s = addSounding(t.db, t.projectId, name, { chainage: c, maxDepth: 3 });
			putContact(t.projectId, { soundingId: s, unitId: clay.id, topElevation: 0 }, t.db);
			putContact(t.projectId, { soundingId: s, unitId: sand.id, topElevation: -1 }, t.db);
		}
		addSounding(t.db, t.projectId, 'S-4', { chainage: 40, maxDepth: 3 });
		const rules = { contactBuffer: 0.25, minDepth: 1.15, minSigmaVeff: 0, excludedSoundings: ['S-2'], flagged: 'keep' as const };
		const z = createZonation(t.projectId, { name: 'Z', description: '', domains: [{ name: 'Sand', property: 'qc1Ncs', cellHeight: null, declusterCell: null, members: [{ unitId: sand.id, zone: -1 }], rules }] }, t.db);
		expect(z.domains[0].rules).toEqual(rules);
		const r = domainSamples(t.projectId, z.domains[0].id, t.db);
		expect(r.domain.rules).toEqual(rules);
		expect(r.counts).toEqual({ readings: 63, sounding: 21, noValue: 0, minDepth: 4, minSigmaVeff: 0, contactBuffer: 2, flagged: 0, kept: 36 });
		expect(r.soundings.map((s) => [s.name, s.n])).toEqual([
			['S-1', 18],
			['S-3', 18]
		]);
		expect(Math.max(...r.samples.z)).toBeCloseTo(-1.3, 9);
		expect(r.leftOut).toEqual([
			{ name: 'S-2', reason: 'excluded' },
			{ name: 'S-4', reason: 'no contacts' }
		]);
		// A recipe built from these samples (the engine's createRecipe, as a recipe service resolves a domain
		// through domainSamples) holds exactly the kept readings.
		const recipe = createRecipe(
			{
				seed: 'rules',
				domains: [
					{
						samples: r.samples.value.map((value, i) => ({ x: r.samples.x[i], y: r.samples.y[i], z: r.samples.z[i], value, sounding: r.samples.sounding[i] })),
						weights: r.weights,
						model: { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 20, rangeMinor: 20, rangeVertical: 1 }] },
						transform: 'normal-score',
						kriging: 'simple',
						search: { maxData: 8, maxSimulated: 8 }
					}
				]
			},
			{ kind: 'points', x: [15], y: [0], z: [-2], domain: [0] }
		);
		const held = recipe.input.domains[0].samples;
		expect(held).toHaveLength(36);
		expect(new Set(held.map((s) => s.sounding))).toEqual(new Set(['S-1', 'S-3']));
		expect(held.every((s) => s.z <= -1.3 + 1e-9)).toBe(true);
	});

	it('updateDomain(p, d, {rules}) replaces the rules; a sounding that is not in the project is refused', () => {
		const { sand } = sandSplit();
		addSounding(t.db, t.projectId, 'S-1', { chainage: 10 });
		const z = createZonation(t.projectId, { name: 'Z', description: '', domains: [{ name: 'Sand', property: 'qc1Ncs', members: [{ unitId: sand.id, zone: -1 }] }] }, t.db);
		expect(z.domains[0].rules).toEqual({ contactBuffer: 0, minDepth: 0, minSigmaVeff: 0, excludedSoundings: [], flagged: 'keep' });
		const rules = { contactBuffer: 0.1, minDepth: 0, minSigmaVeff: 20, excludedSoundings: ['S-1'], flagged: 'exclude' as const };
		expect(updateDomain(t.projectId, z.domains[0].id, { rules }, t.db).rules).toEqual(rules);
		expectServiceError(() => updateDomain(t.projectId, z.domains[0].id, { rules: { ...rules, excludedSoundings: ['Nope'] } }, t.db), 422, /No sounding named Nope/);
		expect(getDomain(t.projectId, z.domains[0].id, t.db).domain.rules).toEqual(rules);
	});
});