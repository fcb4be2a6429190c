import exp from '@stdlib/math-base-special-exp';
import { planRotation, validateVariogramModel } from './model';
import type { VariogramModel } from '../types';

/** Step of the table of e^(−3x) in x (2⁻¹⁰, so x·1024 and its fraction are exact). */
export const COVARIANCE_TABLE_STEP = 1 / 1024;
/** The table covers 0 ≤ x < 8, where e^(−3x) > 3.8e-11; beyond it e^(−3x) is evaluated directly. */
export const COVARIANCE_TABLE_END = 8;

const PER_UNIT = 1024;
const INTERVALS = COVARIANCE_TABLE_END * PER_UNIT;
const SPHERICAL = 1;
const EXPONENTIAL = 2;
const GAUSSIAN = 3;
const CODES = { nugget: 0, spherical: SPHERICAL, exponential: EXPONENTIAL, gaussian: GAUSSIAN } as const;

let table: Float64Array | null = null;

/**
 * The covariance C(h) = Σ cₛ·ρₛ(rₛ) of a variogram model as the simulation evaluates it (its bits are part of
 * ENGINE_VERSION): rₛ is the anisotropic reduced distance of structure s (geometric anisotropy, Deutsch & Journel
 * 1998, ch. II; the same rotation as reducedDistance, with the ranges' reciprocals multiplied in), and ρₛ its
 * unit-sill correlation in the practical-range forms: spherical 1 − 1.5r + 0.5r³ for r < 1 (0 beyond), exponential
 * e^(−3r), Gaussian e^(−3r²); a nugget counts only at h = 0, where C = the total sill.
 *
 * e^(−3x) (x = r for the exponential, x = r² for the Gaussian, so no square root there) is read from a table of
 * cubic Hermite pieces on a grid of step 2⁻¹⁰ in x, built once from exact values and slopes (Burden & Faires 2011,
 * Numerical Analysis, 9th ed., §3.4 (memory)); its error is at most h⁴/384·max|f⁗| = 81/(384·2⁴⁰) ≈ 1.9e-13 of a
 * structure's sill, far below any fitted model's precision. A kriging system then costs a table read per entry
 * instead of an exponential, with the bits still defined by + − × ÷ and √ only, which agree in every engine.
 * Beyond x = 8 the exponential is evaluated directly (@stdlib, deterministic).
 *
 * One class for every model (not a closure per model), so the simulation's call sites stay monomorphic; the
 * fields are only declared (not emitted as class fields), so each is first set in the constructor with its final
 * type. row() and pair() take points as columns and indices, so inner loops pass no boxed numbers.
 */
export class TabulatedCovariance {
	/** Total sill: the sum of all structures' sills, nugget included; the covariance at h = 0. */
	declare readonly sill: number;
	declare private readonly sin: number;
	declare private readonly cos: number;
	declare private readonly n: number;
	declare private readonly type: Int8Array;
	declare private readonly c: Float64Array;
	declare private readonly ia: Float64Array;
	declare private readonly ib: Float64Array;
	declare private readonly ic: Float64Array;
	declare private readonly t: Float64Array;
	// One exponential structure (with or without a nugget), the common case: its sill and reciprocal ranges.
	declare private readonly single: boolean;
	declare private readonly c0: number;
	declare private readonly a0: number;
	declare private readonly b0: number;
	declare private readonly v0: number;

	/** @throws {TypeError} {RangeError} on an invalid model (see validateVariogramModel) */
	constructor(model: VariogramModel) {
		validateVariogramModel(model);
		const rot = planRotation(model.azimuth);
		this.sin = rot.sin;
		this.cos = rot.cos;
		const spatial = model.structures.filter((s) => s.type !== 'nugget' && s.sill > 0);
		let sill = 0;
		for (const s of model.structures) sill += s.sill;
		this.sill = sill;
		this.n = spatial.length;
		this.type = Int8Array.from(spatial, (s) => CODES[s.type]);
		this.c = Float64Array.from(spatial, (s) => s.sill);
		this.ia = Float64Array.from(spatial, (s) => 1 / s.rangeMajor);
		this.ib = Float64Array.from(spatial, (s) => 1 / s.rangeMinor);
		this.ic = Float64Array.from(spatial, (s) => 1 / s.rangeVertical);
		this.t = expTable();
		this.single = this.n === 1 && this.type[0] === EXPONENTIAL;
		this.c0 = this.n > 0 ? this.c[0] : 0;
		this.a0 = this.n > 0 ? this.ia[0] : 0;
		this.b0 = this.n > 0 ? this.ib[0] : 0;
		this.v0 = this.n > 0 ? this.ic[0] : 0;
	}

	/** C at separation (dx, dy, dz); C(h) = C(−h) bit for bit. Inner-loop method: no validation. */
	covariance(dx: number, dy: number, dz: number): number {
		if (dx === 0 && dy === 0 && dz === 0) return this.sill;
		if (!this.single) return this.sum(dx, dy, dz);
		// The sum below for one exponential structure (0 + c·ρ is c·ρ exactly), kept small enough to be inlined.
		const u = (dx * this.sin + dy * this.cos) * this.a0;
		const v = (dx * this.cos - dy * this.sin) * this.b0;
		const w = dz * this.v0;
		return this.c0 * expNeg3(this.t, Math.sqrt(u * u + v * v + w * w));
	}

