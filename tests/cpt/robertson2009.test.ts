// Checked against the published equation, written out independently here with Math functions
// (spreadsheet style), and against values worked by hand.
import { describe, expect, it } from 'vitest';
import { CptFlag, IC_CHART_MAX, IC_CHART_MIN, robertson2009 } from '$lib/cpt';
import { expectAbsClose, expectRelClose } from '../asserts';

const pa = 101.325;

/** Robertson (2009): n solved by bisection on n − min(1, 0.381·Ic(n) + 0.05σ'v/pa − 0.15) = 0 in [0, 1]. */
function robertsonByBisection(qt: number, fs: number, sv: number, sve: number) {
	const Ic = (n: number) => {
		const Qtn = ((qt - sv) / pa) * Math.pow(pa / sve, n);
		const Fr = (fs / (qt - sv)) * 100;
		return Math.sqrt((3.47 - Math.log10(Qtn)) ** 2 + (Math.log10(Fr) + 1.22) ** 2);
	};
	const h = (n: number) => n - Math.min(1, 0.381 * Ic(n) + 0.05 * (sve / pa) - 0.15);
	let lo = 0;
	let hi = 1;
	if (h(hi) <= 0) lo = hi;
	for (let k = 0; k < 200 && hi - lo > 1e-14; k++) {
		const mid = (lo + hi) / 2;
		if (h(mid) > 0) hi = mid;
		else lo = mid;
	}
	const n = lo;
	return { n, Ic: Ic(n), Qtn: ((qt - sv) / pa) * Math.pow(pa / sve, n), Fr: (fs / (qt - sv)) * 100 };
}

describe('robertson2009(p)', () => {
	it('robertson2009(p) matches a hand-worked case at σ\'v = pa, where Qtn does not depend on n', () => {
		// Robertson (2009): with σ'v = pa, Qtn = (qt − σv)/pa = 100 and Fr = fs/(qt − σv)·100 = 1 %, so
		// Ic = √((3.47 − 2)² + (0 + 1.22)²) = √3.6493 and n = 0.381·Ic + 0.05 − 0.15.
		const sv = 180;
		const r = robertson2009({ qt: sv + 100 * pa, fs: pa, sigmaV: sv, sigmaVeff: pa });
		expectRelClose(r.Qtn, 100, 1e-12);
		expectRelClose(r.Fr, 1, 1e-12);
		expectAbsClose(r.Ic, Math.sqrt(3.6493), 1e-12);
		expectAbsClose(r.n, 0.381 * Math.sqrt(3.6493) - 0.1, 1e-9);
		expect(r.converged).toBe(true);
		expect(r.flags).toBe(0);
	});

	it('robertson2009(p) agrees with an independent bisection solution for n over sands, silts and clays', () => {
		const cases = [
			[10000, 50, 94, 54.8],
			[3000, 60, 60, 40],
			[800, 25, 100, 50],
			[450, 12, 90, 45],
			[20000, 100, 300, 180],
			[1500, 5, 20, 15],
			[5000, 40, 15, 9]
		];
		for (const [qt, fs, sv, sve] of cases) {
			const ref = robertsonByBisection(qt, fs, sv, sve);
			const r = robertson2009({ qt, fs, sigmaV: sv, sigmaVeff: sve });
			expect(r.converged).toBe(true);
			expectAbsClose(r.n, ref.n, 1e-8, `n at qt ${qt}`);
			expectAbsClose(r.Ic, ref.Ic, 1e-8, `Ic at qt ${qt}`);
			expectRelClose(r.Qtn, ref.Qtn, 1e-7, `Qtn at qt ${qt}`);
			expectRelClose(r.Fr, ref.Fr, 1e-12, `Fr at qt ${qt}`);
			expect(r.n).toBeLessThanOrEqual(1);
		}
	});

	it('robertson2009(p) caps n at 1 for soft clay-like readings', () => {
		// n = 0.381·Ic + 0.05σ'v/pa − 0.15 exceeds 1 when Ic > about 3.0 (Robertson 2009).
		const r = robertson2009({ qt: 300, fs: 15, sigmaV: 100, sigmaVeff: 50 });
		expect(r.n).toBe(1);
		expectRelClose(r.Qtn, (300 - 100) / 50, 1e-12);
	});

	it('robertson2009(p) flags negative net resistance, non-positive fs and σ\'v with NaN results', () => {
		const neg = robertson2009({ qt: 90, fs: 5, sigmaV: 100, sigmaVeff: 60 });
		expect(neg.Ic).toBeNaN();
		expect(neg.Qtn).toBeNaN();
		expect(neg.Fr).toBeNaN();
		expect(neg.flags & CptFlag.negativeNetResistance).toBeTruthy();
		expect(neg.converged).toBe(false);
		const fs0 = robertson2009({ qt: 5000, fs: 0, sigmaV: 100, sigmaVeff: 60 });
		expect(fs0.Ic).toBeNaN();
		expect(fs0.flags).toBe(CptFlag.nonPositiveFriction);
		expect(fs0.Fr).toBe(0);
		const s0 = robertson2009({ qt: 5000, fs: 20, sigmaV: 0, sigmaVeff: 0 });
		expect(s0.flags).toBe(CptFlag.nonPositiveStress);
		const nan = robertson2009({ qt: NaN, fs: 20, sigmaV: 10, sigmaVeff: 5 });
		expect(nan.flags & CptFlag.missingReading).toBeTruthy();
		expect(nan.Ic).toBeNaN();
	});

	it('robertson2009(p) flags notConverged when the fixed point oscillates at a tiny σ\'v', () => {
		// At σ'v = 0.01 kPa the update's slope exceeds 1 in magnitude, so plain iteration cannot settle.
		const r = robertson2009({ qt: 20000, fs: 50, sigmaV: 0.02, sigmaVeff: 0.01 });
		expect(r.converged).toBe(false);
		expect(r.flags & CptFlag.notConverged).toBeTruthy();
		expect(Number.isFinite(r.Ic)).toBe(true);
	});

	it('robertson2009(p) stays finite for huge resistances and flags them off the chart', () => {
		const r = robertson2009({ qt: 1e9, fs: 1e3, sigmaV: 100, sigmaVeff: 60 });
		expect(Number.isFinite(r.Ic)).toBe(true);
		expect(r.converged).toBe(true);
		expect(r.flags & CptFlag.icOutOfChart).toBeTruthy();
	});

	it('robertson2009(p) honours maxIterations and tolerance', () => {
		const p = { qt: 10000, fs: 50, sigmaV: 94, sigmaVeff: 54.8 };
		expect(robertson2009(p, { maxIterations: 1 }).converged).toBe(false);
		expect(robertson2009(p, { tolerance: 0.5 }).converged).toBe(true);
	});

	it('robertson2009(p) flags Ic outside the chart range', () => {
		// Ic ≈ 0.5 at Qtn = 1000, Fr = 0.1 % (the chart's corner): off the 1.0–4.0 range (common practice).
		const r = robertson2009({ qt: 100000, fs: 10, sigmaV: 100, sigmaVeff: 100 });
		expect(r.Ic).toBeLessThan(IC_CHART_MIN);
		expect(r.flags & CptFlag.icOutOfChart).toBeTruthy();
		const clay = robertson2009({ qt: 130, fs: 20, sigmaV: 100, sigmaVeff: 50 });
		expect(clay.Ic).toBeGreaterThan(IC_CHART_MAX);
		expect(clay.flags & CptFlag.icOutOfChart).toBeTruthy();
	});
});
