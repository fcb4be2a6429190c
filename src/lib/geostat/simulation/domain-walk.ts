import { normalisedCoordinates } from '../search/search-ellipsoid';
import { ActiveBuckets } from '../search/active-buckets';
import { selectNearest } from '../search/select-nearest';
import type { PreparedDomain, PreparedSimulation } from './prepare-simulation';
import { multigridLevel } from './multigrid-path';
import { signatureHash } from './solution-cache';
import { KrigingSystem } from './kriging-system';
import type { PathPlan } from './path-plan';
import type { SimulationStats } from './simulate';

/**
 * Share of a random path after which solved systems are looked up and stored. Measured (section and block of the
 * benchmark, three realizations): of the systems in each tenth of the path, 0–2 % found their solution kept in the
 * first seven tenths, 11 %, 43 % and 87 % in the last three on the section, 3 % and 30 % in the last two on the
 * block; looking up and storing cost some 15 % of a realization, so the early ones cost more than they saved.
 */
const RANDOM_PATH_REUSE_FROM = 0.7;

/**
 * Below this share of hits among recent lookups, only one system in 16 is looked up (see hitRate). Measured on a
 * 60 × 60 × 60 block with 9 soundings, where every system holds data and few repeat: a realization 5 % faster on the
 * multiple-grid path and 10 % on the random one, and 12 % on the benchmark's section (random path), whose early
 * lookups miss; the section's multiple-grid path, which hits 70–95 %, is unchanged.
 */
const MIN_HIT_RATE = 0.02;

/**
 * One domain's walk along its path in one realization: node(), called once a path step, searches the node's
 * conditioning data and previously simulated nodes, solves (or reuses) its kriging system and draws its value
 * (see simulate() for the method). A class whose method is called once a node rather than one long loop in a
 * function called once a domain: a JavaScript engine then optimises the node's work as a function of its own,
 * where the long loop ran for many realizations in slower tiers (Chromium's V8 kept leaving and re-entering
 * code compiled on the loop, measured at 2× a realization's steady time in the browser's workers). The same
 * arithmetic in the same order: the same bits.
 */
export class DomainWalk {
	declare private readonly prep: PreparedSimulation;
	declare private readonly dom: PreparedDomain;
	declare private readonly y: Float64Array;
	declare private readonly state: Uint8Array;
	declare private readonly ready: Uint8Array | null;
	declare private readonly yCell: Float64Array | null;
	declare private readonly stats: SimulationStats;
	declare private readonly active: ActiveBuckets | null;
	declare private readonly localOf: Int32Array | null;
	declare private readonly candIdx: Int32Array;
	declare private readonly candD2: Float64Array;
	declare private readonly selIdx: Int32Array;
	declare private readonly selD2: Float64Array;
	declare private readonly pv: Float64Array;
	declare private readonly q: Float64Array;
	declare private readonly key: Int32Array;
	/** Each entry's reference as a PathPlan keeps it (−1 − datum, or the target index of a simulated node). */
	declare private readonly ref: Int32Array;
	declare private readonly plan: PathPlan | null;
	/** Whether steps are solved after replayed ones, which then need the search's state kept (see replay). */
	declare private readonly partial: boolean;
	declare private readonly sys: KrigingSystem;
	declare private readonly sx: number;
	declare private readonly sy: number;
	/** The lattice's counts, origin and spacing, and the template's extent (zeros and ones without them). */
	declare private readonly cx: number;
	declare private readonly cy: number;
	declare private readonly cz: number;
	declare private readonly lox: number;
	declare private readonly loy: number;
	declare private readonly loz: number;
	declare private readonly ldx: number;
	declare private readonly ldy: number;
	declare private readonly ldz: number;
	declare private readonly ex: number;
	declare private readonly ey: number;
	declare private readonly ez: number;
	declare private readonly useData: boolean;
	declare private readonly useNodes: boolean;
	/** From this path step on, solved systems are looked up and stored (see RANDOM_PATH_REUSE_FROM). */
	declare private readonly reuseFrom: number;
	/**
	 * Share of hits among the recent lookups (a running mean over about 64): while it stays below MIN_HIT_RATE, only
	 * one system in 16 is looked up and stored, enough to notice when neighbourhoods start to repeat.
	 */
	declare private hitRate: number;

