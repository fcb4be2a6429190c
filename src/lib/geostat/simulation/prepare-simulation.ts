import { validateVariogramModel } from '../variogram/model';
import { tabulatedCovariance } from '../variogram/covariance-table';
import type { TabulatedCovariance } from '../variogram/covariance-table';
import { normalScore } from '../distribution/normal-score';
import type { NormalScoreTable } from '../types';
import { searchEllipsoid, normalisedCoordinates } from '../search/search-ellipsoid';
import type { SearchEllipsoid } from '../search/search-ellipsoid';
import { BucketGrid } from '../search/bucket-grid';
import { offsetTemplate } from '../search/offset-template';
import type { OffsetTemplate } from '../search/offset-template';
import { detectLattice } from './lattice';
import type { Lattice } from './lattice';
import { multigridLevel, multigridStrides } from './multigrid-path';
import { SolutionCache } from './solution-cache';
import { PathPlan } from './path-plan';
import { PATH_ORDERS, type DomainInput, type SimulationInput, type TargetPoints } from './types';
import { trendResiduals, validateTrend, type LinearTrend } from './trend';

/**
 * Distance (in the project's length unit) within which a target and a datum, or two data, count as one
 * location: the target takes the datum's value, duplicates are merged.
 */
export const COINCIDENCE_TOLERANCE = 1e-6;

// Covariance tables beyond this many entries cost more to fill than they save.
const MAX_TABLE = 8_000_000;

/** Default memory a prepared simulation (so one worker) may keep for reuse: 64 MiB. */
export const DEFAULT_REUSE_BYTES = 64 * 1024 * 1024;

/**
 * Options of prepareSimulation; none changes a single bit of any realization.
 *
 * What is kept, in this order while the memory lasts (each domain in turn): for a domain on a constant path, its
 * plan (PathPlan: up to 12(kmax + 1) bytes a step, reserved for as many steps as fit in three quarters of the
 * memory); each target's data search
 * (maxData + 1 16-bit integers a target); the covariances between a domain's data when some are off the lattice
 * (nd² doubles, filled as used); for data off the lattice, the data part of each target's factor and right-hand
 * side, the same in every realization (maxData(maxData + 3)/2 doubles a target); for data on the lattice, the same
 * data parts by their data's lattice offsets from the target (a quarter of what is left, at most 8 MiB); and, with
 * the rest, solved kriging systems whose neighbourhood signature repeats (SolutionCache; lattice mode with
 * covariance tables only, at most two slots a target). The two caches are allocated on first use.
 */
export interface PrepareOptions {
	/** Memory for everything kept, in bytes; default DEFAULT_REUSE_BYTES. 0: nothing is kept, all is computed afresh. */
	reuseBytes?: number;
	/**
	 * Keep solved kriging systems and constant paths' plans (default true); false keeps only the data searches and
	 * parts (for measuring what reuse adds).
	 */
	reuseSolutions?: boolean;
	/**
	 * Keep each target's data search and data factor, and the plans of constant paths (default true). They pay
	 * off from the second realization on; simulate(), which runs one, sets false.
	 */
	keepPerTarget?: boolean;
}

