import seedrandom from 'seedrandom';
import { inverseNormalCdf } from '../distribution/normal';
import { backTransform } from '../distribution/normal-score';
import { normalisedCoordinates } from '../search/search-ellipsoid';
import { selectNearest } from '../search/select-nearest';
import { choleskyFactor, choleskySolve } from '../linalg/cholesky';
import { prepareSimulation } from './prepare-simulation';
import { trendValue } from './trend';
import type { PreparedDomain, PreparedSimulation } from './prepare-simulation';
import type { SimulationInput, TargetPoints } from './types';

/**
 * The random stream of realization r of domain d: Alea (Baagøe 2010, as shipped by seedrandom) seeded with
 * "seed:r:d". It depends only on (seed, r, d) — never on other realizations or domains — and Alea is pure
 * double arithmetic, so it repeats bit for bit in every JavaScript engine.
 */
export function realizationStream(seed: string, realization: number, domain: number): () => number {
	const prng = seedrandom.alea(`${seed}:${realization}:${domain}`);
	return () => prng.double();
}

/**
 * Sequential Gaussian simulation (Deutsch & Journel 1998, ch. V.2.3; Goovaerts 1997, ch. 8; Isaaks 1990):
 * one conditional realization of every domain's field at the target points, in original units (NaN where
 * the target's domain is −1). Domain by domain, a seeded random path visits the domain's targets; at each
 * the nearest conditioning data (≤ maxData, ≤ maxPerSounding from one sounding) and previously simulated
 * nodes (≤ maxSimulated) inside the search ellipsoid, ranked by the ellipsoid's normalised (anisotropic)
 * distance, enter a simple or ordinary kriging system; the node gets estimate + √variance·N(0,1), drawn by
 * Φ⁻¹ of a uniform (Wichura 1988), and is back-transformed from normal scores; a domain's trend of the mean
 * (DomainInput.trend) is added back after the back-transform. Targets within
 * COINCIDENCE_TOLERANCE of a datum take the datum's value exactly. With no neighbour at all a node is drawn
 * from the simple-kriging mean and the sill (ordinary kriging too).
 *
 * Realization r depends only on (input, targets, r), so it regenerates alone, anywhere, bit for bit.
 * @throws {TypeError} {RangeError} on invalid input (see prepareSimulation)
 * @throws {Error} 'singular kriging system at target i' if a system stays singular after a tiny ridge
 */
export function simulate(
	input: SimulationInput,
	targets: TargetPoints,
	realization: number,
	onProgress?: (done: number, total: number) => void
): Float64Array {
	return simulatePrepared(prepareSimulation(input, targets), realization, onProgress);
}

/** Counters a caller may pass to simulatePrepared (benchmarks): kriging systems solved and their total size. */
export interface SimulationStats {
	systems: number;
	neighbours: number;
}

/**
 * simulate() for a prepared input: the same bits, without repeating the preparation for each realization.
 * Does not mutate the prepared simulation; adds to `stats` if given.
 * @throws {RangeError} if realization is not a non-negative safe integer
 */
export function simulatePrepared(
	prep: PreparedSimulation,
	realization: number,
	onProgress?: (done: number, total: number) => void,
	stats?: SimulationStats
): Float64Array {
	if (!Number.isSafeInteger(realization) || realization < 0) throw new RangeError('realization must be an integer >= 0');
	const n = prep.targets.domain.length;
	const out = new Float64Array(n).fill(NaN);
	const y = new Float64Array(n);
	// 0: not yet simulated, 1: simulated, 2: at a datum (its datum conditions instead, never counted twice).
	const state = new Uint8Array(n);
	// Lattice mode: per cell, 1 + the domain of a simulated node there (0: none yet). One compact array,
	// read in the template walk instead of three scattered ones.
	const ready = prep.lattice ? new Uint16Array(prep.lattice.cell.length) : null;
	// ...and the simulated value by cell, so a neighbour's value is one read near the others, not two.
	const yCell = prep.lattice ? new Float64Array(prep.lattice.cell.length) : null;
	const progress = { done: 0, total: prep.active, step: Math.max(1, Math.floor(prep.active / 100)), next: 0, cb: onProgress };
	progress.next = progress.step;
	const counters = stats ?? { systems: 0, neighbours: 0 };
	for (const dom of prep.domains) simulateDomain(prep, dom, realization, out, y, state, ready, yCell, progress, counters);
	if (onProgress) onProgress(prep.active, prep.active);
	return out;
}

interface Progress {
	done: number;
	total: number;
	step: number;
	next: number;
	cb?: (done: number, total: number) => void;
}