	/**
	 * out[o] = covariance(xa[i] − xb[j], ya[i] − yb[j], za[i] − zb[j]). Points pass as columns and indices, so an
	 * inner loop that calls this never boxes a number (a call that V8 does not inline passes doubles boxed).
	 */
	pair(out: Float64Array, o: number, xa: Float64Array, ya: Float64Array, za: Float64Array, i: number, xb: Float64Array, yb: Float64Array, zb: Float64Array, j: number): void {
		out[o] = this.covariance(xa[i] - xb[j], ya[i] - yb[j], za[i] - zb[j]);
	}

	/** out[o + r − from] = covariance(x[p] − x[r], y[p] − y[r], z[p] − z[r]) for from ≤ r < to (see pair). */
	row(out: Float64Array, o: number, x: Float64Array, y: Float64Array, z: Float64Array, p: number, from: number, to: number): void {
		const xp = x[p];
		const yp = y[p];
		const zp = z[p];
		if (!this.single) {
			this.rowOfSums(out, o, x, y, z, p, from, to);
			return;
		}
		// covariance() for one exponential structure, written out with the fields in locals (twice as fast in V8).
		const { sin, cos, a0, b0, v0, c0, t, sill } = this;
		for (let r = from; r < to; r++) {
			const dx = xp - x[r];
			const dy = yp - y[r];
			const dz = zp - z[r];
			if (dx === 0 && dy === 0 && dz === 0) {
				out[o + r - from] = sill;
				continue;
			}
			const u = (dx * sin + dy * cos) * a0;
			const v = (dx * cos - dy * sin) * b0;
			const w = dz * v0;
			const q = Math.sqrt(u * u + v * v + w * w);
			let e: number;
			if (q < COVARIANCE_TABLE_END) {
				const yq = q * PER_UNIT;
				const i = yq | 0;
				const f = yq - i;
				const b = 4 * i;
				e = t[b] + f * (t[b + 1] + f * (t[b + 2] + f * t[b + 3]));
			} else e = exp(-3 * q);
			out[o + r - from] = c0 * e;
		}
	}

	private rowOfSums(out: Float64Array, o: number, x: Float64Array, y: Float64Array, z: Float64Array, p: number, from: number, to: number): void {
		const xp = x[p];
		const yp = y[p];
		const zp = z[p];
		for (let r = from; r < to; r++) out[o + r - from] = this.covariance(xp - x[r], yp - y[r], zp - z[r]);
	}

	private sum(dx: number, dy: number, dz: number): number {
		const u0 = dx * this.sin + dy * this.cos;
		const v0 = dx * this.cos - dy * this.sin;
		const { n, type, c, ia, ib, ic, t } = this;
		let sum = 0;
		for (let s = 0; s < n; s++) {
			const u = u0 * ia[s];
			const v = v0 * ib[s];
			const w = dz * ic[s];
			const q = u * u + v * v + w * w;
			const ty = type[s];
			if (ty === EXPONENTIAL) sum += c[s] * expNeg3(t, Math.sqrt(q));
			else if (ty === GAUSSIAN) sum += c[s] * expNeg3(t, q);
			else if (q < 1) {
				const r = Math.sqrt(q);
				sum += c[s] * (1 - r * (1.5 - 0.5 * q));
			}
		}
		return sum;
	}
}

/**
 * The simulation's covariance of a model (see TabulatedCovariance).
 * @throws {TypeError} {RangeError} on an invalid model (see validateVariogramModel)
 */
export function tabulatedCovariance(model: VariogramModel): TabulatedCovariance {
	return new TabulatedCovariance(model);
}

/** e^(−3x) for x ≥ 0 from the table of cubic pieces (coefficients of t⁰…t³ per interval), directly beyond it. */
function expNeg3(t: Float64Array, x: number): number {
	if (x < COVARIANCE_TABLE_END) {
		const y = x * PER_UNIT;
		const i = y | 0;
		const f = y - i;
		const b = 4 * i;
		return t[b] + f * (t[b + 1] + f * (t[b + 2] + f * t[b + 3]));
	}
	return exp(-3 * x);
}

// Cubic Hermite piece on [xᵢ, xᵢ₊₁] in t = (x − xᵢ)/h: p(t) = f₀ + h·f₀′t + (3(f₁ − f₀) − h(2f₀′ + f₁′))t² + (2(f₀ − f₁) + h(f₀′ + f₁′))t³,
// with f = e^(−3x) and f′ = −3f, so p matches the value and slope at both ends.
function expTable(): Float64Array {
	if (table) return table;
	const h = COVARIANCE_TABLE_STEP;
	const f = new Float64Array(INTERVALS + 1);
	for (let i = 0; i <= INTERVALS; i++) f[i] = exp(-3 * i * h);
	const out = new Float64Array(4 * INTERVALS);
	for (let i = 0; i < INTERVALS; i++) {
		const f0 = f[i];
		const f1 = f[i + 1];
		const d0 = -3 * f0 * h;
		const d1 = -3 * f1 * h;
		out[4 * i] = f0;
		out[4 * i + 1] = d0;
		out[4 * i + 2] = 3 * (f1 - f0) - (2 * d0 + d1);
		out[4 * i + 3] = 2 * (f0 - f1) + (d0 + d1);
	}
	table = out;
	return out;
}
