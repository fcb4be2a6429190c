import { choleskyFactor, choleskySolve } from '../linalg/cholesky';
import type { TabulatedCovariance } from '../variogram/covariance-table';
import type { PreparedDomain } from './prepare-simulation';
import { signatureHash, type SolutionCache } from './solution-cache';

/**
 * The kriging system of one simulated node, built and solved in buffers reused from node to node (one instance
 * per domain and realization; DomainWalk fills the entries). Entries 0 … kd − 1 are conditioning data, kd … k − 1
 * previously simulated nodes; the target sits at index kmax of px, py, pz, so the right-hand side is a row too.
 *
 * Covariances: two entries both on the lattice take the table (table[centre + tp[p] − tp[q]], always in range, see
 * tableHalf in prepareSimulation); two data the kept data–data covariances when there are some; anything else is
 * evaluated, in rows (cov.row) where it can. Each is the same bits the covariance gives for that pair (C(h) = C(−h)
 * too). `off`: how many of the kd data are off the lattice; `tq`: the target's table position (−1 off the lattice).
 *
 * A class rather than closures made per call: closures made afresh for every domain and realization left V8
 * optimising each new set again (code specialised to one closure's context is thrown away with it), which made a
 * realization's time swing by up to 2× with what had run before. Methods keep one shape and one set of type
 * feedback for the life of the process.
 */
export class KrigingSystem {
	declare readonly kmax: number;
	/** Entry coordinates (the target at kmax), table positions (−1 off the lattice) and datum indices (−1: a node). */
	declare readonly px: Float64Array;
	declare readonly py: Float64Array;
	declare readonly pz: Float64Array;
	declare readonly tp: Int32Array;
	declare readonly pid: Int32Array;
	/** The lower triangle (then the factor) of the k×k matrix, stride k; the right-hand side; the weights. */
	declare readonly a: Float64Array;
	declare readonly rhs: Float64Array;
	declare readonly w: Float64Array;
	declare private readonly u1: Float64Array;
	declare private readonly ones: Float64Array;
	declare private readonly cov: TabulatedCovariance;
	declare private readonly sill: number;
	declare private readonly ordinary: boolean;
	declare private readonly table: Float64Array;
	declare private readonly centre: number;
	declare private readonly nd: number;
	declare private readonly dataCov: Float64Array | null;
	declare private readonly dx: Float64Array;
	declare private readonly dy: Float64Array;
	declare private readonly dz: Float64Array;
	declare private readonly dataFactor: Float64Array | null;
	declare private readonly factorReady: Uint8Array | null;
	declare private readonly factorStride: number;
	declare private readonly domain: number;
	declare private readonly parts: SolutionCache | null;
	declare private readonly partKey: Int32Array;
	declare private readonly part: Float64Array;

	/**
	 * @param centre the table position of a zero offset (see DomainWalk)
	 * @param parts where data parts of factors are kept by their data's lattice offsets (see PreparedSimulation), or null
	 */
	constructor(dom: PreparedDomain, centre: number, parts: SolutionCache | null) {
		const kmax = dom.maxData + dom.maxSimulated;
		this.kmax = kmax;
		this.px = new Float64Array(kmax + 1);
		this.py = new Float64Array(kmax + 1);
		this.pz = new Float64Array(kmax + 1);
		this.tp = new Int32Array(kmax);
		this.pid = new Int32Array(kmax);
		this.a = new Float64Array(kmax * kmax);
		this.rhs = new Float64Array(kmax);
		this.w = new Float64Array(kmax);
		this.u1 = new Float64Array(kmax);
		this.ones = new Float64Array(kmax).fill(1);
		this.cov = dom.cov;
		this.sill = dom.sill;
		this.ordinary = dom.ordinary;
		// Never read without a lattice entry (tp ≥ 0), which needs a table: an empty one keeps the field's type.
		this.table = dom.covTable ?? new Float64Array(0);
		this.centre = centre;
		this.nd = dom.nd;
		this.dataCov = dom.dataCov;
		this.dx = dom.dx;
		this.dy = dom.dy;
		this.dz = dom.dz;
		this.dataFactor = dom.dataFactor;
		this.factorReady = dom.dataFactorReady;
		this.factorStride = (dom.maxData * (dom.maxData + 1)) / 2 + dom.maxData;
		this.domain = dom.index;
		this.parts = dom.covTable !== null ? parts : null;
		this.partKey = new Int32Array(Math.max(dom.maxData, 1));
		this.part = new Float64Array(this.factorStride);
	}

