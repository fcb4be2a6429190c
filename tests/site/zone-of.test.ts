import { describe, expect, it } from 'vitest';
import { boundaryChainageAt, zoneOf } from '../../src/lib/site/index';
import { expectAbsClose } from '../asserts';

describe('zoneOf(boundaries, chainage, elevation)', () => {
	const vertical = { chainageTop: 205, elevationTop: 5, chainageBottom: 205, elevationBottom: -12 };
	// Inclined: from (100, 0) at the top to (110, −10) at the bottom, so at elevation −5 it sits at chainage 105.
	const inclined = { chainageTop: 100, elevationTop: 0, chainageBottom: 110, elevationBottom: -10 };

	it('zoneOf(boundaries, c, z) is 0 without boundaries', () => {
		expect(zoneOf([], 123, -4)).toBe(0);
	});

	it('zoneOf(boundaries, c, z) splits at a vertical boundary; a point on it goes east', () => {
		expect(zoneOf([vertical], 204.99, 0)).toBe(0);
		expect(zoneOf([vertical], 205, 0)).toBe(1);
		expect(zoneOf([vertical], 300, -20)).toBe(1);
	});

	it('zoneOf(boundaries, c, z) follows an inclined boundary with elevation, extended beyond its ends', () => {
		expectAbsClose(boundaryChainageAt(inclined, -5), 105, 1e-12, 'chainage at −5');
		expect(zoneOf([inclined], 104, -5)).toBe(0);
		expect(zoneOf([inclined], 106, -5)).toBe(1);
		// Above its top the line continues up-dip: at +2 it is at chainage 98.
		expect(zoneOf([inclined], 99, 2)).toBe(1);
		expect(zoneOf([inclined], 97, 2)).toBe(0);
		// Below its bottom: at −20 it is at chainage 120.
		expect(zoneOf([inclined], 115, -20)).toBe(0);
	});

	it('zoneOf(boundaries, c, z) counts zones west to east whatever the order the boundaries are given in', () => {
		expect(zoneOf([vertical, inclined], 150, -5)).toBe(1);
		expect(zoneOf([vertical, inclined], 300, -5)).toBe(2);
		expect(zoneOf([inclined, vertical], 50, -5)).toBe(0);
	});

	it('zoneOf(boundaries, c, z) rejects non-finite coordinates', () => {
		expect(() => zoneOf([vertical], NaN, 0)).toThrow(RangeError);
	});

});
