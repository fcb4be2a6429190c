import { describe, it, expect } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { krige, covariance } from '../../../src/lib/geostat/index';
import type { Sample, VariogramModel } from '../../../src/lib/geostat/index';
import { expectAbsClose } from '../../asserts';

// Anisotropic model with a nugget: the reference system below is built independently from the kriging
// equations of Goovaerts (1997, eqs. 5.5 and 5.18) and solved by ml-matrix's LU solve.
const model: VariogramModel = {
	azimuth: 35,
	structures: [
		{ type: 'nugget', sill: 0.2, rangeMajor: 0, rangeMinor: 0, rangeVertical: 0 },
		{ type: 'spherical', sill: 0.8, rangeMajor: 30, rangeMinor: 12, rangeVertical: 3 }
	]
};
const data: Sample[] = [
	{ x: 0, y: 0, z: 0, value: 1.2 },
	{ x: 10, y: 4, z: -1, value: 2.5 },
	{ x: -6, y: 9, z: 0.5, value: 0.4 },
	{ x: 3, y: -8, z: -2, value: 1.9 },
	{ x: 14, y: 12, z: 1, value: 3.1 },
	{ x: -11, y: -3, z: -0.5, value: 0.8 }
];
const target = { x: 2, y: 3, z: -0.4 };
const C = (a: { x: number; y: number; z: number }, b: { x: number; y: number; z: number }) => covariance(model, a.x - b.x, a.y - b.y, a.z - b.z);

