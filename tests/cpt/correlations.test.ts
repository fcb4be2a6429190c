// Scalar correlations checked against their published equations, written out independently here with
// Math functions (spreadsheet style), and against values worked by hand.
import { describe, expect, it } from 'vitest';
import {
	CN_MAX,
	CptFlag,
	IC_CHART_MAX,
	IC_CHART_MIN,
	PA_KPA,
	correctedTip,
	crrBI2014,
	finesContentFromIc,
	qc1NcsBI2014,
	relativeDensityIB2008,
	robertson2009,
	undrainedStrength
} from '$lib/cpt';
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

/** Boulanger & Idriss (2014): qc1Ncs solved by bisection on x − (qc1N(x) + Δqc1N(x)) = 0. */
function bi2014ByBisection(qc: number, sve: number, FC: number) {
	const parts = (x: number) => {
		const m = 1.338 - 0.249 * Math.pow(Math.min(254, Math.max(21, x)), 0.264);
		const CN = Math.min(1.7, Math.pow(pa / sve, m));
		const qc1N = (CN * qc) / pa;
		const dq = (11.9 + qc1N / 14.6) * Math.exp(1.63 - 9.7 / (FC + 2) - (15.7 / (FC + 2)) ** 2);
		return { m, CN, qc1N, qc1Ncs: qc1N + dq };
	};
	let lo = 0;
	let hi = 5000;
	for (let k = 0; k < 200 && hi - lo > 1e-12; k++) {
		const mid = (lo + hi) / 2;
		if (mid - parts(mid).qc1Ncs > 0) hi = mid;
		else lo = mid;
	}
	return parts(lo);
}

describe('correctedTip(qc, u2, a)', () => {
	it('correctedTip(qc, u2, a) adds u2·(1 − a) (Lunne et al. 1997)', () => {
		// Hand-worked: 2000 + 300·(1 − 0.8) = 2060 kPa.
		expectAbsClose(correctedTip(2000, 300, 0.8), 2060, 1e-9);
		expect(correctedTip(2000, 300, 1)).toBe(2000);
		expect(correctedTip(2000, 0, 0.7)).toBe(2000);
		expect(correctedTip(2000, -50, 0)).toBe(1950);
	});
	it('correctedTip(qc, NaN, a) is NaN', () => {
		expect(correctedTip(2000, NaN, 0.8)).toBeNaN();
		expect(correctedTip(NaN, 10, 0.8)).toBeNaN();
	});
	it('correctedTip(qc, u2, a) throws RangeError for a outside 0–1', () => {
		expect(() => correctedTip(1, 1, 1.2)).toThrow(RangeError);
		expect(() => correctedTip(1, 1, -0.1)).toThrow('area ratio must be within 0–1');
		expect(() => correctedTip(1, 1, NaN)).toThrow(RangeError);
	});
});

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

describe('finesContentFromIc(Ic, CFC)', () => {
	it('finesContentFromIc(Ic, CFC) is 80(Ic + CFC) − 137 inside 0–100 (Boulanger & Idriss 2014)', () => {
		expectAbsClose(finesContentFromIc(2.2), 80 * 2.2 - 137, 1e-12);
		expectAbsClose(finesContentFromIc(2.2, 0.1), 80 * 2.3 - 137, 1e-12);
		// Hand-worked: FC = 0 at Ic = 137/80 = 1.7125, FC = 100 at Ic = 237/80 = 2.9625.
		expectAbsClose(finesContentFromIc(1.7125), 0, 1e-12);
		expectAbsClose(finesContentFromIc(2.9625), 100, 1e-12);
	});
	it('finesContentFromIc(Ic, CFC) is clamped to 0–100 as the method defines', () => {
		expect(finesContentFromIc(1.2)).toBe(0);
		expect(finesContentFromIc(3.8)).toBe(100);
		expect(finesContentFromIc(2.5, -1)).toBe(0);
	});
	it('finesContentFromIc(NaN) is NaN', () => {
		expect(finesContentFromIc(NaN)).toBeNaN();
	});
});