	/** rhs[p] for the data, p < kd. */
	private buildRhsData(kd: number, off: number, tq: number): void {
		const { rhs, px, py, pz, tp, table, centre, kmax, cov } = this;
		if (tq < 0 || off === kd) cov.row(rhs, 0, px, py, pz, kmax, 0, kd);
		else {
			for (let p = 0; p < kd; p++) {
				if (tp[p] >= 0) rhs[p] = table[centre + tp[p] - tq];
				else cov.pair(rhs, p, px, py, pz, kmax, px, py, pz, p);
			}
		}
	}

	/** rhs[p] for the simulated nodes, kd ≤ p < k. */
	private buildRhsNodes(k: number, kd: number, tq: number): void {
		const { rhs, tp, table, centre } = this;
		if (tq < 0) this.cov.row(rhs, kd, this.px, this.py, this.pz, this.kmax, kd, k);
		else for (let p = kd; p < k; p++) rhs[p] = table[centre + tp[p] - tq];
	}

	/** Rows p < kd (data) of the lower triangle. */
	private buildDataRows(k: number, kd: number, off: number): void {
		const { a, px, py, pz, tp, pid, table, centre, cov, dataCov, nd, dx, dy, dz } = this;
		for (let p = 0; p < kd; p++) {
			const row = p * k;
			const tpp = tp[p];
			if (dataCov === null) {
				if (off === kd) cov.row(a, row, px, py, pz, p, 0, p);
				else {
					for (let r = 0; r < p; r++) {
						if (tpp >= 0 && tp[r] >= 0) a[row + r] = table[centre + tpp - tp[r]];
						else cov.pair(a, row + r, px, py, pz, p, px, py, pz, r);
					}
				}
				continue;
			}
			const ip = pid[p];
			for (let r = 0; r < p; r++) {
				const tr = tp[r];
				if (tpp >= 0 && tr >= 0) {
					a[row + r] = table[centre + tpp - tr];
					continue;
				}
				const at = ip * nd + pid[r];
				if (dataCov[at] !== dataCov[at]) {
					cov.pair(dataCov, at, dx, dy, dz, ip, dx, dy, dz, pid[r]);
					// C(h) = C(−h) bit for bit, so one evaluation serves both orders.
					dataCov[pid[r] * nd + ip] = dataCov[at];
				}
				a[row + r] = dataCov[at];
			}
		}
	}

	/** Rows p ≥ kd (simulated nodes) of the lower triangle. */
	private buildNodeRows(k: number, kd: number, off: number): void {
		const { a, px, py, pz, tp, table, centre, cov } = this;
		for (let p = kd; p < k; p++) {
			const row = p * k;
			const tpp = tp[p];
			if (tpp < 0) {
				cov.row(a, row, px, py, pz, p, 0, p);
				continue;
			}
			const base = centre + tpp;
			if (off === kd) cov.row(a, row, px, py, pz, p, 0, kd);
			else {
				for (let r = 0; r < kd; r++) {
					if (tp[r] >= 0) a[row + r] = table[base - tp[r]];
					else cov.pair(a, row + r, px, py, pz, p, px, py, pz, r);
				}
			}
			for (let r = kd; r < p; r++) a[row + r] = table[base - tp[r]];
		}
	}

	/** The lower triangle of the system and its right-hand side; ridged: 1 + 1e-9 times the sill on the diagonal. */
	private buildSystem(k: number, kd: number, off: number, tq: number, ridged: boolean): void {
		this.buildRhsData(kd, off, tq);
		this.buildRhsNodes(k, kd, tq);
		this.buildDataRows(k, kd, off);
		this.buildNodeRows(k, kd, off);
		const a = this.a;
		const diag = ridged ? this.sill * (1 + 1e-9) : this.sill * 1;
		for (let p = 0; p < k; p++) a[p * k + p] = diag;
	}