	/**
	 * @param localOf off the lattice, each path node's index among the domain's targets (else null)
	 * @param steps the length of the domain's path
	 */
	constructor(
		prep: PreparedSimulation,
		dom: PreparedDomain,
		y: Float64Array,
		state: Uint8Array,
		ready: Uint8Array | null,
		yCell: Float64Array | null,
		stats: SimulationStats,
		localOf: Int32Array | null,
		steps: number
	) {
		this.prep = prep;
		this.dom = dom;
		this.y = y;
		this.state = state;
		this.ready = ready;
		this.yCell = yCell;
		this.stats = stats;
		// Off the lattice: the domain's simulated nodes by bucket.
		this.active = dom.nodeGrid ? new ActiveBuckets(dom.nodeGrid) : null;
		this.localOf = localOf;
		const kmax = dom.maxData + dom.maxSimulated;
		const ncand = Math.max(dom.nd, dom.nodeGrid ? dom.nodeGrid.size : 0, 1);
		this.candIdx = new Int32Array(ncand);
		this.candD2 = new Float64Array(ncand);
		this.selIdx = new Int32Array(Math.max(kmax, 1));
		this.selD2 = new Float64Array(Math.max(kmax, 1));
		this.pv = new Float64Array(kmax);
		this.q = new Float64Array(3);
		this.key = new Int32Array(kmax);
		this.ref = new Int32Array(Math.max(kmax, 1));
		this.plan = dom.plan;
		this.partial = dom.plan === null || dom.plan.recorded < steps;
		const [hx, hy, hz] = dom.tableHalf;
		this.sy = 2 * hz + 1;
		this.sx = (2 * hy + 1) * this.sy;
		const centre = hx * this.sx + hy * this.sy + hz;
		const lat = prep.lattice;
		this.cx = lat ? lat.counts[0] : 0;
		this.cy = lat ? lat.counts[1] : 0;
		this.cz = lat ? lat.counts[2] : 0;
		this.lox = lat ? lat.origin[0] : 0;
		this.loy = lat ? lat.origin[1] : 0;
		this.loz = lat ? lat.origin[2] : 0;
		this.ldx = lat ? lat.spacing[0] : 1;
		this.ldy = lat ? lat.spacing[1] : 1;
		this.ldz = lat ? lat.spacing[2] : 1;
		const tmpl = dom.template;
		this.ex = tmpl ? tmpl.extent[0] : 0;
		this.ey = tmpl ? tmpl.extent[1] : 0;
		this.ez = tmpl ? tmpl.extent[2] : 0;
		// The system's entries are filled here and built and solved by `sys` (see KrigingSystem).
		this.sys = new KrigingSystem(dom, centre, prep.parts);
		this.useData = dom.nd > 0 && dom.maxData > 0 && !dom.ellipsoid.empty;
		this.useNodes = dom.maxSimulated > 0 && !dom.ellipsoid.empty;
		// On a random path a neighbourhood repeats only once the lattice around it is nearly full: the first 70 % of the
		// path neither looks up nor stores (which would only crowd the cache).
		this.reuseFrom = dom.multigrid ? 0 : Math.floor(RANDOM_PATH_REUSE_FROM * steps);
		this.hitRate = 1;
	}

