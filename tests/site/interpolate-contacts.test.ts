import { describe, expect, it } from 'vitest';
import { interpolateContacts, type ContactStation } from '../../src/lib/site/index';
import { expectAbsClose } from '../asserts';

const station = (chainage: number | null, tops: Record<string, number>, x: number | null = null, y: number | null = null): ContactStation => ({
	chainage,
	x,
	y,
	tops: new Map(Object.entries(tops))
});

describe('interpolateContacts(stations, unitIds, target, geometry)', () => {
	const units = ['clay', 'plug', 'sand'];
	const stations = [
		station(0, { clay: 4, sand: 2 }),
		station(100, { clay: 4.5, plug: 1, sand: 0 }),
		station(200, { clay: 4.2, plug: 0.5, sand: -1 })
	];
	const at = (chainage: number | null, groundElevation = 10) => ({ chainage, x: null, y: null, groundElevation });

	it('interpolateContacts(…, 2d) is linear along chainage between the two neighbouring stations', () => {
		const tops = interpolateContacts(stations, units, at(150), '2d')!;
		// Between 100 and 200 at 150: the means of the two stations.
		expectAbsClose(tops.get('clay')!, 4.35, 1e-12, 'clay');
		expectAbsClose(tops.get('plug')!, 0.75, 1e-12, 'plug');
		expectAbsClose(tops.get('sand')!, -0.5, 1e-12, 'sand');
	});

	it('interpolateContacts(…, 2d) leaves a unit absent next to a station where it is absent', () => {
		const tops = interpolateContacts(stations, units, at(25), '2d')!;
		expect(tops.has('plug')).toBe(false);
		expectAbsClose(tops.get('sand')!, 1.5, 1e-12, 'sand at 25: 2 − 0.25·2');
	});

	it('interpolateContacts(…, 2d) is constant beyond the end stations and keeps tops at or below the ground surface', () => {
		const tops = interpolateContacts(stations, units, at(260, 4), '2d')!;
		expect(tops.get('clay')).toBe(4); // 4.2 lowered to the ground at 4
		expect(tops.get('plug')).toBe(0.5);
		expect(tops.get('sand')).toBe(-1);
	});

	it('interpolateContacts(…, 2d) is null for a target or stations without a chainage', () => {
		expect(interpolateContacts(stations, units, at(null), '2d')).toBeNull();
		expect(interpolateContacts([station(null, { clay: 1 })], units, at(5), '2d')).toBeNull();
		expect(interpolateContacts([], units, at(5), '2d')).toBeNull();
	});

	it('interpolateContacts(…, 2d) skips stations without a chainage and uses the rest', () => {
		const tops = interpolateContacts([station(null, { clay: 100 }), station(0, { clay: 3 })], ['clay'], at(50), '2d')!;
		expect(tops.get('clay')).toBe(3);
	});

	it('interpolateContacts(…, 3d) is linear over the triangle of stations around the target in plan', () => {
		// A plane top = 1 + 0.01x − 0.02y is reproduced exactly inside the triangle (barycentric interpolation).
		const plane = (x: number, y: number) => 1 + 0.01 * x - 0.02 * y;
		const corners: [number, number][] = [
			[0, 0],
			[100, 0],
			[0, 100]
		];
		const st = corners.map(([x, y]) => station(null, { sand: plane(x, y) }, x, y));
		const tops = interpolateContacts(st, ['sand'], { chainage: null, x: 30, y: 20, groundElevation: 10 }, '3d')!;
		expectAbsClose(tops.get('sand')!, plane(30, 20), 1e-12, 'plane at (30, 20)');
		expect(interpolateContacts(st, ['sand'], { chainage: 5, x: null, y: null, groundElevation: 10 }, '3d')).toBeNull();
	});

	it('interpolateContacts does not mutate the stations', () => {
		const copy = stations.map((s) => ({ ...s, tops: new Map(s.tops) }));
		interpolateContacts(stations, units, at(150, 0), '2d');
		expect(stations).toEqual(copy);
	});
});