describe('krige(data, target, model, opts)', () => {
	it('krige simple matches an ml-matrix solve of C·λ = c (Goovaerts 1997, eq. 5.5) to 1e-12', () => {
		const n = data.length;
		const A = new Matrix(data.map((a) => data.map((b) => C(a, b))));
		const c = Matrix.columnVector(data.map((a) => C(a, target)));
		const lam = solve(A, c).to1DArray();
		const m = 1.5;
		const est = m + lam.reduce((s, l, i) => s + l * (data[i].value - m), 0);
		const variance = covariance(model, 0, 0, 0) - lam.reduce((s, l, i) => s + l * c.get(i, 0), 0);
		const r = krige(data, target, model, { type: 'simple', mean: m });
		for (let i = 0; i < n; i++) expectAbsClose(r.weights[i], lam[i], 1e-12, `λ${i}`);
		expectAbsClose(r.estimate, est, 1e-12);
		expectAbsClose(r.variance, variance, 1e-12);
	});

	it('krige ordinary matches an ml-matrix solve of the bordered system (Goovaerts 1997, eq. 5.18) to 1e-12', () => {
		const n = data.length;
		const rows = data.map((a) => [...data.map((b) => C(a, b)), 1]);
		rows.push([...data.map(() => 1), 0]);
		const rhs = Matrix.columnVector([...data.map((a) => C(a, target)), 1]);
		const sol = solve(new Matrix(rows), rhs).to1DArray();
		const lam = sol.slice(0, n);
		const mu = sol[n];
		const est = lam.reduce((s, l, i) => s + l * data[i].value, 0);
		const variance = covariance(model, 0, 0, 0) - lam.reduce((s, l, i) => s + l * rhs.get(i, 0), 0) - mu;
		const r = krige(data, target, model, { type: 'ordinary' });
		for (let i = 0; i < n; i++) expectAbsClose(r.weights[i], lam[i], 1e-12, `λ${i}`);
		expectAbsClose(r.estimate, est, 1e-12);
		expectAbsClose(r.variance, variance, 1e-12);
	});

	it('krige ordinary weights sum to 1 (within 1e-14), for several targets', () => {
		for (const t of [target, { x: 40, y: -20, z: 3 }, { x: 0.1, y: 0, z: 0 }]) {
			const w = krige(data, t, model, { type: 'ordinary' }).weights;
			expectAbsClose(w.reduce((s, v) => s + v, 0), 1, 1e-14);
		}
	});

	it('krige(data, target) is exact at a datum: its value, variance 0 and a unit weight, nugget or not', () => {
		for (const type of ['simple', 'ordinary'] as const) {
			const r = krige(data, { x: 10, y: 4, z: -1 }, model, { type, mean: 2 });
			expect(r.estimate).toBe(2.5);
			expect(r.variance).toBe(0);
			expect(Array.from(r.weights)).toEqual([0, 1, 0, 0, 0, 0]);
		}
	});

	it('krige shows the screen effect: a datum behind a nearer one in line gets a near-zero weight (Isaaks & Srivastava 1989, ch. 12)', () => {
		// Exponential model without nugget in 1D: the Markov property makes the screened weight exactly 0
		// in theory (Journel & Huijbregts 1978); we allow 1e-12.
		const m1: VariogramModel = { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 10, rangeMinor: 10, rangeVertical: 10 }] };
		const line: Sample[] = [
			{ x: 2, y: 0, z: 0, value: 1 },
			{ x: 5, y: 0, z: 0, value: 2 }
		];
		const r = krige(line, { x: 0, y: 0, z: 0 }, m1, { type: 'simple' });
		expectAbsClose(r.weights[1], 0, 1e-12, 'screened weight');
		// exp(−3·2/10): the simple-kriging weight of the unscreened datum.
		expectAbsClose(r.weights[0], Math.exp(-0.6), 1e-12, 'front weight');
	});

	it('krige with no data: simple gives the mean and the sill; ordinary throws RangeError', () => {
		const r = krige([], target, model, { type: 'simple', mean: 3 });
		expect([r.estimate, r.variance, r.weights.length]).toEqual([3, 1, 0]);
		expect(() => krige([], target, model, { type: 'ordinary' })).toThrow(/at least one datum/);
	});

	it('krige with one sample: simple weight C(h)/C(0) (within 1e-15)', () => {
		const r = krige([data[1]], target, model, { type: 'simple' });
		expectAbsClose(r.weights[0], C(data[1], target) / 1, 1e-15);
		expectAbsClose(krige([data[1]], target, model, { type: 'ordinary' }).estimate, 2.5, 1e-15);
	});

	it('krige names duplicate locations and never returns NaN for a singular system', () => {
		const dup = [...data, { ...data[2], value: 9 }];
		expect(() => krige(dup, target, model, { type: 'simple' })).toThrow('duplicate sample locations: 2 and 6');
		// Gaussian model, no nugget, data 1e-9 apart: singular to working precision.
		const g: VariogramModel = { azimuth: 0, structures: [{ type: 'gaussian', sill: 1, rangeMajor: 100, rangeMinor: 100, rangeVertical: 100 }] };
		const close: Sample[] = [
			{ x: 0, y: 0, z: 0, value: 1 },
			{ x: 1e-9, y: 0, z: 0, value: 2 }
		];
		expect(() => krige(close, { x: 5, y: 0, z: 0 }, g, { type: 'simple' })).toThrow('singular kriging system');
	});

	it('krige rejects NaN, bad options and malformed input with TypeError / RangeError', () => {
		expect(() => krige([{ x: 0, y: 0, z: 0, value: NaN }], target, model, { type: 'simple' })).toThrow(RangeError);
		expect(() => krige(data, { x: NaN, y: 0, z: 0 }, model, { type: 'simple' })).toThrow(RangeError);
		expect(() => krige(data, target, model, { type: 'universal' as 'simple' })).toThrow(TypeError);
		expect(() => krige('x' as unknown as Sample[], target, model, { type: 'simple' })).toThrow(TypeError);
	});

	it('krige handles huge values: weights unchanged, estimate scaled (relative 1e-12)', () => {
		const big = data.map((s) => ({ ...s, value: s.value * 1e12 }));
		const a = krige(data, target, model, { type: 'ordinary' });
		const b = krige(big, target, model, { type: 'ordinary' });
		expect(Array.from(b.weights)).toEqual(Array.from(a.weights));
		expectAbsClose(b.estimate, a.estimate * 1e12, 1e-12 * Math.abs(a.estimate * 1e12));
	});

	it('krige does not mutate its inputs', () => {
		const copy = JSON.stringify([data, target, model]);
		krige(data, target, model, { type: 'ordinary' });
		expect(JSON.stringify([data, target, model])).toBe(copy);
	});
});