/** One domain, ready for any number of realizations (internal layout, not part of the recipe). */
export interface PreparedDomain {
	index: number;
	cov: TabulatedCovariance;
	sill: number;
	mean: number;
	ordinary: boolean;
	table: NormalScoreTable | null;
	/** The domain's trend of the mean, added back to every simulated value; null without one. */
	trend: LinearTrend | null;
	ellipsoid: SearchEllipsoid;
	maxData: number;
	maxSimulated: number;
	maxPerSounding: number;
	/** Merged conditioning data: coordinates, kriged-space value, original-units value, sounding group. */
	nd: number;
	dx: Float64Array;
	dy: Float64Array;
	dz: Float64Array;
	dval: Float64Array;
	dorig: Float64Array;
	dgroup: Int32Array;
	dataGrid: BucketGrid;
	/** Lattice coordinates of data (3 each) and whether a datum sits on the lattice. */
	dlat: Int32Array;
	donlat: Uint8Array;
	/** Global indices of the domain's targets, ascending. */
	targets: Int32Array;
	/** Global indices of the targets that are simulated (not at a datum), ascending; shuffled per realization. */
	pathNodes: Int32Array;
	/** Lattice mode: template of offsets, the same as linear cell offsets, and the covariance table. */
	template: OffsetTemplate | null;
	templateCells: Int32Array | null;
	covTable: Float64Array | null;
	tableHalf: [number, number, number];
	/** General mode: a fine bucket grid over the domain's targets (local indices), searched nearest-first as they are simulated (ActiveBuckets). */
	nodeGrid: BucketGrid | null;
	/**
	 * Multiple-grid path (lattice mode with a template only): strides per level (see multigridStrides), the
	 * level of each path node, and per level ≥ 1 the template entries whose offsets lie on that level's grid
	 * (the only cells that can hold a simulated node while the level is visited). Null for the random path.
	 */
	multigrid: { strides: Int32Array; level: Uint8Array; entries: Int32Array[] } | null;
	/** Whether the path is constant: drawn from the seed and the domain, the same in every realization. */
	constantPath: boolean;
	/** On a constant path, the steps solved so far, replayed by later realizations (see PathPlan); null when not kept. */
	plan: PathPlan | null;
	/**
	 * Covariances between data i and j at i·nd + j, NaN until first needed (filled by the simulation; the same
	 * bits as evaluating them each time), or null when the domain has too many data to keep them.
	 */
	dataCov: Float64Array | null;
	/**
	 * The data search of each path node (by position in pathNodes), which depends on the target alone: at
	 * p·(maxData + 1) the count (0xffff until first searched), then the chosen data. Null when there is no room.
	 */
	dataSelection: Uint16Array | null;
	/**
	 * Data off the lattice (or no lattice): per path node, the first kd rows of its system's Cholesky factor
	 * (packed lower triangle) and of its right-hand side, which do not change between realizations; kept once
	 * `dataFactorReady` is 1. Null when there is no room or the data come from the covariance table.
	 */
	dataFactor: Float64Array | null;
	dataFactorReady: Uint8Array | null;
}

/** A simulation prepared once and realized many times (see simulatePrepared). */
export interface PreparedSimulation {
	seed: string;
	targets: TargetPoints;
	lattice: Lattice | null;
	/** Datum index (within its domain) at each target, −1 elsewhere. */
	datumAt: Int32Array;
	domains: PreparedDomain[];
	/** Number of targets with a domain. */
	active: number;
	/** Solved systems kept for reuse (lattice mode with covariance tables), or null. Never changes a result. */
	cache: SolutionCache | null;
	/**
	 * Data parts of kriging systems (the first kd rows of the factor and of the right-hand side, see KrigingSystem)
	 * kept by their data's lattice offsets from the target, for data on the lattice of a domain with a covariance
	 * table; null when nothing is kept. Never changes a result.
	 */
	parts: SolutionCache | null;
}

/**
 * Validates a simulation input against its targets and prepares everything that does not depend on the
 * realization: normal-score transforms (Deutsch & Journel 1998, ch. V), merged data, search structures,
 * the lattice with its offset template and covariance table, the multiple-grid levels, and a cache for reusing
 * solved kriging systems (see PrepareOptions). Does not mutate its inputs (targets are kept by reference); the
 * prepared simulation's caches fill as realizations run, without changing any result.
 * @throws {TypeError} on malformed input
 * @throws {RangeError} on bad sizes, non-finite numbers, domain indices out of range, or a normal-score
 *   domain without samples
 */
