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
