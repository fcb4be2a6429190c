// The queue's protocol: how realization lists are split into ranges, how big a range is, and the bytes a
// realization travels as (every double, NaN and −0 included, comes back with its bits).
import { describe, expect, it } from 'vitest';
import { bufferToValues, keys, rangeSize, redisAddress, splitRanges, valuesToBuffer } from '../../../src/lib/server/queue/protocol';
import { targetCount } from '../../../src/lib/server/queue/realizations';
import type { Recipe } from '../../../src/lib/geostat/index';
import { expectSameBits } from '../../asserts';

describe('splitRanges(list, size)', () => {
	it('keeps the order asked and every realization once, the last range shorter', () => {
		expect(splitRanges([0, 1, 2, 3, 4, 5, 6], 3)).toEqual([[0, 1, 2], [3, 4, 5], [6]]);
		expect(splitRanges([9, 2, 5], 1)).toEqual([[9], [2], [5]]);
		expect(splitRanges([], 4)).toEqual([]);
		const list = Array.from({ length: 101 }, (_, i) => (i * 37) % 101);
		expect(splitRanges(list, 4).flat()).toEqual(list);
	});
});

describe('rangeSize(targets)', () => {
	it('is one realization a job for a million cells, four for small grids, never below one', () => {
		expect(rangeSize(1_000_000)).toBe(1);
		expect(rangeSize(100_000)).toBe(2);
		expect(rangeSize(32_000)).toBe(4);
		expect(rangeSize(0)).toBe(4);
		expect(rangeSize(50_000_000)).toBe(1);
	});
});

describe('valuesToBuffer / bufferToValues', () => {
	it('round-trips every bit (NaN, ±0, subnormals, ±Infinity) through an unaligned Buffer', () => {
		const v = Float64Array.of(1.5, -0, 0, NaN, Infinity, -Infinity, 5e-324, 1.7976931348623157e308, 0.1 + 0.2);
		const b = valuesToBuffer(v);
		expect(b.byteLength).toBe(72);
		const shifted = Buffer.concat([Buffer.from([7]), b]).subarray(1);
		expectSameBits(bufferToValues(shifted, 9), v);
	});

	it('refuses bytes that are not whole doubles, or not the number of targets', () => {
		expect(() => bufferToValues(Buffer.alloc(12))).toThrow(RangeError);
		expect(() => bufferToValues(Buffer.alloc(16), 3)).toThrow(/expected 3/);
	});
});

describe('keys and addresses', () => {
	it('puts every key under the conefield prefix, one key a realization of a run', () => {
		expect(keys.result('abc', 7)).toBe('conefield:out:abc:7');
		expect(keys.recipe('f00')).toBe('conefield:recipe:f00');
		expect(keys.run('abc')).toBe('conefield:run:abc');
	});

	it('redisAddress leaves the password out of messages', () => {
		expect(redisAddress('redis://:s3cret@10.0.0.5:6380/2')).toBe('redis://10.0.0.5:6380/2');
		expect(redisAddress('rediss://user:pw@redis.example.com')).toBe('rediss://redis.example.com');
		expect(redisAddress('not a url')).toBe('REDIS_URL');
	});
});

describe('targetCount(recipe)', () => {
	it('counts grid, rectilinear and point targets', () => {
		const of = (targets: unknown) => ({ targets }) as Recipe;
		expect(targetCount(of({ kind: 'grid', counts: { x: 4, y: 1, z: 3 } }))).toBe(12);
		expect(targetCount(of({ kind: 'rectilinear', x: [1, 2], y: [0], z: [1, 2, 3] }))).toBe(6);
		expect(targetCount(of({ kind: 'points', x: [1, 2, 3], y: [0, 0, 0], z: [0, 0, 0], domain: [0, 0, 0] }))).toBe(3);
	});
});
