// Checked against the published equation, written out independently here with Math functions
// (spreadsheet style), and against values worked by hand.
import { describe, expect, it } from 'vitest';
import { CN_MAX, PA_KPA, qc1NcsBI2014 } from '$lib/cpt';
import { expectAbsClose } from '../asserts';

const pa = 101.325;

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
