import { describe, it, expect } from 'vitest';
import { Matrix, CholeskyDecomposition } from 'ml-matrix';
import {
	tabulatedCovariance,
	TabulatedCovariance,
	covariance,
	COVARIANCE_TABLE_STEP,
	COVARIANCE_TABLE_END,
	type VariogramModel,
	type Structure
} from '../../../src/lib/geostat/index';
import { expectAbsClose } from '../../asserts';

function lcg(seed: number) {
	let s = seed;
	return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

const one = (type: Structure['type'], sill = 1): VariogramModel => ({
	azimuth: 90,
	structures: [{ type, sill, rangeMajor: 40, rangeMinor: 40, rangeVertical: 0.9 }]
});

const nested: VariogramModel = {
	azimuth: 33,
	structures: [
		{ type: 'nugget', sill: 0.1, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
		{ type: 'exponential', sill: 0.5, rangeMajor: 30, rangeMinor: 12, rangeVertical: 1.5 },
		{ type: 'gaussian', sill: 0.25, rangeMajor: 15, rangeMinor: Infinity, rangeVertical: 2 },
		{ type: 'spherical', sill: 0.15, rangeMajor: 8, rangeMinor: 8, rangeVertical: 0.5 }
	]
};

// Bound of the table: cubic Hermite error h⁴/384·max|f⁗| with h = 2⁻¹⁰ and f = e^(−3x) (f⁗ ≤ 81) or, for the
// Gaussian, e^(−3r²) read at x = r² (the same f): 81/(384·2⁴⁰) ≈ 1.9e-13 of a structure's sill (Burden & Faires
// 2011, §3.4 (memory)), plus rounding; 3e-13 of the total sill is asserted.
const TOL = 3e-13;

describe('tabulatedCovariance(model)', () => {
	it('tabulatedCovariance agrees with the exact covariance (compileVariogram) within 3e-13 of the sill: exponential, Gaussian, spherical, nested', () => {
		const rnd = lcg(11);
		for (const m of [one('exponential'), one('gaussian'), one('spherical', 2.5), nested]) {
			const t = tabulatedCovariance(m);
			const sill = m.structures.reduce((s, x) => s + x.sill, 0);
			for (let i = 0; i < 20_000; i++) {
				const dx = (rnd() - 0.5) * 160;
				const dy = (rnd() - 0.5) * 60;
				const dz = (rnd() - 0.5) * 4;
				expectAbsClose(t.covariance(dx, dy, dz), covariance(m, dx, dy, dz), TOL * sill, `${m.structures.map((s) => s.type).join('+')} at (${dx}, ${dy}, ${dz})`);
			}
		}
	});

	it('tabulatedCovariance follows the closed forms (REFERENCES.md practical-range forms, via Math.exp) within 3e-13', () => {
		const e = tabulatedCovariance(one('exponential'));
		const g = tabulatedCovariance(one('gaussian'));
		for (const h of [0.01, 0.37, 1, 4.5, 13, 40, 79.9]) {
			expectAbsClose(e.covariance(h, 0, 0), Math.exp((-3 * h) / 40), TOL, `exp h=${h}`);
			expectAbsClose(g.covariance(h, 0, 0), Math.exp((-3 * h * h) / 1600), TOL, `gau h=${h}`);
			expectAbsClose(e.covariance(0, 0, h / 40), Math.exp((-3 * h) / 40 / 0.9), TOL, `exp vertical h=${h / 40}`);
		}
		// At the practical range the exponential has fallen to e^−3 = 0.049787068367863944 (95 % of the sill reached).
		expectAbsClose(e.covariance(40, 0, 0), 0.049787068367863944, TOL);
	});

	it('tabulatedCovariance is the sill at h = 0 exactly, symmetric bit for bit, and 0 beyond a spherical range', () => {
		const t = tabulatedCovariance(nested);
		expect(t.sill).toBe(1);
		expect(t.covariance(0, 0, 0)).toBe(1);
		// The nugget counts only at h = 0.
		expectAbsClose(t.covariance(1e-9, 0, 0), 0.9, 1e-9);
		const rnd = lcg(5);
		for (let i = 0; i < 1000; i++) {
			const d = [(rnd() - 0.5) * 50, (rnd() - 0.5) * 50, (rnd() - 0.5) * 3];
			expect(Object.is(t.covariance(d[0], d[1], d[2]), t.covariance(-d[0], -d[1], -d[2]))).toBe(true);
		}
		expect(tabulatedCovariance(one('spherical')).covariance(40, 0, 0)).toBe(0);
		expect(tabulatedCovariance(one('spherical')).covariance(80, 0, 0)).toBe(0);
	});

	it('tabulatedCovariance beyond the table (x ≥ 8) is the exponential itself (within 1e-15 relative), and tiny', () => {
		expect(COVARIANCE_TABLE_STEP).toBe(1 / 1024);
		const t = tabulatedCovariance(one('exponential'));
		const h = (COVARIANCE_TABLE_END + 0.5) * 40;
		const c = t.covariance(h, 0, 0);
		expect(Math.abs(c - Math.exp(-25.5)) / Math.exp(-25.5)).toBeLessThan(1e-15);
		expect(t.covariance(1e6, 0, 0)).toBe(0);
	});

	it('tabulatedCovariance matrices of close points are positive definite as the exact ones are (ml-matrix Cholesky), within 1e-12', () => {
		// 30 points 0.2 m apart down a sounding and 1 m apart along the section: a typical kriging system.
		const pts = Array.from({ length: 30 }, (_, i) => [(i % 5) * 1.0, 0, -Math.floor(i / 5) * 0.2]);
		const t = tabulatedCovariance(one('exponential'));
		const K = new Matrix(pts.map((p) => pts.map((q) => t.covariance(p[0] - q[0], p[1] - q[1], p[2] - q[2]))));
		const E = new Matrix(pts.map((p) => pts.map((q) => covariance(one('exponential'), p[0] - q[0], p[1] - q[1], p[2] - q[2]))));
		expect(new CholeskyDecomposition(K).isPositiveDefinite()).toBe(true);
		expect(Math.max(...K.clone().sub(E).abs().to1DArray())).toBeLessThan(1e-12);
	});

	it('TabulatedCovariance.row and pair give covariance() bit for bit (one exponential and a nested model), the sill at h = 0', () => {
		const x = Float64Array.from([0, 1.5, 1.5, 40, 7.25, 0]);
		const y = Float64Array.from([0, 0, 2, -3, 0.5, 0]);
		const z = Float64Array.from([0, -0.2, -0.2, -1, -0.4, 0]);
		for (const m of [one('exponential'), nested]) {
			const t = tabulatedCovariance(m);
			const out = new Float64Array(8);
			t.row(out, 1, x, y, z, 2, 0, 6);
			for (let r = 0; r < 6; r++) expect(Object.is(out[1 + r], t.covariance(x[2] - x[r], y[2] - y[r], z[2] - z[r]))).toBe(true);
			expect(out[1 + 2]).toBe(t.sill);
			expect(out[0]).toBe(0);
			t.pair(out, 7, x, y, z, 4, x, y, z, 1);
			expect(Object.is(out[7], t.covariance(x[4] - x[1], y[4] - y[1], z[4] - z[1]))).toBe(true);
		}
	});

	it('tabulatedCovariance is one class for every model and rejects invalid models like validateVariogramModel', () => {
		expect(tabulatedCovariance(one('gaussian'))).toBeInstanceOf(TabulatedCovariance);
		expect(() => tabulatedCovariance({ azimuth: 0, structures: [{ type: 'cubic' as Structure['type'], sill: 1, rangeMajor: 1, rangeMinor: 1, rangeVertical: 1 }] })).toThrow(TypeError);
		expect(() => tabulatedCovariance({ azimuth: 0, structures: [{ type: 'exponential', sill: 1, rangeMajor: 0, rangeMinor: 1, rangeVertical: 1 }] })).toThrow(RangeError);
		// A pure nugget: the sill at 0, nothing elsewhere.
		const nug = tabulatedCovariance({ azimuth: 0, structures: [{ type: 'nugget', sill: 2, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 }] });
		expect([nug.covariance(0, 0, 0), nug.covariance(0.1, 0, 0)]).toEqual([2, 0]);
	});
});
