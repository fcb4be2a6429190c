import type { TargetPoints } from '../simulation/types';
import type { TargetDefinition } from './schema';

/**
 * Expands a recipe's target definition into target points. A grid's point (i, j, k) is
 * origin + index·spacing per axis, a rectilinear grid's (x[i], y[j], z[k]) as listed (no arithmetic), both
 * with x fastest, then y, then z; domains follow the run-length list in that order. The grid's arithmetic is
 * fixed (one multiply and one add per coordinate) because the coordinates feed every realization bit for bit.
 * @throws {RangeError} if the domain runs do not cover the grid or point columns differ in length
 */
export function targetsFromDefinition(def: TargetDefinition): TargetPoints {
	if (def.kind === 'points') {
		const n = def.x.length;
		if (def.y.length !== n || def.z.length !== n || def.domain.length !== n) throw new RangeError('point columns must have equal lengths');
		// Typed columns (a recipe passed between threads) are used as they are: the engine never writes to its targets.
		const f64 = (a: ArrayLike<number>) => (a instanceof Float64Array ? a : Float64Array.from(a));
		return { x: f64(def.x), y: f64(def.y), z: f64(def.z), domain: def.domain instanceof Int32Array ? def.domain : Int32Array.from(def.domain) };
	}
	if (def.kind === 'rectilinear') {
		const [nx, ny, nz] = [def.x.length, def.y.length, def.z.length];
		const n = nx * ny * nz;
		const x = new Float64Array(n);
		const y = new Float64Array(n);
		const z = new Float64Array(n);
		const domain = expandRuns(def.domainRuns, n);
		let p = 0;
		for (let k = 0; k < nz; k++) {
			for (let j = 0; j < ny; j++) {
				for (let i = 0; i < nx; i++) {
					x[p] = def.x[i];
					y[p] = def.y[j];
					z[p] = def.z[k];
					p++;
				}
			}
		}
		return { x, y, z, domain };
	}
	const { origin, spacing, counts } = def;
	const n = counts.x * counts.y * counts.z;
	const x = new Float64Array(n);
	const y = new Float64Array(n);
	const z = new Float64Array(n);
	const domain = expandRuns(def.domainRuns, n);
	let p = 0;
	for (let k = 0; k < counts.z; k++) {
		const zk = origin.z + k * spacing.z;
		for (let j = 0; j < counts.y; j++) {
			const yj = origin.y + j * spacing.y;
			for (let i = 0; i < counts.x; i++) {
				x[p] = origin.x + i * spacing.x;
				y[p] = yj;
				z[p] = zk;
				p++;
			}
		}
	}
	return { x, y, z, domain };
}

function expandRuns(runs: [number, number][], n: number): Int32Array {
	const domain = new Int32Array(n);
	let p = 0;
	for (const [d, len] of runs) {
		if (p + len > n) throw new RangeError('domain runs must cover the grid');
		domain.fill(d, p, p + len);
		p += len;
	}
	if (p !== n) throw new RangeError('domain runs must cover the grid');
	return domain;
}
