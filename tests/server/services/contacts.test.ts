import { parse } from 'csv-parse/sync';
import { beforeEach, describe, expect, it } from 'vitest';
import {
	contactsCsv,
	deleteContact,
	editContacts,
	listContacts,
	putContact,
	refreshInterpolatedContacts
} from '../../../src/lib/server/services/contacts';
import { deriveSounding } from '../../../src/lib/server/services/derived';
import { listSoundings, deleteSounding } from '../../../src/lib/server/services/soundings';
import { changeSite, createUnit } from '../../../src/lib/server/services/stratigraphy';
import { ServiceError } from '../../../src/lib/server/errors';
import { expectAbsClose } from '../../asserts';
import { addSounding, siteTestProject, type SiteTestProject } from './site-db';

let t: SiteTestProject;
let clay: string;
let sand: string;
let dense: string;
beforeEach(() => {
	t = siteTestProject();
	clay = createUnit(t.projectId, { name: 'Clay', property: 'suRatio' }, t.db).id;
	sand = createUnit(t.projectId, { name: 'Sand', property: 'qc1Ncs' }, t.db).id;
	dense = createUnit(t.projectId, { name: 'Dense sand', property: 'qc1Ncs' }, t.db).id;
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

const topsAt = (soundingId: string) =>
	Object.fromEntries(listContacts(t.projectId, t.db).filter((c) => c.soundingId === soundingId).map((c) => [c.unitId, [c.topElevation, c.interpolated]]));

/** Two soundings with contacts of their own at chainages 0 and 100. */
function twoStations() {
	const a = addSounding(t.db, t.projectId, 'A', { chainage: 0, groundElevation: 2 });
	const b = addSounding(t.db, t.projectId, 'B', { chainage: 100, groundElevation: 3 });
	editContacts(
		t.projectId,
		{
			set: [
				{ soundingId: a, unitId: sand, topElevation: 0 },
				{ soundingId: a, unitId: dense, topElevation: -6 },
				{ soundingId: b, unitId: sand, topElevation: -1 },
				{ soundingId: b, unitId: dense, topElevation: -8 }
			],
			remove: [],
			interpolate: []
		},
		t.db
	);
	return { a, b };
}

describe('interpolated contacts', () => {
	it('a sounding added without contacts takes them from its neighbours along chainage, flagged as interpolated', () => {
		twoStations();
		const c = addSounding(t.db, t.projectId, 'C', { chainage: 25, groundElevation: 2.5 });
		expect(refreshInterpolatedContacts(t.projectId, t.db)).toBe(1);
		// At a quarter of the way from A to B: sand 0 + 0.25·(−1 − 0), dense −6 + 0.25·(−8 + 6). The clay keeps its ground default.
		expect(topsAt(c)).toEqual({ [sand]: [-0.25, true], [dense]: [-6.5, true] });
		const d = deriveSounding(t.projectId, c, t.db);
		expect(d.units.map((u) => [u.name, u.topElevation, u.topSource])).toEqual([
			['Clay', 2.5, 'ground'],
			['Sand', -0.25, 'interpolated'],
			['Dense sand', -6.5, 'interpolated']
		]);
		expect(listSoundings(t.projectId, t.db).find((s) => s.name === 'C')!.contactsInterpolated).toBe(true);
		expect(listSoundings(t.projectId, t.db).find((s) => s.name === 'A')!.contactsInterpolated).toBe(false);
		// A second refresh has nothing to change.
		expect(refreshInterpolatedContacts(t.projectId, t.db)).toBe(0);
	});

	it('interpolated contacts follow their neighbours as these change, and go when the sounding cannot be placed', () => {
		const { b } = twoStations();
		const c = addSounding(t.db, t.projectId, 'C', { chainage: 50, groundElevation: 2.5 });
		putContact(t.projectId, { soundingId: b, unitId: sand, topElevation: -3 }, t.db);
		expectAbsClose(topsAt(c)[sand][0] as number, -1.5, 1e-12, 'sand at C after B changed');
		// Without B, A is C's only neighbour: constant from A.
		deleteSounding(t.projectId, b, t.db);
		expect(topsAt(c)).toEqual({ [sand]: [0, true], [dense]: [-6, true] });
	});

	it('a section line moves the chainages, and changeSite brings interpolated contacts up to date', () => {
		const a = addSounding(t.db, t.projectId, 'A', { x: 0, y: 0, groundElevation: 2 });
		const b = addSounding(t.db, t.projectId, 'B', { x: 100, y: 0, groundElevation: 2 });
		const c = addSounding(t.db, t.projectId, 'C', { x: 20, y: 0, groundElevation: 2 });
		editContacts(
			t.projectId,
			{ set: [{ soundingId: a, unitId: sand, topElevation: 0 }, { soundingId: b, unitId: sand, topElevation: -5 }], remove: [], interpolate: [] },
			t.db
		);
		// No section line yet: located by easting/northing only, so no chainage and nothing to interpolate.
		expect(topsAt(c)).toEqual({});
		changeSite(t.projectId, { sectionLine: [[0, 0], [100, 0]] }, t.db);
		expect(topsAt(c)).toEqual({ [sand]: [-1, true] });
	});

	it('editing an interpolated contact makes it measured and the sounding stops following; the rest stay flagged', () => {
		const { b } = twoStations();
		const c = addSounding(t.db, t.projectId, 'C', { chainage: 50, groundElevation: 2.5 });
		refreshInterpolatedContacts(t.projectId, t.db);
		putContact(t.projectId, { soundingId: c, unitId: sand, topElevation: -2 }, t.db);
		expect(topsAt(c)).toEqual({ [sand]: [-2, false], [dense]: [-7, true] });
		expect(listSoundings(t.projectId, t.db).find((s) => s.name === 'C')!.contactsInterpolated).toBe(false);
		// C now has contacts of its own: a change at B no longer reaches its dense sand.
		putContact(t.projectId, { soundingId: b, unitId: dense, topElevation: -10 }, t.db);
		expect(topsAt(c)[dense]).toEqual([-7, true]);
	});

	it('removing an interpolated contact leaves the unit absent there for good; interpolate brings the neighbours back', () => {
		twoStations();
		const c = addSounding(t.db, t.projectId, 'C', { chainage: 50, groundElevation: 2.5 });
		refreshInterpolatedContacts(t.projectId, t.db);
		deleteContact(t.projectId, c, sand, t.db);
		refreshInterpolatedContacts(t.projectId, t.db);
		expect(topsAt(c)).toEqual({ [dense]: [-7, true] });
		const r = editContacts(t.projectId, { set: [], remove: [], interpolate: [c] }, t.db);
		expect(r).toEqual({ set: 0, removed: 0, interpolated: 1 });
		expect(topsAt(c)).toEqual({ [sand]: [-0.5, true], [dense]: [-7, true] });
	});

	it('a unit absent at a neighbour is absent at the interpolated sounding (its pinch-out cannot be placed)', () => {
		const { b } = twoStations();
		deleteContact(t.projectId, b, sand, t.db);
		const c = addSounding(t.db, t.projectId, 'C', { chainage: 50 });
		refreshInterpolatedContacts(t.projectId, t.db);
		expect(Object.keys(topsAt(c))).toEqual([dense]);
	});
});

describe('editContacts(p, {set, remove, interpolate})', () => {
	it('editContacts writes nothing when any top lies above the ground surface, and names every one', () => {
		const a = addSounding(t.db, t.projectId, 'A', { chainage: 0, groundElevation: 2 });
		const b = addSounding(t.db, t.projectId, 'B', { chainage: 10, groundElevation: 1 });
		expectServiceError(
			() =>
				editContacts(
					t.projectId,
					{
						set: [
							{ soundingId: a, unitId: sand, topElevation: 0 },
							{ soundingId: a, unitId: clay, topElevation: 2.5 },
							{ soundingId: b, unitId: sand, topElevation: 1.2 }
						],
						remove: [],
						interpolate: []
					},
					t.db
				),
			422,
			/2 tops lie above the ground surface: Clay at A: 2.5 .*; Sand at B: 1.2 .*Nothing was saved/
		);
		expect(listContacts(t.projectId, t.db)).toEqual([]);
	});

	it('editContacts refuses foreign ids (404), a missing contact to remove (404, nothing written) and contradictions (422)', () => {
		const a = addSounding(t.db, t.projectId, 'A', { chainage: 0 });
		const other = siteTestProject('Other');
		const foreign = addSounding(other.db, other.projectId, 'X');
		const set = [{ soundingId: a, unitId: sand, topElevation: -1 }];
		expectServiceError(() => editContacts(t.projectId, { set: [{ ...set[0], soundingId: foreign }], remove: [], interpolate: [] }, t.db), 404, /Sounding/);
		expectServiceError(() => editContacts(t.projectId, { set: [{ ...set[0], unitId: 'nope' }], remove: [], interpolate: [] }, t.db), 404, /Unit/);
		expectServiceError(() => editContacts(t.projectId, { set, remove: [{ soundingId: a, unitId: dense }], interpolate: [] }, t.db), 404, /Contact not found/);
		expect(listContacts(t.projectId, t.db)).toEqual([]);
		expectServiceError(() => editContacts(t.projectId, { set, remove: [{ soundingId: a, unitId: sand }], interpolate: [] }, t.db), 422, /both set and removed/);
		expectServiceError(() => editContacts(t.projectId, { set, remove: [], interpolate: [a] }, t.db), 422, /both edited and given interpolated/);
	});

	it('editContacts sets and removes in one go and counts what it did', () => {
		const { a } = twoStations();
		const r = editContacts(t.projectId, { set: [{ soundingId: a, unitId: clay, topElevation: 1.5 }], remove: [{ soundingId: a, unitId: dense }], interpolate: [] }, t.db);
		expect(r).toEqual({ set: 1, removed: 1, interpolated: 0 });
		expect(topsAt(a)).toEqual({ [clay]: [1.5, false], [sand]: [0, false] });
	});
});

describe('contactsCsv(p)', () => {
	it('contactsCsv writes one row per sounding by chainage with each unit top and its source (measured, interpolated, ground)', () => {
		twoStations();
		addSounding(t.db, t.projectId, 'C, north', { chainage: 25, groundElevation: 2.5 });
		refreshInterpolatedContacts(t.projectId, t.db);
		const rows = parse(contactsCsv(t.projectId, t.db), { columns: true }) as Record<string, string>[];
		expect(Object.keys(rows[0])).toEqual([
			'sounding',
			'easting (m)',
			'northing (m)',
			'chainage (m)',
			'ground elevation (m)',
			'Clay top (m)',
			'Clay source',
			'Sand top (m)',
			'Sand source',
			'Dense sand top (m)',
			'Dense sand source'
		]);
		expect(rows.map((r) => r.sounding)).toEqual(['A', 'C, north', 'B']);
		expect(rows[1]).toMatchObject({
			'chainage (m)': '25.00',
			'ground elevation (m)': '2.500',
			'Clay top (m)': '2.500',
			'Clay source': 'ground',
			'Sand top (m)': '-0.250',
			'Sand source': 'interpolated',
			'Dense sand source': 'interpolated'
		});
		expect(rows[0]).toMatchObject({ 'easting (m)': '', 'Sand top (m)': '0.000', 'Sand source': 'measured' });
	});
});