export function prepareSimulation(input: SimulationInput, targets: TargetPoints, options: PrepareOptions = {}): PreparedSimulation {
	const { reuseBytes = DEFAULT_REUSE_BYTES, reuseSolutions = true, keepPerTarget = true } = options;
	if (!(reuseBytes >= 0)) throw new RangeError('reuseBytes must be >= 0');
	if (input === null || typeof input !== 'object') throw new TypeError('input must be an object');
	if (typeof input.seed !== 'string') throw new TypeError('seed must be a string');
	if (!Array.isArray(input.domains)) throw new TypeError('domains must be an array');
	checkTargets(targets, input.domains.length);
	const n = targets.domain.length;
	let active = 0;
	for (let i = 0; i < n; i++) if (targets.domain[i] >= 0) active++;
	const lattice = detectLattice(targets);
	const datumAt = new Int32Array(n).fill(-1);
	const domains = input.domains.map((d, index) => prepareDomain(d, index, targets, lattice, datumAt));
	const left = keepDataParts(domains, keepPlans(domains, reuseBytes, keepPerTarget && reuseSolutions), keepPerTarget);
	const parts = dataPartCache(domains, left);
	const rest = left - (parts ? parts.bytes : 0);
	return { seed: input.seed, targets, lattice, datumAt, domains, active, cache: reuseSolutions ? solutionCache(domains, rest) : null, parts };
}

/**
 * Allocates the plans of domains on a constant path (see PathPlan) within three quarters of `bytes`, each as many
 * steps as fit (the whole path when it can); returns the bytes left. A plan saves nearly all of a step's work in
 * every realization after the first, so it comes before everything else that is kept; the last quarter stays for
 * the caches the first realization (and the steps a plan cannot hold) work with.
 */
function keepPlans(domains: PreparedDomain[], bytes: number, perTarget: boolean): number {
	if (!perTarget) return bytes;
	let left = Math.floor((3 * bytes) / 4);
	for (const d of domains) {
		if (!d.constantPath || d.pathNodes.length === 0) continue;
		const kmax = d.maxData + d.maxSimulated;
		const steps = Math.min(d.pathNodes.length, Math.floor((left - 4) / PathPlan.bytesPerStep(kmax)));
		if (steps < 1) continue;
		d.plan = new PathPlan(steps, kmax);
		left -= PathPlan.bytes(steps, kmax);
	}
	return bytes - Math.floor((3 * bytes) / 4) + left;
}

/** Allocates the kept data parts (see PrepareOptions) within `bytes`; returns the bytes left. */
function keepDataParts(domains: PreparedDomain[], bytes: number, perTarget: boolean): number {
	const withData = domains.filter((d) => d.nd > 0 && d.maxData > 0 && !d.ellipsoid.empty);
	// Off the lattice (or without a covariance table) data covariances are evaluated, not read from the table.
	const offLattice = (d: PreparedDomain) => d.covTable === null || d.donlat.includes(0);
	let left = bytes;
	for (const d of withData) {
		const size = d.pathNodes.length * (d.maxData + 1);
		if (perTarget && d.nd < 0xffff && d.maxData < 0xffff && 2 * size <= left) {
			d.dataSelection = new Uint16Array(size).fill(0xffff);
			left -= 2 * size;
		}
	}
	for (const d of withData) {
		if (d.nd > 1 && offLattice(d) && 8 * d.nd * d.nd <= left) {
			d.dataCov = new Float64Array(d.nd * d.nd).fill(NaN);
			left -= 8 * d.nd * d.nd;
		}
	}
	for (const d of withData) {
		const size = ((d.maxData * (d.maxData + 3)) / 2) * d.pathNodes.length;
		if (perTarget && offLattice(d) && 8 * size + d.pathNodes.length <= left) {
			d.dataFactor = new Float64Array(size);
			d.dataFactorReady = new Uint8Array(d.pathNodes.length);
			left -= 8 * size + d.pathNodes.length;
		}
	}
	return left;
}

// Memory for data parts kept by offsets: a quarter of what is left, at most this much (1.3 kB a slot at maxData 16:
// 6,400 data signatures; a signature repeats wherever the data sit alike around targets, as along a lattice).
const MAX_PART_BYTES = 8 * 1024 * 1024;