	/** Simulates the node at position pos of dom.pathNodes, path step `step`, with the standard normal deviate zdev. */
	node(pos: number, step: number, zdev: number): void {
		const { prep, dom, y, ready, yCell, stats, candIdx, candD2, selIdx, selD2, pv, q, key, ref, sys, sx, sy, cx, cy, cz, lox, loy, loz, ldx, ldy, ldz } = this;
		const { sill, mean, ordinary, maxData, maxSimulated } = dom;
		const kmax = maxData + maxSimulated;
		const t = prep.targets;
		const lat = prep.lattice;
		const d = dom.index;
		const g = dom.pathNodes[pos];
		const table = dom.covTable;
		// Reuse needs every entry's covariances from the table: then the signature fixes the system.
		const cache = table !== null ? prep.cache : null;
		const plan = this.plan;
		const record = plan !== null && plan.wants(step);
		const { px, py, pz, tp, pid, w } = sys;
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
			x0 = t.x[g];
			y0 = t.y[g];
			z0 = t.z[g];
		}
		normalisedCoordinates(dom.ellipsoid, x0, y0, z0, q);
		px[kmax] = x0;
		py[kmax] = y0;
		pz[kmax] = z0;
		let k = 0;
		let kd = 0;
		let off = 0;
		if (this.useData) {
			// The data search depends on the target alone: kept from an earlier realization when there is room
			// (copied back into selIdx, so the loop below reads one kind of array whichever way it came).
			const dataSel = dom.dataSelection;
			if (dataSel !== null) {
				const so = pos * (maxData + 1);
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
				if (record) ref[k] = -1 - i;
				if (tp[k] < 0) off++;
				k++;
			}
		}
		if (this.useNodes) {
			const tmpl = dom.template;
			if (tmpl !== null) {
				// A template exists only in lattice mode.
				const { ex, ey, ez } = this;
				const offs = tmpl.offsets;
				const cellOfs = dom.templateCells!;
				const c0 = gc;
				const mg = dom.multigrid;
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
					if (record) ref[k] = lat!.cell[c];
					k++;
					found++;
				}
			} else {
				// The domain's simulated nodes near q, found outward from q's bucket: a superset of the nearest
				// maxSimulated within the ellipsoid, so the choice is the one from all of them (ActiveBuckets).
				const m = this.active!.candidates(q[0], q[1], q[2], maxSimulated, candIdx, candD2);
				const kn = selectNearest(candIdx, candD2, m, maxSimulated, selIdx, selD2);
				for (let s = 0; s < kn; s++) {
					const h = dom.targets[selIdx[s]];
					px[k] = t.x[h];
					py[k] = t.y[h];
					pz[k] = t.z[h];
					pv[k] = y[h];
					tp[k] = -1;
					pid[k] = -1;
					if (record) ref[k] = h;
					k++;
				}
			}
		}

		let est = mean;
		let variance = sill;
		stats.systems++;
		stats.neighbours += k;
		// Weights (simple kriging) or λ (ordinary kriging), and where they are.
		let wts: Float64Array = sys.w;
		let at = 0;
		if (k > 0) {
			const tq = table !== null ? gi * sx + gj * sy + gk : -1;
			// The signature: every entry's lattice offset from the target, in system order.
			let slot = -1;
			let hash = 0;
			let reusable = cache !== null && step >= this.reuseFrom && (this.hitRate >= MIN_HIT_RATE || (step & 15) === 0);
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
					this.hitRate += ((slot >= 0 ? 1 : 0) - this.hitRate) / 64;
				}
			}
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
		const sd = Math.sqrt(variance);
		y[g] = est + sd * zdev;
		if (record) plan!.push(k, ref, wts, at, sd);
		this.state[g] = 1;
		if (this.active) this.active.add(this.localOf![pos]);
		if (ready) {
			ready[gc >> 3] |= 1 << (gc & 7);
			yCell![gc] = y[g];
		}
	}

	/**
	 * Simulates the node at position pos of dom.pathNodes, path step `step` (< the plan's recorded steps), from what
	 * its plan kept: the estimate as node() forms it, the same weights times the same values in the same order.
	 */
	replay(pos: number, step: number, zdev: number): void {
		const { dom, y } = this;
		const plan = this.plan!;
		const g = dom.pathNodes[pos];
		const mean = dom.mean;
		const dval = dom.dval;
		const pw = plan.w;
		const pr = plan.ref;
		const o = plan.start[step];
		const k = plan.start[step + 1] - o;
		let est = mean;
		if (k > 0) {
			if (!dom.ordinary) {
				for (let p = 0; p < k; p++) {
					const r = pr[o + p];
					est += pw[o + p] * ((r >= 0 ? y[r] : dval[-1 - r]) - mean);
				}
			} else {
				est = 0;
				for (let p = 0; p < k; p++) {
					const r = pr[o + p];
					est += pw[o + p] * (r >= 0 ? y[r] : dval[-1 - r]);
				}
			}
		}
		y[g] = est + plan.sd[step] * zdev;
		this.state[g] = 1;
		// Steps after the plan's end are searched: they must see the nodes replayed before them.
		if (this.partial) {
			if (this.active) this.active.add(this.localOf![pos]);
			const ready = this.ready;
			if (ready) {
				const gc = this.prep.lattice!.cellOf[g];
				ready[gc >> 3] |= 1 << (gc & 7);
				this.yCell![gc] = y[g];
			}
		}
	}
}
