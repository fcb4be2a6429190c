import { describe, it, expect } from 'vitest';
import { Matrix, CholeskyDecomposition } from 'ml-matrix';
import { choleskyFactor, choleskySolve } from '../../../src/lib/geostat/index';
import { expectAbsClose } from '../../asserts';

// A reproducible SPD matrix: B·Bᵀ + n·I from a linear congruential generator (Park & Miller 1988).
function spd(n: number, seed = 7): Float64Array {
	let s = seed;
	const r = () => ((s = (s * 16807) % 2147483647) / 2147483647) * 2 - 1;
	const b = Array.from({ length: n * n }, r);
	const a = new Float64Array(n * n);
	for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
		let v = i === j ? n : 0;
		for (let k = 0; k < n; k++) v += b[i * n + k] * b[j * n + k];
		a[i * n + j] = v;
	}
	return a;
}

describe('choleskyFactor / choleskySolve', () => {
	it('choleskySolve(choleskyFactor(A), b) matches ml-matrix CholeskyDecomposition to 1e-12 (Golub & Van Loan alg. 4.2.1)', () => {
		for (const n of [1, 2, 5, 24]) {
			const a = spd(n);
			const ref = new CholeskyDecomposition(new Matrix(Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, i * n + n)))));
			const b = Float64Array.from({ length: n }, (_, i) => i + 1);
			const expected = ref.solve(Matrix.columnVector(Array.from(b))).to1DArray();
			const l = a.slice();
			expect(choleskyFactor(l, n)).toBe(true);
			const x = choleskySolve(l, n, b);
			for (let i = 0; i < n; i++) expectAbsClose(x[i], expected[i], 1e-12 * (1 + Math.abs(expected[i])), `n=${n} x[${i}]`);
			const L = ref.lowerTriangularMatrix;
			for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) expectAbsClose(l[i * n + j], L.get(i, j), 1e-12 * Math.sqrt(n), `L[${i},${j}]`);
		}
	});

	it('choleskyFactor(A) returns false for a singular or indefinite matrix, and for NaN', () => {
		expect(choleskyFactor(new Float64Array([1, 1, 1, 1]), 2)).toBe(false);
		expect(choleskyFactor(new Float64Array([1, 2, 2, 1]), 2)).toBe(false);
		expect(choleskyFactor(new Float64Array([NaN]), 1)).toBe(false);
	});

	it('choleskyFactor(A, 0) succeeds on the empty matrix; bad sizes throw RangeError', () => {
		expect(choleskyFactor(new Float64Array(0), 0)).toBe(true);
		expect(() => choleskyFactor(new Float64Array(3), 2)).toThrow(RangeError);
		expect(() => choleskyFactor(new Float64Array(4), 1.5)).toThrow(RangeError);
		expect(() => choleskySolve(new Float64Array(4), 2, new Float64Array(1))).toThrow(RangeError);
	});

	it('choleskySolve(L, b) does not mutate L and may solve in place', () => {
		const l = spd(4);
		expect(choleskyFactor(l, 4)).toBe(true);
		const copy = l.slice();
		const b = new Float64Array([1, 2, 3, 4]);
		const x = choleskySolve(l, 4, b);
		const y = b.slice();
		choleskySolve(l, 4, y, y);
		expect(Array.from(l)).toEqual(Array.from(copy));
		expect(Array.from(y)).toEqual(Array.from(x));
	});
});