/**
 * The cache of data parts by offsets (see PreparedSimulation.parts): for domains with data and a covariance table,
 * a quarter of `bytes` (at most MAX_PART_BYTES, at most two slots a path node).
 */
function dataPartCache(domains: PreparedDomain[], bytes: number): SolutionCache | null {
	let maxData = 0;
	let nodes = 0;
	for (const d of domains) {
		if (d.covTable === null || d.nd === 0 || d.maxData === 0 || d.ellipsoid.empty) continue;
		maxData = Math.max(maxData, d.maxData);
		nodes += d.pathNodes.length;
	}
	if (maxData === 0) return null;
	return cacheWithin(Math.min(bytes / 4, MAX_PART_BYTES), maxData, (maxData * (maxData + 3)) / 2, nodes);
}

/** The solution cache: for domains with a covariance table, sized to the budget and the number of path nodes. */
function solutionCache(domains: PreparedDomain[], bytes: number): SolutionCache | null {
	let kmax = 0;
	let nodes = 0;
	for (const d of domains) {
		if (d.covTable === null) continue;
		kmax = Math.max(kmax, d.maxData + d.maxSimulated);
		nodes += d.pathNodes.length;
	}
	if (kmax === 0) return null;
	return cacheWithin(bytes, kmax, kmax, nodes);
}

/** A SolutionCache of `width` doubles a slot within `bytes`, at most two slots a path node; null if two do not fit. */
function cacheWithin(bytes: number, kmax: number, width: number, nodes: number): SolutionCache | null {
	const slots = Math.min(Math.floor(bytes / SolutionCache.bytesPerSlot(kmax, width)), 2 * nodes + 2);
	return slots >= 2 ? new SolutionCache(kmax, slots, width) : null;
}

function checkTargets(t: TargetPoints, nDomains: number): void {
	if (t === null || typeof t !== 'object') throw new TypeError('targets must be an object');
	if (!(t.x instanceof Float64Array) || !(t.y instanceof Float64Array) || !(t.z instanceof Float64Array)) {
		throw new TypeError('target coordinates must be Float64Arrays');
	}
	if (!(t.domain instanceof Int32Array)) throw new TypeError('target domains must be an Int32Array');
	const n = t.domain.length;
	if (t.x.length !== n || t.y.length !== n || t.z.length !== n) throw new RangeError('target columns must have equal lengths');
	for (let i = 0; i < n; i++) {
		const d = t.domain[i];
		if (d < -1 || d >= nDomains) throw new RangeError(`target ${i} has domain ${d} out of range`);
		if (d >= 0 && !(Number.isFinite(t.x[i]) && Number.isFinite(t.y[i]) && Number.isFinite(t.z[i]))) {
			throw new RangeError('target coordinates must be finite');
		}
	}
}

function checkDomain(d: DomainInput): void {
	if (d === null || typeof d !== 'object') throw new TypeError('domain must be an object');
	if (!Array.isArray(d.samples)) throw new TypeError('samples must be an array');
	for (const s of d.samples) {
		if (s === null || typeof s !== 'object') throw new TypeError('samples must be objects');
		if (![s.x, s.y, s.z, s.value].every((v) => typeof v === 'number' && Number.isFinite(v))) {
			throw new RangeError('sample coordinates and values must be finite');
		}
	}
	if (d.weights !== undefined && (!Array.isArray(d.weights) || d.weights.length !== d.samples.length)) {
		throw new RangeError('weights must match samples');
	}
	validateVariogramModel(d.model);
	if (d.transform !== 'normal-score' && d.transform !== 'none') throw new TypeError("transform must be 'normal-score' or 'none'");
	if (d.kriging !== 'simple' && d.kriging !== 'ordinary') throw new TypeError("kriging must be 'simple' or 'ordinary'");
	if (d.mean !== undefined && !Number.isFinite(d.mean)) throw new RangeError('mean must be finite');
	const s = d.search;
	if (s === null || typeof s !== 'object') throw new TypeError('search must be an object');
	if (!Number.isInteger(s.maxData) || s.maxData < 0) throw new RangeError('maxData must be an integer >= 0');
	if (!Number.isInteger(s.maxSimulated) || s.maxSimulated < 0) throw new RangeError('maxSimulated must be an integer >= 0');
	if (s.maxPerSounding !== undefined && (!Number.isInteger(s.maxPerSounding) || s.maxPerSounding < 1)) {
		throw new RangeError('maxPerSounding must be an integer >= 1');
	}
	if (s.path !== undefined && !(PATH_ORDERS as readonly string[]).includes(s.path)) throw new TypeError(`path must be one of ${PATH_ORDERS.join(', ')}`);
	if (d.transform === 'normal-score' && d.samples.length === 0) throw new RangeError('a normal-score domain needs samples');
	if (d.trend !== undefined) validateTrend(d.trend);
}