	/**
	 * Builds, factors and solves the system of k entries of the target g (position pos on the domain's path): leaves
	 * the simple-kriging weights, or the ordinary-kriging λ = w − μ·u (with K·w = k₀, K·u = 1, μ = (Σw − 1)/Σu), in
	 * `w` and returns the kriging variance (≥ 0).
	 * @throws {Error} 'singular kriging system at target g' if the system stays singular after a tiny ridge
	 */
	solve(k: number, kd: number, off: number, tq: number, g: number, pos: number): number {
		const { a, rhs, w, sill } = this;
		// The data part of a system (its first kd rows of the factor and of the right-hand side) depends on the data
		// alone: kept, then copied in and the factorisation continued from row kd (the same bits as a whole one).
		// Kept per target when its data are off the lattice (the same in every realization), else by the data's
		// lattice offsets from the target, which many targets share.
		let kept: Float64Array | null = null;
		let at = 0;
		let keep = 0; // 1: per target, 2: by offsets
		let hash = 0;
		const factorReady = this.factorReady;
		const parts = this.parts;
		if (kd > 0) {
			if (factorReady !== null) {
				at = pos * this.factorStride;
				if (factorReady[pos] === 1) kept = this.dataFactor;
				else keep = 1;
			} else if (parts !== null && off === 0) {
				const key = this.partKey;
				const tp = this.tp;
				for (let p = 0; p < kd; p++) key[p] = tp[p] - tq;
				hash = signatureHash(this.domain, kd, key);
				const slot = parts.find(this.domain, kd, key, hash);
				if (slot >= 0) {
					kept = parts.values();
					at = parts.valueOffset(slot);
				} else keep = 2;
			}
		}
		let ok: boolean;
		if (kept !== null) {
			let f = at;
			for (let i = 0; i < kd; i++) {
				const row = i * k;
				for (let j = 0; j <= i; j++) a[row + j] = kept[f++];
			}
			for (let i = 0; i < kd; i++) rhs[i] = kept[f++];
			this.buildRhsNodes(k, kd, tq);
			this.buildNodeRows(k, kd, off);
			const diag = sill * 1;
			for (let p = kd; p < k; p++) a[p * k + p] = diag;
			ok = choleskyFactor(a, k, 1e-13, kd);
		} else {
			this.buildSystem(k, kd, off, tq, false);
			ok = choleskyFactor(a, k);
			if (ok && keep === 1) {
				this.packDataPart(this.dataFactor!, at, k, kd);
				factorReady![pos] = 1;
			} else if (ok && keep === 2) {
				this.packDataPart(this.part, 0, k, kd);
				parts!.store(this.domain, kd, this.partKey, hash, this.part, 0, (kd * (kd + 1)) / 2 + kd);
			}
		}
		if (!ok) {
			// A tiny ridge (1e-9 of the sill) rescues systems that are singular only to rounding, e.g. a
			// Gaussian model without nugget at close points; common practice.
			this.buildSystem(k, kd, off, tq, true);
			if (!choleskyFactor(a, k)) throw new Error(`singular kriging system at target ${g}`);
		}
		choleskySolve(a, k, rhs, w);
		let variance: number;
		if (!this.ordinary) {
			variance = sill;
			for (let p = 0; p < k; p++) variance -= w[p] * rhs[p];
		} else {
			const u1 = this.u1;
			choleskySolve(a, k, this.ones, u1);
			let sw = 0;
			let su = 0;
			for (let p = 0; p < k; p++) {
				sw += w[p];
				su += u1[p];
			}
			const mu = (sw - 1) / su;
			variance = sill - mu;
			for (let p = 0; p < k; p++) {
				const lam = w[p] - mu * u1[p];
				w[p] = lam;
				variance -= lam * rhs[p];
			}
		}
		return variance < 0 ? 0 : variance;
	}

	/** Writes the first kd rows of the factor (packed lower triangle) and of the right-hand side to dst at `at`. */
	private packDataPart(dst: Float64Array, at: number, k: number, kd: number): void {
		const { a, rhs } = this;
		let f = at;
		for (let i = 0; i < kd; i++) {
			const row = i * k;
			for (let j = 0; j <= i; j++) dst[f++] = a[row + j];
		}
		for (let i = 0; i < kd; i++) dst[f++] = rhs[i];
	}
}
