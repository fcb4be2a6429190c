import { describe, expect, it } from 'vitest';
import { fromFloat64Blob, toFloat64Blob } from '../../../src/lib/server/db/float64';

describe('Float64 BLOB columns', () => {
	it('toFloat64Blob then fromFloat64Blob returns the same bits, NaN and signed zero included', () => {
		const values = new Float64Array([0, -0, 1.5, -1e-300, Number.MAX_VALUE, NaN, Infinity, 0.1 + 0.2]);
		const back = fromFloat64Blob(toFloat64Blob(values));
		expect(new Uint8Array(back.buffer)).toEqual(new Uint8Array(values.buffer));
	});

	it('toFloat64Blob copies a subarray view, not its whole buffer', () => {
		const base = new Float64Array([1, 2, 3, 4]);
		const blob = toFloat64Blob(base.subarray(1, 3));
		expect(blob.byteLength).toBe(16);
		expect(Array.from(fromFloat64Blob(blob))).toEqual([2, 3]);
	});

	it('toFloat64Blob accepts plain arrays; an empty column round-trips', () => {
		expect(Array.from(fromFloat64Blob(toFloat64Blob([7, 8])))).toEqual([7, 8]);
		expect(fromFloat64Blob(toFloat64Blob([])).length).toBe(0);
	});

	it('fromFloat64Blob rejects a length that is not a multiple of 8', () => {
		expect(() => fromFloat64Blob(new Uint8Array(12))).toThrow(RangeError);
	});

	it('fromFloat64Blob reads an unaligned slice of a larger buffer', () => {
		const bytes = new Uint8Array(17);
		bytes.set(new Uint8Array(new Float64Array([42.25, -3]).buffer), 1);
		expect(Array.from(fromFloat64Blob(bytes.subarray(1)))).toEqual([42.25, -3]);
	});
});