function prepareDomain(
	d: DomainInput,
	index: number,
	t: TargetPoints,
	lattice: Lattice | null,
	datumAt: Int32Array
): PreparedDomain {
	checkDomain(d);
	const cov = tabulatedCovariance(d.model);
	const ellipsoid = searchEllipsoid(d.model, d.search.radius);
	// With a trend the kriged space is that of the residuals (Goovaerts 1997, ch. 8: simulate residuals, add the trend back).
	let kvals = d.trend ? trendResiduals(d.samples, d.trend) : d.samples.map((s) => s.value);
	let table: NormalScoreTable | null = null;
	if (d.transform === 'normal-score') {
		const ns = normalScore(kvals, d.weights, { zmin: d.zmin, zmax: d.zmax });
		kvals = Array.from(ns.scores);
		table = ns.table;
	}
	const merged = mergeData(d, kvals);
	const nd = merged.dx.length;
	const norm = new Float64Array(3 * nd);
	for (let i = 0; i < nd; i++) normalisedCoordinates(ellipsoid, merged.dx[i], merged.dy[i], merged.dz[i], norm, 3 * i);
	const dataGrid = new BucketGrid(norm);

	const dlat = new Int32Array(3 * nd);
	const donlat = new Uint8Array(nd);
	if (lattice) {
		const cols = [merged.dx, merged.dy, merged.dz];
		for (let i = 0; i < nd; i++) {
			let on = 1;
			for (let a = 0; a < 3; a++) {
				const f = (cols[a][i] - lattice.origin[a]) / lattice.spacing[a];
				const r = Math.round(f);
				// Only data inside the lattice's box count as on it: then every offset between two entries of a
				// kriging system is within the covariance table (see tableHalf below), with no bounds checks.
				if (Math.abs(f - r) * lattice.spacing[a] > COINCIDENCE_TOLERANCE || r < 0 || r >= lattice.counts[a]) on = 0;
				dlat[3 * i + a] = on ? r : 0;
			}
			donlat[i] = on;
		}
	}

	// Counted, then filled: growing JS arrays of a million indices left some 30 MB of garbage behind.
	const targets = selectInt32(t.domain.length, (i) => i, (i) => t.domain[i] === index);
	markDataNodes(targets, t, merged, datumAt);
	const path = selectInt32(targets.length, (k) => targets[k], (g) => datumAt[g] < 0);

	let template: OffsetTemplate | null = null;
	let templateCells: Int32Array | null = null;
	let covTable: Float64Array | null = null;
	const tableHalf: [number, number, number] = [0, 0, 0];
	let nodeGrid: BucketGrid | null = null;
	if (lattice) {
		try {
			template = offsetTemplate(ellipsoid, lattice.spacing, [lattice.counts[0] - 1, lattice.counts[1] - 1, lattice.counts[2] - 1]);
		} catch {
			template = null;
		}
	}
	if (template && lattice) {
		const [cx, cy] = lattice.counts;
		const o = template.offsets;
		templateCells = new Int32Array(template.count);
		for (let e = 0; e < template.count; e++) templateCells[e] = o[3 * e] + cx * (o[3 * e + 1] + cy * o[3 * e + 2]);
		// Two entries of one system lie in the search ellipsoid of its node and in the lattice's box, so their
		// offset is within twice the ellipsoid's reach (plus a cell for rounding at its rim) and counts − 1.
		for (let a = 0; a < 3; a++) tableHalf[a] = Math.min(2 * template.reach[a] + 2, lattice.counts[a] - 1);
		const [hx, hy, hz] = tableHalf;
		const size = (2 * hx + 1) * (2 * hy + 1) * (2 * hz + 1);
		if (size <= MAX_TABLE) {
			covTable = new Float64Array(size);
			const [sx, sy, sz] = lattice.spacing;
			let p = 0;
			for (let i = -hx; i <= hx; i++) {
				for (let j = -hy; j <= hy; j++) {
					for (let k = -hz; k <= hz; k++) covTable[p++] = cov.covariance(i * sx, j * sy, k * sz);
				}
			}
		}
	}
	let multigrid: PreparedDomain['multigrid'] = null;
	if (template && lattice && (d.search.path === 'multigrid' || d.search.path === 'multigrid-constant')) multigrid = multigridOf(template, lattice, path);
	if (!template || !lattice) {
		const tn = new Float64Array(3 * targets.length);
		for (let i = 0; i < targets.length; i++) {
			const g = targets[i];
			normalisedCoordinates(ellipsoid, t.x[g], t.y[g], t.z[g], tn, 3 * i);
		}
		nodeGrid = new BucketGrid(tn, { fine: true });
	}

	return {
		index,
		cov,
		sill: cov.sill,
		mean: d.mean ?? 0,
		ordinary: d.kriging === 'ordinary',
		table,
		trend: d.trend ?? null,
		ellipsoid,
		maxData: d.search.maxData,
		maxSimulated: d.search.maxSimulated,
		maxPerSounding: d.search.maxPerSounding ?? Infinity,
		nd,
		...merged,
		dataGrid,
		dlat,
		donlat,
		targets,
		pathNodes: path,
		template,
		templateCells,
		covTable,
		tableHalf,
		nodeGrid,
		multigrid,
		constantPath: d.search.path === 'random-constant' || d.search.path === 'multigrid-constant',
		plan: null,
		dataCov: null,
		dataSelection: null,
		dataFactor: null,
		dataFactorReady: null
	};
}

