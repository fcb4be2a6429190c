import { compileVariogram, validateVariogramModel } from '../variogram/model';
import type { CompiledVariogram } from '../variogram/model';
import { normalScore } from '../distribution/normal-score';
import type { NormalScoreTable } from '../types';
import { searchEllipsoid, normalisedCoordinates } from '../search/search-ellipsoid';
import type { SearchEllipsoid } from '../search/search-ellipsoid';
import { BucketGrid } from '../search/bucket-grid';
import { offsetTemplate } from '../search/offset-template';
import type { OffsetTemplate } from '../search/offset-template';
import { detectLattice } from './lattice';
import type { Lattice } from './lattice';
import type { DomainInput, SimulationInput, TargetPoints } from './types';
import { trendResiduals, validateTrend, type LinearTrend } from './trend';

/**
 * Distance (in the project's length unit) within which a target and a datum, or two data, count as one
 * location: the target takes the datum's value, duplicates are merged.
 */
export const COINCIDENCE_TOLERANCE = 1e-6;

// Covariance tables beyond this many entries cost more to fill than they save.
const MAX_TABLE = 8_000_000;

/** One domain, ready for any number of realizations (internal layout, not part of the recipe). */
export interface PreparedDomain {
	index: number;
	cov: CompiledVariogram;
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
	/** General mode: bucket grid over the domain's targets (local indices). */
	nodeGrid: BucketGrid | null;
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
}

/**
 * Validates a simulation input against its targets and prepares everything that does not depend on the
 * realization: normal-score transforms (Deutsch & Journel 1998, ch. V), merged data, search structures,
 * the lattice with its offset template and covariance table. Does not mutate its inputs (targets are kept
 * by reference).
 * @throws {TypeError} on malformed input
 * @throws {RangeError} on bad sizes, non-finite numbers, domain indices out of range, or a normal-score
 *   domain without samples
 */
export function prepareSimulation(input: SimulationInput, targets: TargetPoints): PreparedSimulation {
	if (input === null || typeof input !== 'object') throw new TypeError('input must be an object');
	if (typeof input.seed !== 'string') throw new TypeError('seed must be a string');
	if (!Array.isArray(input.domains)) throw new TypeError('domains must be an array');
	// Simulated lattice cells are marked with 1 + their domain in a Uint16Array.
	if (input.domains.length > 65534) throw new RangeError('at most 65534 domains');
	checkTargets(targets, input.domains.length);
	const n = targets.domain.length;
	let active = 0;
	for (let i = 0; i < n; i++) if (targets.domain[i] >= 0) active++;
	const lattice = detectLattice(targets);
	const datumAt = new Int32Array(n).fill(-1);
	const domains = input.domains.map((d, index) => prepareDomain(d, index, targets, lattice, datumAt));
	return { seed: input.seed, targets, lattice, datumAt, domains, active };
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
	const cov = compileVariogram(d.model);
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

	const list: number[] = [];
	for (let i = 0; i < t.domain.length; i++) if (t.domain[i] === index) list.push(i);
	const targets = Int32Array.from(list);
	markDataNodes(targets, t, merged, datumAt);
	const path: number[] = [];
	for (const g of list) if (datumAt[g] < 0) path.push(g);

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
	} else {
		const tn = new Float64Array(3 * targets.length);
		for (let i = 0; i < targets.length; i++) {
			const g = targets[i];
			normalisedCoordinates(ellipsoid, t.x[g], t.y[g], t.z[g], tn, 3 * i);
		}
		nodeGrid = new BucketGrid(tn);
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
		pathNodes: Int32Array.from(path),
		template,
		templateCells,
		covTable,
		tableHalf,
		nodeGrid
	};
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
