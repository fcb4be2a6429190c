import seedrandom from 'seedrandom';
import { inverseNormalCdf } from '../distribution/normal';
import { backTransform } from '../distribution/normal-score';
import { normalisedCoordinates } from '../search/search-ellipsoid';
import { ActiveBuckets } from '../search/active-buckets';
import { selectNearest } from '../search/select-nearest';
import { prepareSimulation } from './prepare-simulation';
import { trendValue } from './trend';
import type { PreparedDomain, PreparedSimulation } from './prepare-simulation';
import { multigridLevel, multigridPath } from './multigrid-path';
import { signatureHash } from './solution-cache';
import { KrigingSystem } from './kriging-system';
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
 * the target's domain is −1). Domain by domain, a seeded random path (or a multiple-grid path, see
 * multigridPath) visits the domain's targets; at each
 * the nearest conditioning data (≤ maxData, ≤ maxPerSounding from one sounding) and previously simulated
 * nodes (≤ maxSimulated) inside the search ellipsoid, ranked by the ellipsoid's normalised (anisotropic)
 * distance, enter a simple or ordinary kriging system (covariances as TabulatedCovariance evaluates them);
 * the node gets estimate + √variance·N(0,1), drawn by
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
	return simulatePrepared(prepareSimulation(input, targets, { keepPerTarget: false }), realization, onProgress);
}

/**
 * Counters a caller may pass to simulatePrepared (benchmarks): kriging systems (one per simulated node), their
 * total size, and how many took a solution already solved for the same neighbourhood signature.
 */
export interface SimulationStats {
	systems: number;
	neighbours: number;
	reused: number;
}