/** The multiple-grid levels of a domain's path nodes and the template entries of each coarse level. */
function multigridOf(template: OffsetTemplate, lattice: Lattice, path: Int32Array): PreparedDomain['multigrid'] {
	const strides = multigridStrides(template.reach, lattice.counts);
	const [cx, cy] = lattice.counts;
	const level = new Uint8Array(path.length);
	path.forEach((g, p) => {
		const c = lattice.cellOf[g];
		level[p] = multigridLevel(strides, c % cx, Math.floor(c / cx) % cy, Math.floor(c / (cx * cy)));
	});
	const entries: Int32Array[] = [new Int32Array(0)];
	const o = template.offsets;
	for (let l = 1; l < strides.length / 3; l++) {
		const keep: number[] = [];
		for (let e = 0; e < template.count; e++) {
			if (o[3 * e] % strides[3 * l] === 0 && o[3 * e + 1] % strides[3 * l + 1] === 0 && o[3 * e + 2] % strides[3 * l + 2] === 0) keep.push(e);
		}
		entries.push(Int32Array.from(keep));
	}
	return { strides, level, entries };
}

interface MergedData {
	dx: Float64Array;
	dy: Float64Array;
	dz: Float64Array;
	dval: Float64Array;
	dorig: Float64Array;
	dgroup: Int32Array;
}

/**
 * Merges data closer than COINCIDENCE_TOLERANCE in every coordinate (duplicates would make the kriging
 * system singular): one datum at the first one's location, with the mean kriged-space and original value.
 */
