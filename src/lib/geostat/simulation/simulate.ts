import seedrandom from 'seedrandom';
import { inverseNormalCdf } from '../distribution/normal';
import { backTransform } from '../distribution/normal-score';
import { prepareSimulation } from './prepare-simulation';
import { trendValue } from './trend';
import type { PreparedDomain, PreparedSimulation } from './prepare-simulation';
import { multigridPath } from './multigrid-path';
import { DomainWalk } from './domain-walk';
import type { SimulationInput, TargetPoints } from './types';

/**
 * The random stream of realization r of domain d: Alea (Baagøe 2010, as shipped by seedrandom) seeded with
 * "seed:r:d". It depends only on (seed, r, d) — never on other realizations or domains — and Alea is pure
 * double arithmetic, so it repeats bit for bit in every JavaScript engine.
 */
export function realizationStream(seed: string, realization: number, domain: number): () => number {
	return aleaStream(`${seed}:${realization}:${domain}`);
}

/** Doubles in [0, 1) from Alea seeded with `key`. */
function aleaStream(key: string): () => number {
	const prng = seedrandom.alea(key);
	return () => prng.double();
}

/**
 * Sequential Gaussian simulation (Deutsch & Journel 1998, ch. V.2.3; Goovaerts 1997, ch. 8; Isaaks 1990):
 * one conditional realization of every domain's field at the target points, in original units (NaN where
 * the target's domain is −1). Domain by domain, a seeded random path (or a multiple-grid path, see
 * multigridPath; either drawn afresh for each realization, or constant, see SearchOptions.path) visits the
 * domain's targets; at each
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
 * Counters a caller may pass to simulatePrepared (benchmarks): kriging systems (one per simulated node that was not
 * replayed), their total size, how many took a solution already solved for the same neighbourhood signature, and
 * the nodes replayed from a constant path's plan (see PathPlan) instead.
 */
export interface SimulationStats {
	systems: number;
	neighbours: number;
	reused: number;
	replayed: number;
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
	const counters = stats ?? { systems: 0, neighbours: 0, reused: 0, replayed: 0 };
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
	// kept results (the data search) are found by position. A constant path comes from a stream of its own and
	// is the same in every realization; the realization's stream then draws the deviates alone.
	const nodes = dom.pathNodes;
	const plan = dom.plan;
	let path: Int32Array;
	if (!dom.constantPath) path = domainPath(dom, rand);
	else if (plan !== null && plan.path !== null) path = plan.path;
	else {
		path = domainPath(dom, pathStream(prep.seed, d));
		if (plan !== null) plan.path = path;
	}

	// Off the lattice: each path node's index among the domain's targets (both lists ascend, the path's being the
	// targets without a datum), for the domain's simulated nodes by bucket (see DomainWalk).
	let localOf: Int32Array | null = null;
	if (dom.nodeGrid) {
		localOf = new Int32Array(nodes.length);
		for (let p = 0, t = 0; p < nodes.length; p++) {
			while (dom.targets[t] !== nodes[p]) t++;
			localOf[p] = t;
		}
	}

	const walk = new DomainWalk(prep, dom, y, state, ready, yCell, stats, localOf, path.length);
	// Steps a constant path's plan already holds are replayed (the same bits as solving them again).
	const replay = plan !== null ? plan.recorded : 0;
	for (let step = 0; step < path.length; step++) {
		let uu = rand();
		// Φ⁻¹(0) is −∞; a zero from a 53-bit uniform (chance 2⁻⁵³) is nudged to the smallest step.
		if (uu === 0) uu = 1.1102230246251565e-16;
		if (step < replay) walk.replay(path[step], step, inverseNormalCdf(uu));
		else walk.node(path[step], step, inverseNormalCdf(uu));
		if (++progress.done >= progress.next) {
			progress.next += progress.step;
			if (progress.cb) progress.cb(progress.done, progress.total);
		}
	}

	stats.replayed += replay;

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
 * The stream a domain's constant path is drawn from: Alea seeded with "seed:path:d", apart from every
 * realization's stream ("seed:r:d" with r a number).
 */
export function pathStream(seed: string, domain: number): () => number {
	return aleaStream(`${seed}:path:${domain}`);
}

/** A domain's path (positions in its pathNodes) drawn from `rand`: multiple-grid or random. */
function domainPath(dom: PreparedDomain, rand: () => number): Int32Array {
	const n = dom.pathNodes.length;
	const mg = dom.multigrid;
	if (mg) return multigridPath(identity(n), mg.level, rand);
	const path = identity(n);
	// Fisher–Yates shuffle (Knuth 1997, TAOCP vol. 2, alg. 3.4.2 P).
	for (let i = path.length - 1; i > 0; i--) {
		const j = Math.floor(rand() * (i + 1));
		const tmp = path[i];
		path[i] = path[j];
		path[j] = tmp;
	}
	return path;
}

function identity(n: number): Int32Array {
	const out = new Int32Array(n);
	for (let i = 0; i < n; i++) out[i] = i;
	return out;
}