/**
 * simulate() for a prepared input: the same bits, without repeating the preparation for each realization.
 * Fills the prepared simulation's caches (never changing a result); adds to `stats` if given.
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
	// Lattice mode: one bit per cell, set once the domain being simulated has a node there (cleared between
	// domains). The template walk reads it at scattered cells: a bit a cell keeps it in the processor's caches.
	const ready = prep.lattice ? new Uint8Array((prep.lattice.cell.length + 7) >> 3) : null;
	// ...and the simulated value by cell, so a neighbour's value is one read near the others, not two.
	const yCell = prep.lattice ? new Float64Array(prep.lattice.cell.length) : null;
	const progress = { done: 0, total: prep.active, step: Math.max(1, Math.floor(prep.active / 100)), next: 0, cb: onProgress };
	progress.next = progress.step;
	const counters = stats ?? { systems: 0, neighbours: 0, reused: 0 };
	for (const dom of prep.domains) {
		if (ready) ready.fill(0);
		simulateDomain(prep, dom, realization, out, y, state, ready, yCell, progress, counters);
	}
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
	ready: Uint8Array | null,
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

	// The path as positions in dom.pathNodes (the same permutation as of the nodes themselves), so per-node
	// kept results (the data search) are found by position.
	const nodes = dom.pathNodes;
	const mg = dom.multigrid;
	let path: Int32Array;
	if (mg) path = multigridPath(identity(nodes.length), mg.level, rand);
	else {
		path = identity(nodes.length);
		// Fisher–Yates shuffle (Knuth 1997, TAOCP vol. 2, alg. 3.4.2 P).
		for (let i = path.length - 1; i > 0; i--) {
			const j = Math.floor(rand() * (i + 1));
			const tmp = path[i];
			path[i] = path[j];
			path[j] = tmp;
		}
	}

	// Off the lattice: the domain's simulated nodes by bucket, and each path node's index among the domain's
	// targets (both lists ascend, the path's being the targets without a datum).
	const active = dom.nodeGrid ? new ActiveBuckets(dom.nodeGrid) : null;
	let localOf: Int32Array | null = null;
	if (active) {
		localOf = new Int32Array(nodes.length);
		for (let p = 0, t = 0; p < nodes.length; p++) {
			while (dom.targets[t] !== nodes[p]) t++;
			localOf[p] = t;
		}
	}

	const { sill, mean, ordinary, maxData, maxSimulated } = dom;
	const kmax = maxData + maxSimulated;
	const ncand = Math.max(dom.nd, dom.nodeGrid ? dom.nodeGrid.size : 0, 1);
	const candIdx = new Int32Array(ncand);
	const candD2 = new Float64Array(ncand);
	const selIdx = new Int32Array(Math.max(kmax, 1));
	const selD2 = new Float64Array(Math.max(kmax, 1));
	const pv = new Float64Array(kmax);
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
	// Reuse needs every entry's covariances from the table: then the signature fixes the system.
	const cache = table !== null ? prep.cache : null;
	// On a random path a neighbourhood repeats only once the lattice around it is nearly full: the first 70 % of the
	// path neither looks up nor stores (which would only crowd the cache).
	const reuseFrom = mg ? 0 : Math.floor(RANDOM_PATH_REUSE_FROM * path.length);
	// Share of hits among the recent lookups (a running mean over about 64): while it stays below MIN_HIT_RATE, only
	// one system in 16 is looked up and stored, enough to notice when neighbourhoods start to repeat.
	let hitRate = 1;
	const key = new Int32Array(kmax);
	const dataSel = dom.dataSelection;
	const selStride = maxData + 1;
	// The system's entries are filled here and built and solved by `sys` (see KrigingSystem).
	const sys = new KrigingSystem(dom, centre, prep.parts);
	const { px, py, pz, tp, pid, w } = sys;
	for (let step = 0; step < path.length; step++) {
		const pos = path[step];
		const g = nodes[pos];
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
		px[kmax] = x0;
		py[kmax] = y0;
		pz[kmax] = z0;
		let k = 0;
		let kd = 0;
		let off = 0;
		if (useData) {
			// The data search depends on the target alone: kept from an earlier realization when there is room
			// (copied back into selIdx, so the loop below reads one kind of array whichever way it came).
			if (dataSel !== null) {
				const so = pos * selStride;
				if (dataSel[so] === 0xffff) {
					const m = dom.dataGrid.query(q[0], q[1], q[2], candIdx, candD2);
					const n = selectNearest(candIdx, candD2, m, maxData, selIdx, selD2, dom.dgroup, dom.maxPerSounding);
					for (let s = 0; s < n; s++) dataSel[so + 1 + s] = selIdx[s];
					dataSel[so] = n;
				}
				kd = dataSel[so];
				for (let s = 0; s < kd; s++) selIdx[s] = dataSel[so + 1 + s];
			} else {
				const m = dom.dataGrid.query(q[0], q[1], q[2], candIdx, candD2);
				kd = selectNearest(candIdx, candD2, m, maxData, selIdx, selD2, dom.dgroup, dom.maxPerSounding);
			}
			for (let s = 0; s < kd; s++) {
				const i = selIdx[s];
				px[k] = dom.dx[i];
				py[k] = dom.dy[i];
				pz[k] = dom.dz[i];
				pv[k] = dom.dval[i];
				tp[k] = table !== null && dom.donlat[i] === 1 ? dom.dlat[3 * i] * sx + dom.dlat[3 * i + 1] * sy + dom.dlat[3 * i + 2] : -1;
				pid[k] = i;
				if (tp[k] < 0) off++;
				k++;
			}
		}
		if (useNodes) {
			if (tmpl !== null) {
				const offs = tmpl.offsets;
				const cellOfs = dom.templateCells!;
				const c0 = lat!.cellOf[g];
				// Away from the lattice's faces every offset of the template lands inside it: no bounds checks.
				const inside = gi >= ex && gi < cx - ex && gj >= ey && gj < cy - ey && gk >= ez && gk < cz - ez;
				// On a coarse level of a multiple-grid path only that level's grid can hold simulated nodes: walk
				// its entries alone (the same nodes in the same order as the whole template, found sooner).
				const lv = mg ? multigridLevel(mg.strides, gi, gj, gk) : 0;
				const list = lv > 0 ? mg!.entries[lv] : null;
				const ne = list ? list.length : tmpl.count;
				let found = 0;
				for (let n = 0; n < ne && found < maxSimulated; n++) {
					const e = list ? list[n] : n;
					let c: number;
					if (inside) c = c0 + cellOfs[e];
					else {
						const ii = gi + offs[3 * e];
						const jj = gj + offs[3 * e + 1];
						const kk = gk + offs[3 * e + 2];
						if (ii < 0 || ii >= cx || jj < 0 || jj >= cy || kk < 0 || kk >= cz) continue;
						c = (kk * cy + jj) * cx + ii;
					}
					if ((ready![c >> 3] & (1 << (c & 7))) === 0) continue;
					const ii = gi + offs[3 * e];
					const jj = gj + offs[3 * e + 1];
					const kk = gk + offs[3 * e + 2];
					// Lattice coordinates, not the target columns: arithmetic instead of scattered reads.
					px[k] = lox + ii * ldx;
					py[k] = loy + jj * ldy;
					pz[k] = loz + kk * ldz;
					pv[k] = yCell![c];
					tp[k] = table !== null ? ii * sx + jj * sy + kk : -1;
					pid[k] = -1;
					k++;
					found++;
				}
			} else {
				// The domain's simulated nodes near q, found outward from q's bucket: a superset of the nearest
				// maxSimulated within the ellipsoid, so the choice is the one from all of them (ActiveBuckets).
				const m = active!.candidates(q[0], q[1], q[2], maxSimulated, candIdx, candD2);
				const kn = selectNearest(candIdx, candD2, m, maxSimulated, selIdx, selD2);
				for (let s = 0; s < kn; s++) {
					const h = dom.targets[selIdx[s]];
					px[k] = X[h];
					py[k] = Y[h];
					pz[k] = Z[h];
					pv[k] = y[h];
					tp[k] = -1;
					pid[k] = -1;
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
			// The signature: every entry's lattice offset from the target, in system order.
			let slot = -1;
			let hash = 0;
			let reusable = cache !== null && step >= reuseFrom && (hitRate >= MIN_HIT_RATE || (step & 15) === 0);
			if (reusable) {
				for (let p = 0; p < k; p++) {
					if (tp[p] < 0) {
						reusable = false;
						break;
					}
					key[p] = tp[p] - tq;
				}
				if (reusable) {
					hash = signatureHash(d, k, key);
					slot = cache!.find(d, k, key, hash);
					hitRate += ((slot >= 0 ? 1 : 0) - hitRate) / 64;
				}
			}
			// Weights (simple kriging) or λ (ordinary kriging), and where they are.
			let wts: Float64Array = w;
			let at = 0;
			if (slot >= 0) {
				wts = cache!.values();
				at = cache!.valueOffset(slot);
				variance = wts[at + cache!.width];
				stats.reused++;
			} else {
				variance = sys.solve(k, kd, off, tq, g, pos);
				if (reusable) cache!.store(d, k, key, hash, w, variance);
			}
			if (!ordinary) {
				for (let p = 0; p < k; p++) est += wts[at + p] * (pv[p] - mean);
			} else {
				est = 0;
				for (let p = 0; p < k; p++) est += wts[at + p] * pv[p];
			}
		}
		y[g] = est + Math.sqrt(variance) * zdev;
		state[g] = 1;
		if (active) active.add(localOf![pos]);
		if (ready) {
			ready[gc >> 3] |= 1 << (gc & 7);
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


/**
 * Share of a random path after which solved systems are looked up and stored. Measured (section and block of the
 * benchmark, three realizations): of the systems in each tenth of the path, 0–2 % found their solution kept in the
 * first seven tenths, 11 %, 43 % and 87 % in the last three on the section, 3 % and 30 % in the last two on the
 * block; looking up and storing cost some 15 % of a realization, so the early ones cost more than they saved.
 */
const RANDOM_PATH_REUSE_FROM = 0.7;

/**
 * Below this share of hits among recent lookups, only one system in 16 is looked up (see hitRate in
 * simulateDomain). Measured on a 60 × 60 × 60 block with 9 soundings, where every system holds data and few repeat:
 * a realization 5 % faster on the multiple-grid path and 10 % on the random one, and 12 % on the benchmark's section
 * (random path), whose early lookups miss; the section's multiple-grid path, which hits 70–95 %, is unchanged.
 */
const MIN_HIT_RATE = 0.02;

function identity(n: number): Int32Array {
	const out = new Int32Array(n);
	for (let i = 0; i < n; i++) out[i] = i;
	return out;
}
