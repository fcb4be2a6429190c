import { describe, it, expect } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import seedrandom from 'seedrandom';
import { fitLinearTrend, trendValue, type Sample } from '../../../src/lib/geostat/index';
import { expectAbsClose, expectRelClose } from '../../asserts';

function scattered(n: number, seed: string, value: (x: number, y: number, z: number, e: number) => number): Sample[] {
	const rng = seedrandom(seed);
	return Array.from({ length: n }, (_, i) => {
		const x = 512_000 + 300 * rng();
		const y = 4_183_000 + 200 * rng();
		const z = 4 - 15 * rng();
		return { x, y, z, value: value(x, y, z, rng() - 0.5), sounding: `S${i % 7}` };
	});
}

describe('fitLinearTrend(samples, weights, terms)', () => {
	it('fitLinearTrend recovers an exact linear trend in elevation and plan to 1e-9 relative', () => {
		const truth = (x: number, y: number, z: number) => 120 - 4 * z + 0.05 * (x - 512_000) - 0.02 * (y - 4_183_000);
		const s = scattered(60, 'exact', (x, y, z) => truth(x, y, z));
		const fit = fitLinearTrend(s, undefined, 'elevation-plan');
		expectRelClose(fit.trend.gradient.z, -4, 1e-9, 'gz');
		expectRelClose(fit.trend.gradient.x, 0.05, 1e-9, 'gx');
		expectRelClose(fit.trend.gradient.y, -0.02, 1e-9, 'gy');
		for (const p of s) expectRelClose(trendValue(fit.trend, p.x, p.y, p.z), p.value, 1e-12, 'fitted value');
		expect(fit.used).toEqual({ x: true, y: true, z: true });
		expectAbsClose(fit.r2, 1, 1e-9, 'r2');
	});

	it('fitLinearTrend equals weighted least squares solved by ml-matrix on noisy data (1e-9 relative)', () => {
		const s = scattered(80, 'noisy', (x, y, z, e) => 30 + 2 * z + 0.01 * (x - 512_000) + 10 * e);
		const rng = seedrandom('weights');
		const w = s.map(() => 0.2 + rng());
		const fit = fitLinearTrend(s, w, 'elevation-plan');
		// Reference: the normal equations XᵀWX β = XᵀWv with an intercept column, in raw coordinates shifted by a
		// round number only (ml-matrix solves by LU).
		const X = new Matrix(s.map((p) => [1, p.x - 512_000, p.y - 4_183_000, p.z]));
		const W = Matrix.diag(w);
		const v = Matrix.columnVector(s.map((p) => p.value));
		const beta = solve(X.transpose().mmul(W).mmul(X), X.transpose().mmul(W).mmul(v));
		expectRelClose(fit.trend.gradient.x, beta.get(1, 0), 1e-9, 'gx');
		expectRelClose(fit.trend.gradient.y, beta.get(2, 0), 1e-9, 'gy');
		expectRelClose(fit.trend.gradient.z, beta.get(3, 0), 1e-9, 'gz');
		const at = { x: 512_100, y: 4_183_050, z: -3 };
		const ref = beta.get(0, 0) + beta.get(1, 0) * 100 + beta.get(2, 0) * 50 + beta.get(3, 0) * -3;
		expectRelClose(trendValue(fit.trend, at.x, at.y, at.z), ref, 1e-9, 'value');
		// The origin is the weighted centroid and the constant the weighted mean (centred regression).
		const sw = w.reduce((a, b) => a + b, 0);
		expectRelClose(fit.trend.constant, s.reduce((a, p, i) => a + w[i] * p.value, 0) / sw, 1e-12, 'constant');
		expect(fit.r2).toBeGreaterThan(0.5);
		expect(fit.r2).toBeLessThan(1);
	});

	it("fitLinearTrend(…, 'elevation') fits z only; equal weights are the default", () => {
		const s = scattered(40, 'z-only', (x, _y, z, e) => 5 - 0.5 * z + 0.1 * (x - 512_000) + e);
		const a = fitLinearTrend(s, undefined, 'elevation');
		expect(a.trend.gradient.x).toBe(0);
		expect(a.trend.gradient.y).toBe(0);
		expect(a.used).toEqual({ x: false, y: false, z: true });
		// Equal weights of 3 are the same weights up to rounding of the sums (1e-12 relative).
		const b = fitLinearTrend(s, s.map(() => 3), 'elevation');
		expectRelClose(b.trend.gradient.z, a.trend.gradient.z, 1e-12, 'gz');
		expectRelClose(b.trend.constant, a.trend.constant, 1e-12, 'constant');
	});

	it('fitLinearTrend leaves out a coordinate the samples do not spread along (y of a 2D section)', () => {
		const s = scattered(30, 'section', (x, _y, z) => 10 + 0.2 * z + 0.03 * (x - 512_000)).map((p) => ({ ...p, y: 0 }));
		const fit = fitLinearTrend(s, undefined, 'elevation-plan');
		expect(fit.used).toEqual({ x: true, y: false, z: true });
		expect(fit.trend.gradient.y).toBe(0);
		expectRelClose(fit.trend.gradient.x, 0.03, 1e-9, 'gx');
	});

	it('fitLinearTrend of one sample or one level gives the mean; collinear plan coordinates throw', () => {
		const one = fitLinearTrend([{ x: 1, y: 2, z: 3, value: 7 }], undefined, 'elevation-plan');
		expect(one.trend).toEqual({ origin: { x: 1, y: 2, z: 3 }, constant: 7, gradient: { x: 0, y: 0, z: 0 } });
		expect(one.r2).toBe(0);
		// Soundings on one straight line in plan (y = 2x): x and y cannot be told apart.
		const line = Array.from({ length: 10 }, (_, i) => ({ x: i, y: 2 * i, z: -(i % 3), value: i }));
		expect(() => fitLinearTrend(line, undefined, 'elevation-plan')).toThrow('trend is not determined by the samples');
	});

	it('fitLinearTrend rejects bad input with short messages and does not mutate', () => {
		const s = scattered(5, 'bad', (_x, _y, z) => z);
		const copy = JSON.stringify(s);
		expect(() => fitLinearTrend(s, undefined, 'cubic' as 'elevation')).toThrow(TypeError);
		expect(() => fitLinearTrend([], undefined, 'elevation')).toThrow('no samples');
		expect(() => fitLinearTrend(s, [1], 'elevation')).toThrow('weights must match samples');
		expect(() => fitLinearTrend(s, [1, 1, -1, 1, 1], 'elevation')).toThrow('weights must be finite and >= 0');
		expect(() => fitLinearTrend(s, [0, 0, 0, 0, 0], 'elevation')).toThrow('weights must not all be 0');
		expect(() => fitLinearTrend([{ x: 0, y: 0, z: NaN, value: 1 }], undefined, 'elevation')).toThrow(RangeError);
		fitLinearTrend(s, undefined, 'elevation-plan');
		expect(JSON.stringify(s)).toBe(copy);
	});
});