describe('qc1NcsBI2014(p)', () => {
	it('qc1NcsBI2014(p) agrees with an independent bisection solution (Boulanger & Idriss 2014)', () => {
		const cases = [
			[10000, 54.8, 5],
			[5000, 80, 35],
			[2000, 30, 60],
			[15000, 200, 10],
			[25000, 400, 0],
			[800, 120, 80]
		];
		for (const [qc, sve, FC] of cases) {
			const ref = bi2014ByBisection(qc, sve, FC);
			const r = qc1NcsBI2014({ qc, sigmaVeff: sve, FC });
			expect(r.converged).toBe(true);
			expectAbsClose(r.qc1Ncs, ref.qc1Ncs, 1e-7, `qc1Ncs at qc ${qc}`);
			expectAbsClose(r.qc1N, ref.qc1N, 1e-7, `qc1N at qc ${qc}`);
			expectAbsClose(r.CN, ref.CN, 1e-9, `CN at qc ${qc}`);
			expectAbsClose(r.m, ref.m, 1e-9, `m at qc ${qc}`);
		}
	});

	it('qc1NcsBI2014(p) gives CN = 1 at σ\'v = pa and Δqc1N ≈ 0 for clean sand', () => {
		// Hand-worked: qc = 100·pa, σ'v = pa → CN = 1, qc1N = 100; at FC = 0,
		// Δqc1N = (11.9 + 100/14.6)·exp(1.63 − 4.85 − 61.62) ≈ 1e-27.
		const r = qc1NcsBI2014({ qc: 100 * PA_KPA, sigmaVeff: PA_KPA, FC: 0 });
		expect(r.CN).toBe(1);
		expectAbsClose(r.qc1N, 100, 1e-12);
		expectAbsClose(r.qc1Ncs, 100, 1e-12);
	});

	it('qc1NcsBI2014(p) adds the hand-worked Δqc1N at FC = 35 %', () => {
		// exp(1.63 − 9.7/37 − (15.7/37)²) = exp(1.63 − 0.262162 − 0.180051) = exp(1.187787) ≈ 3.27981;
		// Δqc1N = (11.9 + qc1N/14.6)·3.27981.
		const r = qc1NcsBI2014({ qc: 100 * PA_KPA, sigmaVeff: PA_KPA, FC: 35 });
		expect(r.CN).toBe(1);
		expectAbsClose(r.qc1Ncs - r.qc1N, (11.9 + 100 / 14.6) * 3.27981, 2e-4);
	});

	it('qc1NcsBI2014(p) caps CN at 1.7 at very low stress', () => {
		const r = qc1NcsBI2014({ qc: 3000, sigmaVeff: 5, FC: 10 });
		expect(r.CN).toBe(CN_MAX);
		expectAbsClose(r.qc1N, (1.7 * 3000) / PA_KPA, 1e-12);
	});

	it('qc1NcsBI2014(p) limits qc1Ncs to 21–254 inside m only', () => {
		const dense = qc1NcsBI2014({ qc: 60000, sigmaVeff: 150, FC: 0 });
		expect(dense.qc1Ncs).toBeGreaterThan(254);
		expectAbsClose(dense.m, 1.338 - 0.249 * Math.pow(254, 0.264), 1e-12);
		const loose = qc1NcsBI2014({ qc: 500, sigmaVeff: 150, FC: 0 });
		expect(loose.qc1Ncs).toBeLessThan(21);
		expectAbsClose(loose.m, 1.338 - 0.249 * Math.pow(21, 0.264), 1e-12);
	});

	it('qc1NcsBI2014(p) returns NaN without convergence for σ\'v ≤ 0 or NaN', () => {
		for (const p of [{ qc: 1000, sigmaVeff: 0, FC: 5 }, { qc: NaN, sigmaVeff: 50, FC: 5 }, { qc: 1000, sigmaVeff: 50, FC: NaN }]) {
			const r = qc1NcsBI2014(p);
			expect(r.qc1Ncs).toBeNaN();
			expect(r.converged).toBe(false);
		}
	});

	it('qc1NcsBI2014(p) throws RangeError for FC outside 0–100', () => {
		expect(() => qc1NcsBI2014({ qc: 1000, sigmaVeff: 50, FC: -1 })).toThrow('FC must be within 0–100 %');
		expect(() => qc1NcsBI2014({ qc: 1000, sigmaVeff: 50, FC: 101 })).toThrow(RangeError);
	});
});

