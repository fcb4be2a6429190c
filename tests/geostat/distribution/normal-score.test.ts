import { describe, it, expect } from 'vitest';
import seedrandom from 'seedrandom';
import { normalScore, backTransform, inverseNormalCdf, TAIL_P } from '../../../src/lib/geostat/index';
import { expectAbsClose } from '../../asserts';

describe('normalScore(values, weights)', () => {
	it('normalScore(values) gives Φ⁻¹((i − ½)/n) in input order for distinct equal-weight values (Deutsch & Journel 1998)', () => {
		const { scores, table } = normalScore([30, 10, 20, 40]);
		expect(Array.from(scores)).toEqual([inverseNormalCdf(0.625), inverseNormalCdf(0.125), inverseNormalCdf(0.375), inverseNormalCdf(0.875)]);
		expect(Array.from(table.values)).toEqual([10, 20, 30, 40]);
		expect(table.tail).toBe('linear');
	});

	it('normalScore(values, weights) matches a hand-computed weighted example', () => {
		// Sorted values 1, 2, 3 with weights 0.5, 0.3, 0.2 (given as 5, 3, 2; normalised):
		// intervals [0, .5], [.5, .8], [.8, 1] → midpoints 0.25, 0.65, 0.9.
		const { scores } = normalScore([3, 1, 2], [2, 5, 3]);
		expect(scores[1]).toBe(inverseNormalCdf(0.25));
		expectAbsClose(scores[2], inverseNormalCdf(0.65), 1e-15);
		expectAbsClose(scores[0], inverseNormalCdf(0.9), 1e-15);
		expectAbsClose(scores[0], 1.2815515655446004, 1e-15); // Φ⁻¹(0.9), REFERENCES.md
	});

	it('normalScore(values) gives tied values the score of their combined interval midpoint', () => {
		// Equal weights, values 1, 2, 2, 5: the two 2s span [.25, .75] → midpoint 0.5 → score 0 exactly.
		const { scores, table } = normalScore([2, 5, 1, 2]);
		expect(scores[0]).toBe(0);
		expect(scores[3]).toBe(0);
		expect(Array.from(table.values)).toEqual([1, 2, 5]);
		expect(Array.from(table.scores)).toEqual([inverseNormalCdf(0.125), 0, inverseNormalCdf(0.875)]);
	});

	it('normalScore(values) of a large equal-weight sample has mean ≈ 0 and variance ≈ 1', () => {
		// Midpoint scores are symmetric (mean 0 up to rounding); their variance is below 1 by O(ln n / n)
		// because the extreme intervals are cut off at Φ⁻¹(1/2n) — for n = 10 000 about 1e-3 (Hazen plotting positions).
		const rng = seedrandom('ns-moments');
		const n = 10_000;
		const v = Array.from({ length: n }, () => Math.exp(rng() * 4));
		const { scores } = normalScore(v);
		let m = 0;
		for (const s of scores) m += s;
		m /= n;
		let s2 = 0;
		for (const s of scores) s2 += (s - m) ** 2;
		s2 /= n;
		expectAbsClose(m, 0, 1e-12, 'mean');
		expectAbsClose(s2, 1, 2e-3, 'variance');
	});

	it('normalScore(values) of one value is 0 and of all-equal values is 0 for each', () => {
		expect(Array.from(normalScore([7]).scores)).toEqual([0]);
		expect(Array.from(normalScore([3, 3, 3]).scores)).toEqual([0, 0, 0]);
	});

	it('normalScore(values) accepts Float64Array and huge values, and does not mutate its inputs', () => {
		const v = Float64Array.from([1e300, -1e300, 0]);
		const w = Float64Array.from([1, 1, 2]);
		const { scores } = normalScore(v, w);
		expect(Array.from(v)).toEqual([1e300, -1e300, 0]);
		expect(Array.from(w)).toEqual([1, 1, 2]);
		expect(scores[2]).toBe(0);
		expect(scores[0]).toBe(-scores[1]);
	});

	it('normalScore rejects empty input, NaN, bad weights and bad tail bounds', () => {
		expect(() => normalScore([])).toThrow('no values');
		expect(() => normalScore([1, NaN])).toThrow('values must be finite');
		expect(() => normalScore([1, 2], [1])).toThrow('weights length must match values');
		expect(() => normalScore([1, 2], [1, 0])).toThrow('weights must be positive');
		expect(() => normalScore([1, 2], [1, -1])).toThrow(RangeError);
		expect(() => normalScore([1, 2], undefined, { zmin: 1.5 })).toThrow('zmin must be <= the smallest value');
		expect(() => normalScore([1, 2], undefined, { zmax: 1.5 })).toThrow('zmax must be >= the largest value');
		expect(() => normalScore(5 as unknown as number[])).toThrow(TypeError);
	});
});

