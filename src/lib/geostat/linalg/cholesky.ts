/**
 * In-place Cholesky factorisation A = L·Lᵀ of a symmetric positive-definite n×n matrix stored row-major in
 * the first n² entries of `a`, column by column (Golub & Van Loan 2013, Matrix Computations, alg. 4.2.1):
 * L_jj = √(a_jj − Σ_{k<j} L_jk²), L_ij = (a_ij − Σ_{k<j} L_ik·L_jk)·(1/L_jj) for i > j. Row i of L depends on rows
 * ≤ i of A only, so the factor of a leading block can be kept and the factorisation continued: with `from` = m,
 * rows below m must already hold the factor of A's leading m×m block (as a previous call left them) and only rows
 * m … n − 1 are computed, each entry by the same arithmetic in the same order as a whole factorisation, so the
 * bits are the same. Only the lower triangle is read; on success it holds L (the strict upper triangle is left
 * untouched).
 *
 * A pivot at or below `relTol` times the largest diagonal entry of the rows still to factor means the matrix is
 * singular to working precision; the function then returns false (no throw: callers of the hot loop decide what
 * to do). Mutates `a`. Inner-loop routine: it checks its sizes only.
 * @throws {RangeError} if n is not a non-negative integer, `from` not within 0…n, or `a` holds fewer than n² entries
 */
export function choleskyFactor(a: Float64Array, n: number, relTol = 1e-13, from = 0): boolean {
	if (!Number.isInteger(n) || n < 0) throw new RangeError('n must be a non-negative integer');
	if (!Number.isInteger(from) || from < 0 || from > n) throw new RangeError('from must be an integer within 0…n');
	if (a.length < n * n) throw new RangeError('matrix buffer too small');
	let dmax = 0;
	for (let i = from; i < n; i++) if (a[i * n + i] > dmax) dmax = a[i * n + i];
	const tol = relTol * dmax;
	for (let j = 0; j < n; j++) {
		const rj = j * n;
		let ljj: number;
		if (j < from) ljj = a[rj + j];
		else {
			let d = a[rj + j];
			for (let k = 0; k < j; k++) d -= a[rj + k] * a[rj + k];
			// `!(d > tol)` also catches NaN, so a NaN entry can never leak into a solution.
			if (!(d > tol)) return false;
			ljj = Math.sqrt(d);
			a[rj + j] = ljj;
		}
		const inv = 1 / ljj;
		for (let i = j < from ? from : j + 1; i < n; i++) {
			const ri = i * n;
			// s − Σ_{k<j} L_ik·L_jk, each product subtracted in turn in ascending k — the plain loop's arithmetic,
			// so its bits — four terms a pass (about 15 % faster in V8 at n ≈ 32: fewer loop tests and bounds
			// checks). Written out here, not in a helper: V8 did not always inline one. JavaScript never fuses a
			// multiply and an add.
			let s = a[ri + j];
			let k = 0;
			for (const end = j - 3; k < end; k += 4) {
				s -= a[ri + k] * a[rj + k];
				s -= a[ri + k + 1] * a[rj + k + 1];
				s -= a[ri + k + 2] * a[rj + k + 2];
				s -= a[ri + k + 3] * a[rj + k + 3];
			}
			for (; k < j; k++) s -= a[ri + k] * a[rj + k];
			a[ri + j] = s * inv;
		}
	}
	return true;
}

/**
 * Solves L·Lᵀ·x = b with the factor left in `l` by choleskyFactor (forward then back substitution).
 * Writes x into `x` (which may be `b` itself) and returns it. Does not mutate `l`.
 * @throws {RangeError} if a buffer is smaller than its size requires
 */
export function choleskySolve(l: Float64Array, n: number, b: Float64Array, x: Float64Array = new Float64Array(n)): Float64Array {
	if (l.length < n * n || b.length < n || x.length < n) throw new RangeError('buffer too small');
	for (let i = 0; i < n; i++) {
		const ri = i * n;
		// b_i − Σ_{k<i} l_ik·x_k, term by term in ascending k, four a pass (as in choleskyFactor).
		let s = b[i];
		let k = 0;
		for (const end = i - 3; k < end; k += 4) {
			s -= l[ri + k] * x[k];
			s -= l[ri + k + 1] * x[k + 1];
			s -= l[ri + k + 2] * x[k + 2];
			s -= l[ri + k + 3] * x[k + 3];
		}
		for (; k < i; k++) s -= l[ri + k] * x[k];
		x[i] = s / l[ri + i];
	}
	for (let i = n - 1; i >= 0; i--) {
		// x_i − Σ_{k>i} l_ki·x_k, term by term in ascending k, four a pass, down a column of l.
		let s = x[i];
		let k = i + 1;
		let c = k * n + i;
		for (const end = n - 3; k < end; k += 4, c += 4 * n) {
			s -= l[c] * x[k];
			s -= l[c + n] * x[k + 1];
			s -= l[c + 2 * n] * x[k + 2];
			s -= l[c + 3 * n] * x[k + 3];
		}
		for (; k < n; k++, c += n) s -= l[c] * x[k];
		x[i] = s / l[i * n + i];
	}
	return x;
}