describe('crrBI2014(qc1Ncs)', () => {
	const formula = (q: number) => Math.exp(q / 113 + (q / 1000) ** 2 - (q / 140) ** 3 + (q / 137) ** 4 - 2.8);
	it('crrBI2014(qc1Ncs) matches the published curve (Boulanger & Idriss 2014)', () => {
		for (const q of [21, 50, 80, 100, 120, 150, 180, 211]) expectRelClose(crrBI2014(q), formula(q), 1e-13, `q = ${q}`);
		// Hand-worked: at 100 the exponent is 0.884956 + 0.01 − 0.364431 + 0.283869 − 2.8 = −1.985606.
		expectAbsClose(crrBI2014(100), Math.exp(-1.985606), 1e-6);
	});
	it('crrBI2014(qc1Ncs) increases with qc1Ncs', () => {
		let prev = -Infinity;
		for (let q = 0; q <= 254; q += 0.5) {
			const c = crrBI2014(q);
			expect(c).toBeGreaterThan(prev);
			prev = c;
		}
	});
	it('crrBI2014(NaN) is NaN', () => {
		expect(crrBI2014(NaN)).toBeNaN();
	});
});

describe('relativeDensityIB2008(qc1Ncs, Cdq)', () => {
	it('relativeDensityIB2008(qc1Ncs) is 0.465(qc1Ncs/0.9)^0.264 − 1.063 (Idriss & Boulanger 2008)', () => {
		for (const q of [30, 60, 100, 150, 200]) {
			expectAbsClose(relativeDensityIB2008(q), 0.465 * Math.pow(q / 0.9, 0.264) - 1.063, 1e-13);
		}
		expectAbsClose(relativeDensityIB2008(100, 0.64), 0.465 * Math.pow(100 / 0.64, 0.264) - 1.063, 1e-13);
	});
	it('relativeDensityIB2008(qc1Ncs) spans about 0–1 over 21–254, the limits inside m', () => {
		// Follows from the equation: Dr = 0 at 0.9·(1.063/0.465)^(1/0.264) ≈ 20.6, Dr = 1 at ≈ 254.5.
		expectAbsClose(relativeDensityIB2008(21), 0, 0.01);
		expectAbsClose(relativeDensityIB2008(254), 1, 0.01);
	});
	it('relativeDensityIB2008(qc1Ncs) is not clamped', () => {
		expect(relativeDensityIB2008(400)).toBeGreaterThan(1);
		expect(relativeDensityIB2008(5)).toBeLessThan(0);
	});
	it('relativeDensityIB2008(qc1Ncs) is NaN for negative or NaN input and throws for Cdq ≤ 0', () => {
		expect(relativeDensityIB2008(-3)).toBeNaN();
		expect(relativeDensityIB2008(NaN)).toBeNaN();
		expect(() => relativeDensityIB2008(100, 0)).toThrow('Cdq must be positive');
	});
});

describe('undrainedStrength(qt, sigmaV, Nkt)', () => {
	it('undrainedStrength(qt, sigmaV, Nkt) is (qt − σv)/Nkt (Lunne et al. 1997)', () => {
		// Hand-worked: (800 − 100)/14 = 50 kPa.
		expect(undrainedStrength(800, 100, 14)).toBe(50);
		expect(undrainedStrength(80, 100, 10)).toBe(-2);
	});
	it('undrainedStrength(qt, sigmaV, Nkt) throws RangeError for Nkt ≤ 0', () => {
		expect(() => undrainedStrength(800, 100, 0)).toThrow('Nkt must be positive');
		expect(() => undrainedStrength(800, 100, NaN)).toThrow(RangeError);
	});
});
