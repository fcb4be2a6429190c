/**
 * The zonation mapping table's pure functions: pieces of units and zones, the table's choices read from stored
 * members, and members written back (a unit whose zones all go to one domain stored whole).
 */
import { describe, expect, it } from 'vitest';
import type { UnitView, ZonationView } from '$lib/api';
import { assignmentOf, membersFrom, piecesOf } from '../../../../../src/routes/projects/[id]/stratigraphy/zonation-mapping';

const unit = (id: string, zoneNames: string[]): UnitView =>
	({ id, name: id, colour: '#888', position: 0, gammaAbove: 18, gammaBelow: 19, nkt: 14, cfc: 0.07, property: 'qc1Ncs', zoneNames, savedZoneNames: zoneNames }) as UnitView;
const units = [unit('clay', ['clay']), unit('sand', ['west', 'east'])];
const zonation = (domains: { id: string; members: { unitId: string; zone: number }[] }[]): ZonationView =>
	({ id: 'z', name: 'Z', description: '', domains: domains.map((d) => ({ ...d, name: d.id, members: d.members })) }) as unknown as ZonationView;

describe('piecesOf', () => {
	it('gives a whole unit one piece (zone −1) and a split unit one piece a zone, in order', () => {
		expect(piecesOf(units).map((p) => [p.key, p.zone, p.label])).toEqual([
			['clay|-1', -1, 'clay'],
			['sand|0', 0, 'sand — west'],
			['sand|1', 1, 'sand — east']
		]);
	});
});

describe('assignmentOf and membersFrom', () => {
	const pieces = piecesOf(units);

	it('a whole-unit member takes every zone; nothing mapped reads as ""', () => {
		const z = zonation([{ id: 'sands', members: [{ unitId: 'sand', zone: -1 }] }]);
		expect(assignmentOf(pieces, z)).toEqual({ 'clay|-1': '', 'sand|0': 'sands', 'sand|1': 'sands' });
		expect(assignmentOf(pieces, null)).toEqual({ 'clay|-1': '', 'sand|0': '', 'sand|1': '' });
	});

	it('zones that go to one domain are stored as the whole unit; split zones one by one; every domain listed', () => {
		const z = zonation([
			{ id: 'west', members: [] },
			{ id: 'east', members: [] },
			{ id: 'clay', members: [] }
		]);
		const lumped = membersFrom(pieces, { 'clay|-1': 'clay', 'sand|0': 'west', 'sand|1': 'west' }, z);
		expect(Object.fromEntries(lumped)).toEqual({ west: [{ unitId: 'sand', zone: -1 }], east: [], clay: [{ unitId: 'clay', zone: -1 }] });
		const split = membersFrom(pieces, { 'clay|-1': '', 'sand|0': 'west', 'sand|1': 'east' }, z);
		expect(Object.fromEntries(split)).toEqual({ west: [{ unitId: 'sand', zone: 0 }], east: [{ unitId: 'sand', zone: 1 }], clay: [] });
	});

	it('round-trips: the members written from a zonation’s own assignment read back to the same assignment', () => {
		const z = zonation([
			{ id: 'west', members: [{ unitId: 'sand', zone: 0 }] },
			{ id: 'rest', members: [{ unitId: 'sand', zone: 1 }, { unitId: 'clay', zone: -1 }] }
		]);
		const a = assignmentOf(pieces, z);
		const back = zonation([...membersFrom(pieces, a, z)].map(([id, members]) => ({ id, members })));
		expect(assignmentOf(pieces, back)).toEqual(a);
	});
});