function mergeData(d: DomainInput, kvals: number[]): MergedData {
	const s = d.samples;
	const n = s.length;
	const order = Array.from({ length: n }, (_, i) => i);
	order.sort((a, b) => s[a].x - s[b].x || a - b);
	const root = new Int32Array(n).fill(-1);
	for (let p = 0; p < n; p++) {
		const i = order[p];
		for (let q = p - 1; q >= 0; q--) {
			const j = order[q];
			if (s[i].x - s[j].x > COINCIDENCE_TOLERANCE) break;
			if (root[j] < 0 && Math.abs(s[i].y - s[j].y) <= COINCIDENCE_TOLERANCE && Math.abs(s[i].z - s[j].z) <= COINCIDENCE_TOLERANCE) {
				root[i] = j;
				break;
			}
		}
	}
	const slot = new Int32Array(n).fill(-1);
	let m = 0;
	for (let i = 0; i < n; i++) if (root[i] < 0) slot[i] = m++;
	const out: MergedData = {
		dx: new Float64Array(m),
		dy: new Float64Array(m),
		dz: new Float64Array(m),
		dval: new Float64Array(m),
		dorig: new Float64Array(m),
		dgroup: new Int32Array(m)
	};
	const count = new Float64Array(m);
	const groups = new Map<string, number>();
	for (let i = 0; i < n; i++) {
		if (root[i] >= 0) continue;
		const k = slot[i];
		out.dx[k] = s[i].x;
		out.dy[k] = s[i].y;
		out.dz[k] = s[i].z;
		const snd = s[i].sounding;
		if (snd === undefined) out.dgroup[k] = -1;
		else {
			if (!groups.has(snd)) groups.set(snd, groups.size);
			out.dgroup[k] = groups.get(snd)!;
		}
	}
	for (let i = 0; i < n; i++) {
		const k = slot[root[i] < 0 ? i : root[i]];
		out.dval[k] += kvals[i];
		out.dorig[k] += s[i].value;
		count[k]++;
	}
	for (let k = 0; k < m; k++) {
		if (count[k] > 1) {
			out.dval[k] /= count[k];
			out.dorig[k] /= count[k];
		}
	}
	return out;
}

/** Marks the targets within COINCIDENCE_TOLERANCE of a datum (the nearest such datum by x order). */
/** value(k) for k = 0 … n − 1 where keep(value(k)), in that order, counted first and then filled. */
function selectInt32(n: number, value: (k: number) => number, keep: (v: number) => boolean): Int32Array {
	let count = 0;
	for (let k = 0; k < n; k++) if (keep(value(k))) count++;
	const out = new Int32Array(count);
	for (let k = 0, m = 0; k < n; k++) {
		const v = value(k);
		if (keep(v)) out[m++] = v;
	}
	return out;
}

function markDataNodes(targets: Int32Array, t: TargetPoints, m: MergedData, datumAt: Int32Array): void {
	const nd = m.dx.length;
	if (nd === 0) return;
	const order = Int32Array.from({ length: nd }, (_, i) => i).sort((a, b) => m.dx[a] - m.dx[b] || a - b);
	const xs = Float64Array.from(order, (i) => m.dx[i]);
	for (const g of targets) {
		const x = t.x[g];
		let lo = 0;
		let hi = nd;
		while (lo < hi) {
			const mid = (lo + hi) >> 1;
			if (xs[mid] < x - COINCIDENCE_TOLERANCE) lo = mid + 1;
			else hi = mid;
		}
		for (let p = lo; p < nd && xs[p] <= x + COINCIDENCE_TOLERANCE; p++) {
			const i = order[p];
			if (Math.abs(m.dy[i] - t.y[g]) <= COINCIDENCE_TOLERANCE && Math.abs(m.dz[i] - t.z[g]) <= COINCIDENCE_TOLERANCE) {
				datumAt[g] = i;
				break;
			}
		}
	}
}
