import { describe, expect, it } from 'vitest';
import { interpolateAlongChainage } from '../../src/lib/site/index';
import { expectAbsClose } from '../asserts';

describe('interpolateAlongChainage(stations, chainage)', () => {
	const stations = [
		{ chainage: 100, value: 2 },
		{ chainage: 0, value: 1 },
		{ chainage: 150, value: -2 }
	];

	it('interpolateAlongChainage(stations, c) is linear between neighbours (unsorted input)', () => {
		// Between 0 (1) and 100 (2): at 25, 1 + 0.25·1 = 1.25; between 100 (2) and 150 (−2): at 125, 2 − 0.5·4 = 0.
		expectAbsClose(interpolateAlongChainage(stations, 25), 1.25, 1e-12, 'c = 25');
		expectAbsClose(interpolateAlongChainage(stations, 125), 0, 1e-12, 'c = 125');
	});

	it('interpolateAlongChainage(stations, c) is exact at a station and constant beyond the ends', () => {
		expect(interpolateAlongChainage(stations, 100)).toBe(2);
		expect(interpolateAlongChainage(stations, -50)).toBe(1);
		expect(interpolateAlongChainage(stations, 1e9)).toBe(-2);
	});

	it('interpolateAlongChainage(stations, c) is NaN next to a sounding where the unit is absent', () => {
		const gap = [
			{ chainage: 0, value: 1 },
			{ chainage: 10, value: NaN },
			{ chainage: 20, value: 3 }
		];
		expect(interpolateAlongChainage(gap, 5)).toBeNaN();
		expect(interpolateAlongChainage(gap, 15)).toBeNaN();
		expect(interpolateAlongChainage(gap, 20)).toBe(3);
	});

	it('interpolateAlongChainage(stations, c) keeps the first of duplicate chainages and handles one station', () => {
		const dup = [
			{ chainage: 0, value: 0 },
			{ chainage: 10, value: 5 },
			{ chainage: 10, value: 7 },
			{ chainage: 20, value: 10 }
		];
		expect(interpolateAlongChainage(dup, 10)).toBe(5);
		expectAbsClose(interpolateAlongChainage(dup, 15), 7.5, 1e-12, 'after the duplicate');
		expect(interpolateAlongChainage([{ chainage: 3, value: 4 }], -1)).toBe(4);
	});

	it('interpolateAlongChainage(stations, c) rejects no stations and non-finite chainages', () => {
		expect(() => interpolateAlongChainage([], 0)).toThrow('no stations');
		expect(() => interpolateAlongChainage(stations, NaN)).toThrow(RangeError);
		expect(() => interpolateAlongChainage([{ chainage: Infinity, value: 1 }], 0)).toThrow(RangeError);
	});
});
