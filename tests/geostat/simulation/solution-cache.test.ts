import { describe, it, expect } from 'vitest';
import { SolutionCache, signatureHash } from '../../../src/lib/geostat/index';

const key = (...v: number[]) => Int32Array.from(v);

describe('SolutionCache', () => {
	it('SolutionCache.store then find returns the stored weights and variance, bit for bit', () => {
		const c = new SolutionCache(4, 16);
		const k = key(-1, 7, 12);
		const h = signatureHash(0, 3, k);
		expect(c.find(0, 3, k, h)).toBe(-1);
		const w = new Float64Array([0.1, -0.2, 1 / 3, 99]);
		c.store(0, 3, k, h, w, 0.0625);
		const slot = c.find(0, 3, k, h);
		expect(slot).toBeGreaterThanOrEqual(0);
		const v = c.values();
		const at = c.valueOffset(slot);
		expect(Array.from(v.subarray(at, at + 3))).toEqual([0.1, -0.2, 1 / 3]);
		expect(v[at + c.kmax]).toBe(0.0625);
		expect([c.hits, c.stores]).toEqual([1, 1]);
	});

	it('SolutionCache.find misses on another domain, another k, another order of the same offsets, or a hash collision with another key', () => {
		const c = new SolutionCache(4, 16);
		const k = key(3, 5, 8);
		const h = signatureHash(2, 3, k);
		c.store(2, 3, k, h, new Float64Array(3), 1);
		expect(c.find(1, 3, k, h)).toBe(-1);
		expect(c.find(2, 2, k, h)).toBe(-1);
		const swapped = key(5, 3, 8);
		expect(c.find(2, 3, swapped, signatureHash(2, 3, swapped))).toBe(-1);
		// Same hash forced, different key: the full comparison refuses it.
		expect(c.find(2, 3, swapped, h)).toBe(-1);
		expect(c.find(2, 3, k, h)).toBeGreaterThanOrEqual(0);
	});

	it('SolutionCache evicts the less recently used of the two slots of a set, and nothing else', () => {
		// Two slots: one set, so every signature competes for it.
		const c = new SolutionCache(2, 2);
		const a = key(1);
		const b = key(2);
		const d = key(3);
		const [ha, hb, hd] = [a, b, d].map((x) => signatureHash(0, 1, x));
		c.store(0, 1, a, ha, new Float64Array([1]), 0);
		c.store(0, 1, b, hb, new Float64Array([2]), 0);
		expect(c.find(0, 1, a, ha)).toBeGreaterThanOrEqual(0); // a is now the more recent
		c.store(0, 1, d, hd, new Float64Array([3]), 0); // evicts b
		expect(c.find(0, 1, b, hb)).toBe(-1);
		expect(c.find(0, 1, a, ha)).toBeGreaterThanOrEqual(0);
		expect(c.find(0, 1, d, hd)).toBeGreaterThanOrEqual(0);
	});

	it('SolutionCache with a width other than kmax keeps that many doubles a slot (data parts by their offsets), bit for bit', () => {
		const c = new SolutionCache(3, 8, 9);
		expect(c.width).toBe(9);
		expect(c.bytes).toBe(8 * SolutionCache.bytesPerSlot(3, 9));
		expect(SolutionCache.bytesPerSlot(3, 9)).toBe(4 * 6 + 8 * 10 + 8);
		const k = key(-4, 0);
		const h = signatureHash(1, 2, k);
		const part = Float64Array.from({ length: 9 }, (_, i) => Math.sqrt(i + 2));
		c.store(1, 2, k, h, part, 0, 9);
		const slot = c.find(1, 2, k, h);
		expect(slot).toBeGreaterThanOrEqual(0);
		const at = c.valueOffset(slot);
		expect(c.values().subarray(at, at + 9)).toEqual(part);
		// More doubles than the width are refused, not truncated.
		c.store(1, 1, key(7), signatureHash(1, 1, key(7)), new Float64Array(10), 0, 10);
		expect(c.stores).toBe(1);
		expect(() => new SolutionCache(3, 8, 0)).toThrow(RangeError);
	});

	it('SolutionCache states its memory, allocates it on the first store, ignores systems larger than kmax, and rejects bad sizes', () => {
		expect(SolutionCache.bytesPerSlot(32)).toBe(4 * 35 + 8 * 33 + 8);
		const c = new SolutionCache(32, 1001);
		expect(c.slots).toBe(1000);
		expect(c.bytes).toBe(1000 * SolutionCache.bytesPerSlot(32));
		const big = new Int32Array(33);
		c.store(0, 33, big, signatureHash(0, 33, big), new Float64Array(33), 1);
		expect(c.stores).toBe(0);
		expect(c.find(0, 33, big, signatureHash(0, 33, big))).toBe(-1);
		expect(() => new SolutionCache(0, 10)).toThrow(RangeError);
		expect(() => new SolutionCache(4, 1)).toThrow(RangeError);
	});
});

describe('signatureHash(domain, k, key)', () => {
	it('signatureHash repeats, and changes with the domain, k, any offset and the order of offsets', () => {
		const k = key(4, -9, 17, 300);
		const h = signatureHash(1, 4, k);
		expect(signatureHash(1, 4, key(4, -9, 17, 300))).toBe(h);
		expect(Number.isInteger(h)).toBe(true);
		expect(signatureHash(0, 4, k)).not.toBe(h);
		expect(signatureHash(1, 3, k)).not.toBe(h);
		expect(signatureHash(1, 4, key(4, -9, 17, 301))).not.toBe(h);
		expect(signatureHash(1, 4, key(-9, 4, 17, 300))).not.toBe(h);
	});
});
