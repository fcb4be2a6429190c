// Exact Gaussian simulation by Cholesky decomposition of the covariance matrix (Davis 1987, Mathematical
// Geology 19(2)), with ml-matrix as the reference factorisation. For small reference fields in tests only.
import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import seedrandom from 'seedrandom';
import { covariance, type VariogramModel } from '../../../src/lib/geostat/index';

export interface Point {
	x: number;
	y: number;
	z: number;
}

/** `count` independent realizations of a zero-mean Gaussian field with the model's covariance at the points. */
export function choleskyFields(points: Point[], model: VariogramModel, count: number, seed: string): Float64Array[] {
	const n = points.length;
	const c = new Matrix(n, n);
	for (let i = 0; i < n; i++) {
		for (let j = 0; j <= i; j++) {
			const p = points[i];
			const q = points[j];
			const v = covariance(model, p.x - q.x, p.y - q.y, p.z - q.z);
			c.set(i, j, v);
			c.set(j, i, v);
		}
	}
	const chol = new CholeskyDecomposition(c);
	if (!chol.isPositiveDefinite()) throw new Error('covariance matrix is not positive definite');
	const l = chol.lowerTriangularMatrix;
	const rng = seedrandom(seed);
	const normal = () => {
		// Box–Muller; 1 − u keeps the logarithm finite.
		const u = 1 - rng();
		const v = rng();
		return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
	};
	const out: Float64Array[] = [];
	for (let r = 0; r < count; r++) {
		const e = Float64Array.from({ length: n }, normal);
		const f = new Float64Array(n);
		for (let i = 0; i < n; i++) {
			let s = 0;
			for (let k = 0; k <= i; k++) s += l.get(i, k) * e[k];
			f[i] = s;
		}
		out.push(f);
	}
	return out;
}