describe('choleskyFactor(A, n, relTol, from)', () => {
	// The row-by-row (Cholesky–Banachiewicz) order, written out here: the same formulas, so the same bits.
	function byRows(a: Float64Array, n: number): boolean {
		let dmax = 0;
		for (let i = 0; i < n; i++) dmax = Math.max(dmax, a[i * n + i]);
		const inv: number[] = [];
		for (let i = 0; i < n; i++) {
			for (let j = 0; j < i; j++) {
				let s = a[i * n + j];
				for (let k = 0; k < j; k++) s -= a[i * n + k] * a[j * n + k];
				a[i * n + j] = s * inv[j];
			}
			let d = a[i * n + i];
			for (let k = 0; k < i; k++) d -= a[i * n + k] * a[i * n + k];
			if (!(d > 1e-13 * dmax)) return false;
			a[i * n + i] = Math.sqrt(d);
			inv[i] = 1 / a[i * n + i];
		}
		return true;
	}

	// The column-by-column algorithm (Golub & Van Loan 2013, alg. 4.2.1), written out here as the reference.
	function byColumns(a: Float64Array, n: number): boolean {
		let dmax = 0;
		for (let i = 0; i < n; i++) dmax = Math.max(dmax, a[i * n + i]);
		for (let j = 0; j < n; j++) {
			let d = a[j * n + j];
			for (let k = 0; k < j; k++) d -= a[j * n + k] * a[j * n + k];
			if (!(d > 1e-13 * dmax)) return false;
			const l = Math.sqrt(d);
			a[j * n + j] = l;
			const inv = 1 / l;
			for (let i = j + 1; i < n; i++) {
				let s = a[i * n + j];
				for (let k = 0; k < j; k++) s -= a[i * n + k] * a[j * n + k];
				a[i * n + j] = s * inv;
			}
		}
		return true;
	}

	it('choleskyFactor gives the same bits as the column-by-column algorithm and as the row-by-row order', () => {
		for (const n of [1, 3, 4, 5, 17, 32, 33]) {
			const a = spd(n, 11 + n);
			const got = a.slice();
			const cols = a.slice();
			const rows = a.slice();
			expect(choleskyFactor(got, n)).toBe(true);
			expect(byColumns(cols, n)).toBe(true);
			expect(byRows(rows, n)).toBe(true);
			for (let i = 0; i < n; i++) {
				for (let j = 0; j <= i; j++) {
					expect(Object.is(got[i * n + j], cols[i * n + j])).toBe(true);
					expect(Object.is(got[i * n + j], rows[i * n + j])).toBe(true);
				}
			}
		}
	});

	it('choleskySolve gives the same bits as plain forward and back substitution, term by term (its loops go four terms a pass)', () => {
		for (const n of [1, 2, 3, 4, 5, 7, 17, 32, 33]) {
			const l = spd(n, 3 + n);
			expect(choleskyFactor(l, n)).toBe(true);
			const b = Float64Array.from({ length: n }, (_, i) => Math.sin(i + 1));
			const ref = new Float64Array(n);
			for (let i = 0; i < n; i++) {
				let s = b[i];
				for (let k = 0; k < i; k++) s -= l[i * n + k] * ref[k];
				ref[i] = s / l[i * n + i];
			}
			for (let i = n - 1; i >= 0; i--) {
				let s = ref[i];
				for (let k = i + 1; k < n; k++) s -= l[k * n + i] * ref[k];
				ref[i] = s / l[i * n + i];
			}
			const x = choleskySolve(l, n, b);
			for (let i = 0; i < n; i++) expect(Object.is(x[i], ref[i]), `n=${n} x[${i}]`).toBe(true);
		}
	});

	it('choleskyFactor from m continues a kept factor of the leading m×m block to the same bits as a whole factorisation', () => {
		const n = 20;
		const a = spd(n, 5);
		const whole = a.slice();
		expect(choleskyFactor(whole, n)).toBe(true);
		for (const m of [0, 1, 8, 19, 20]) {
			// The leading block factored on its own (stride m), then its rows copied into the n×n matrix.
			const lead = new Float64Array(m * m);
			for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) lead[i * m + j] = a[i * n + j];
			expect(choleskyFactor(lead, m)).toBe(true);
			const b = a.slice();
			for (let i = 0; i < m; i++) for (let j = 0; j <= i; j++) b[i * n + j] = lead[i * m + j];
			expect(choleskyFactor(b, n, 1e-13, m)).toBe(true);
			for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) expect(Object.is(b[i * n + j], whole[i * n + j])).toBe(true);
		}
		expect(() => choleskyFactor(a.slice(), n, 1e-13, n + 1)).toThrow(RangeError);
		expect(() => choleskyFactor(a.slice(), n, 1e-13, -1)).toThrow(RangeError);
	});

	it('choleskyFactor from m still returns false when a later row is singular', () => {
		// [[4, 2, 2], [2, 1, 1], [2, 1, 5]]: the second row is the first halved, so its pivot is 0.
		const a = new Float64Array([4, 2, 2, 2, 1, 1, 2, 1, 5]);
		a[0] = 2; // L_00 of the leading 1×1 block
		expect(choleskyFactor(a, 3, 1e-13, 1)).toBe(false);
	});
});