function simulateDomain(
	prep: PreparedSimulation,
	dom: PreparedDomain,
	realization: number,
	out: Float64Array,
	y: Float64Array,
	state: Uint8Array,
	ready: Uint16Array | null,
	yCell: Float64Array | null,
	progress: Progress,
	stats: SimulationStats
): void {
	const t = prep.targets;
	const X = t.x;
	const Y = t.y;
	const Z = t.z;
	const datumAt = prep.datumAt;
	const lat = prep.lattice;
	const d = dom.index;
	const rand = realizationStream(prep.seed, realization, d);

	for (const g of dom.targets) {
		const i = datumAt[g];
		if (i >= 0) {
			state[g] = 2;
			y[g] = dom.dval[i];
			progress.done++;
		}
	}

	const path = dom.pathNodes.slice();
	// Fisher–Yates shuffle (Knuth 1997, TAOCP vol. 2, alg. 3.4.2 P).
	for (let i = path.length - 1; i > 0; i--) {
		const j = Math.floor(rand() * (i + 1));
		const tmp = path[i];
		path[i] = path[j];
		path[j] = tmp;
	}

	const { cov, sill, mean, ordinary, maxData, maxSimulated } = dom;
	const kmax = maxData + maxSimulated;
	const ncand = Math.max(dom.nd, dom.nodeGrid ? dom.nodeGrid.size : 0, 1);
	const candIdx = new Int32Array(ncand);
	const candD2 = new Float64Array(ncand);
	const selIdx = new Int32Array(Math.max(kmax, 1));
	const selD2 = new Float64Array(Math.max(kmax, 1));
	const px = new Float64Array(kmax);
	const py = new Float64Array(kmax);
	const pz = new Float64Array(kmax);
	const pv = new Float64Array(kmax);
	const a = new Float64Array(kmax * kmax);
	const rhs = new Float64Array(kmax);
	const w = new Float64Array(kmax);
	const u1 = new Float64Array(kmax);
	const ones = new Float64Array(kmax).fill(1);
	const q = new Float64Array(3);

	const table = dom.covTable;
	const [hx, hy, hz] = dom.tableHalf;
	const sy = 2 * hz + 1;
	const sx = (2 * hy + 1) * sy;
	const centre = hx * sx + hy * sy + hz;
	const tmpl = dom.template;
	const cx = lat ? lat.counts[0] : 0;
	const cy = lat ? lat.counts[1] : 0;
	const cz = lat ? lat.counts[2] : 0;
	const [ex, ey, ez] = tmpl ? tmpl.extent : [0, 0, 0];
	const [lox, loy, loz] = lat ? lat.origin : [0, 0, 0];
	const [ldx, ldy, ldz] = lat ? lat.spacing : [1, 1, 1];
	const useData = dom.nd > 0 && maxData > 0 && !dom.ellipsoid.empty;
	const useNodes = maxSimulated > 0 && !dom.ellipsoid.empty;

	// Table position of each system entry on the lattice (−1 off it): the covariance of two entries on the
	// lattice is table[centre + tp[p] − tp[q]], always in range (see tableHalf in prepareSimulation).
	const tp = new Int32Array(kmax);
	const buildSystem = (k: number, tq: number, x0: number, y0: number, z0: number, ridge: number): void => {
		for (let p = 0; p < k; p++) {
			const tpp = tp[p];
			const xp = px[p];
			const yp = py[p];
			const zp = pz[p];
			rhs[p] = tpp >= 0 && tq >= 0 ? table![centre + tpp - tq] : cov.covariance(xp - x0, yp - y0, zp - z0);
			const row = p * k;
			if (tpp >= 0) {
				const base = centre + tpp;
				for (let r = 0; r < p; r++) {
					const tr = tp[r];
					a[row + r] = tr >= 0 ? table![base - tr] : cov.covariance(xp - px[r], yp - py[r], zp - pz[r]);
				}
			} else {
				for (let r = 0; r < p; r++) a[row + r] = cov.covariance(xp - px[r], yp - py[r], zp - pz[r]);
			}
			a[row + p] = sill * ridge;
		}
	};
	for (let step = 0; step < path.length; step++) {
		const g = path[step];
		let uu = rand();
		// Φ⁻¹(0) is −∞; a zero from a 53-bit uniform (chance 2⁻⁵³) is nudged to the smallest step.
		if (uu === 0) uu = 1.1102230246251565e-16;
		const zdev = inverseNormalCdf(uu);
		let x0: number;
		let y0: number;
		let z0: number;
		let gi = 0;
		let gj = 0;
		let gk = 0;
		let gc = -1;
		if (lat) {
			gc = lat.cellOf[g];
			gi = gc % cx;
			gj = Math.floor(gc / cx) % cy;
			gk = Math.floor(gc / (cx * cy));
			// Lattice coordinates, as for the neighbours: arithmetic instead of three scattered reads.
			x0 = lox + gi * ldx;
			y0 = loy + gj * ldy;
			z0 = loz + gk * ldz;
		} else {
			x0 = X[g];
			y0 = Y[g];
			z0 = Z[g];
		}
		normalisedCoordinates(dom.ellipsoid, x0, y0, z0, q);
		let k = 0;
		if (useData) {
			const m = dom.dataGrid.query(q[0], q[1], q[2], candIdx, candD2);
			const kd = selectNearest(candIdx, candD2, m, maxData, selIdx, selD2, dom.dgroup, dom.maxPerSounding);
			for (let s = 0; s < kd; s++) {
				const i = selIdx[s];
				px[k] = dom.dx[i];
				py[k] = dom.dy[i];
				pz[k] = dom.dz[i];
				pv[k] = dom.dval[i];
				tp[k] = table !== null && dom.donlat[i] === 1 ? dom.dlat[3 * i] * sx + dom.dlat[3 * i + 1] * sy + dom.dlat[3 * i + 2] : -1;
				k++;
			}
		}
		if (useNodes) {
			if (tmpl !== null) {
				const offs = tmpl.offsets;
				const cellOfs = dom.templateCells!;
				const c0 = lat!.cellOf[g];
				const mark = d + 1;
				// Away from the lattice's faces every offset of the template lands inside it: no bounds checks.
				const inside = gi >= ex && gi < cx - ex && gj >= ey && gj < cy - ey && gk >= ez && gk < cz - ez;
				let found = 0;
				for (let e = 0, ne = tmpl.count; e < ne && found < maxSimulated; e++) {
					let c: number;
					if (inside) c = c0 + cellOfs[e];
					else {
						const ii = gi + offs[3 * e];
						const jj = gj + offs[3 * e + 1];
						const kk = gk + offs[3 * e + 2];
						if (ii < 0 || ii >= cx || jj < 0 || jj >= cy || kk < 0 || kk >= cz) continue;
						c = (kk * cy + jj) * cx + ii;
					}
					if (ready![c] !== mark) continue;
					const ii = gi + offs[3 * e];
					const jj = gj + offs[3 * e + 1];
					const kk = gk + offs[3 * e + 2];
					// Lattice coordinates, not the target columns: arithmetic instead of scattered reads.
					px[k] = lox + ii * ldx;
					py[k] = loy + jj * ldy;
					pz[k] = loz + kk * ldz;
					pv[k] = yCell![c];
					tp[k] = table !== null ? ii * sx + jj * sy + kk : -1;
					k++;
					found++;
				}
			} else {
				const grid = dom.nodeGrid!;
				const m0 = grid.query(q[0], q[1], q[2], candIdx, candD2);
				let m = 0;
				for (let c = 0; c < m0; c++) {
					if (state[dom.targets[candIdx[c]]] === 1) {
						candIdx[m] = candIdx[c];
						candD2[m] = candD2[c];
						m++;
					}
				}
				const kn = selectNearest(candIdx, candD2, m, maxSimulated, selIdx, selD2);
				for (let s = 0; s < kn; s++) {
					const h = dom.targets[selIdx[s]];
					px[k] = X[h];
					py[k] = Y[h];
					pz[k] = Z[h];
					pv[k] = y[h];
					tp[k] = -1;
					k++;
				}
			}
		}

		let est = mean;
		let variance = sill;
		stats.systems++;
		stats.neighbours += k;
		if (k > 0) {
			const tq = table !== null ? gi * sx + gj * sy + gk : -1;
			buildSystem(k, tq, x0, y0, z0, 1);
			if (!choleskyFactor(a, k)) {
				// A tiny ridge (1e-9 of the sill) rescues systems that are singular only to rounding, e.g. a
				// Gaussian model without nugget at close points; common practice.
				buildSystem(k, tq, x0, y0, z0, 1 + 1e-9);
				if (!choleskyFactor(a, k)) throw new Error(`singular kriging system at target ${g}`);
			}
			choleskySolve(a, k, rhs, w);
			if (!ordinary) {
				for (let p = 0; p < k; p++) {
					est += w[p] * (pv[p] - mean);
					variance -= w[p] * rhs[p];
				}
			} else {
				choleskySolve(a, k, ones, u1);
				let sw = 0;
				let su = 0;
				for (let p = 0; p < k; p++) {
					sw += w[p];
					su += u1[p];
				}
				const mu = (sw - 1) / su;
				est = 0;
				variance = sill - mu;
				for (let p = 0; p < k; p++) {
					const lam = w[p] - mu * u1[p];
					est += lam * pv[p];
					variance -= lam * rhs[p];
				}
			}
			if (variance < 0) variance = 0;
		}
		y[g] = est + Math.sqrt(variance) * zdev;
		state[g] = 1;
		if (ready) {
			ready[gc] = d + 1;
			yCell![gc] = y[g];
		}
		if (++progress.done >= progress.next) {
			progress.next += progress.step;
			if (progress.cb) progress.cb(progress.done, progress.total);
		}
	}

	const tbl = dom.table;
	const trend = dom.trend;
	for (const g of dom.targets) {
		const i = datumAt[g];
		if (i >= 0) out[g] = dom.dorig[i];
		else {
			const v = tbl ? backTransform(tbl, y[g]) : y[g];
			out[g] = trend ? v + trendValue(trend, X[g], Y[g], Z[g]) : v;
		}
	}
}