describe('backTransform(table, y)', () => {
	const data = [4.2, 1.5, 9.9, 3.3, 3.3, 7.1, 0.4];
	const { scores, table } = normalScore(data, undefined, { zmin: 0, zmax: 12 });

	it('backTransform(table, score) returns each datum exactly', () => {
		for (let i = 0; i < data.length; i++) expect(backTransform(table, scores[i])).toBe(data[i]);
	});

	it('backTransform(table, y) interpolates linearly and is monotone between the data', () => {
		const i = 2;
		const mid = (table.scores[i] + table.scores[i + 1]) / 2;
		expectAbsClose(backTransform(table, mid), (table.values[i] + table.values[i + 1]) / 2, 1e-14);
		let prev = -Infinity;
		for (let y = -6; y <= 6; y += 0.001) {
			const v = backTransform(table, y);
			expect(v).toBeGreaterThanOrEqual(prev);
			prev = v;
		}
	});

	it('backTransform(table, y) has linear tails to zmin/zmax at Φ⁻¹(1e-6) and Φ⁻¹(1 − 1e-6)', () => {
		const y0 = inverseNormalCdf(TAIL_P);
		expect(backTransform(table, y0)).toBe(0);
		expect(backTransform(table, -y0)).toBe(12);
		expect(backTransform(table, -40)).toBe(0);
		expect(backTransform(table, 40)).toBe(12);
		const s0 = table.scores[0];
		expectAbsClose(backTransform(table, (s0 + y0) / 2), 0.2, 1e-14); // halfway from 0.4 to zmin 0
		const s1 = table.scores[table.scores.length - 1];
		expectAbsClose(backTransform(table, (s1 - y0) / 2), (9.9 + 12) / 2, 1e-14);
	});

	it("backTransform(table, y) with tail 'clamp' or default bounds stays within the data", () => {
		const c = normalScore(data, undefined, { tail: 'clamp', zmin: 0, zmax: 12 }).table;
		expect(backTransform(c, -10)).toBe(0.4);
		expect(backTransform(c, 10)).toBe(9.9);
		const d = normalScore(data).table;
		expect(backTransform(d, -10)).toBe(0.4);
		expect(backTransform(d, 10)).toBe(9.9);
	});

	it('backTransform(table, y) of a one-value table returns that value; NaN gives NaN', () => {
		const t = normalScore([5]).table;
		expect(backTransform(t, 0)).toBe(5);
		expect(backTransform(t, 3)).toBe(5);
		expect(backTransform(table, NaN)).toBeNaN();
		expect(() => backTransform(table, '1' as unknown as number)).toThrow(TypeError);
	});

	it('backTransform(table, normalScore scores) round-trips a weighted random sample exactly', () => {
		const rng = seedrandom('ns-roundtrip');
		const v = Array.from({ length: 500 }, () => Math.round(rng() * 200) / 10);
		const w = Array.from({ length: 500 }, () => 0.1 + rng());
		const r = normalScore(v, w);
		for (let i = 0; i < v.length; i++) expect(backTransform(r.table, r.scores[i])).toBe(v[i]);
	});
});
