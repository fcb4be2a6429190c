import exp from '@stdlib/math-base-special-exp';
import sin from '@stdlib/math-base-special-sin';
import cos from '@stdlib/math-base-special-cos';
import type { Structure, StructureType, VariogramModel } from '../types';

/**
 * The plan rotation of a model: sine and cosine of its azimuth. The major axis points along
 * (sin az, cos az) in (x, y), i.e. `azimuth` degrees clockwise from +y (north).
 */
export interface PlanRotation {
	sin: number;
	cos: number;
}

/** A model prepared for repeated evaluation (validated once, rotation precomputed). */
export interface CompiledVariogram {
	/** Total sill: the sum of all structures' sills, nugget included. */
	sill: number;
	gamma(dx: number, dy: number, dz: number): number;
	covariance(dx: number, dy: number, dz: number): number;
}

const DEG = Math.PI / 180;
const TYPES: readonly StructureType[] = ['nugget', 'spherical', 'exponential', 'gaussian'];

/**
 * The rotation of the plan axes for an azimuth in degrees clockwise from +y.
 * @throws {TypeError} if azimuth is not a finite number
 */
export function planRotation(azimuth: number): PlanRotation {
	if (typeof azimuth !== 'number' || !Number.isFinite(azimuth)) throw new TypeError('azimuth must be a finite number');
	const a = azimuth * DEG;
	return { sin: sin(a), cos: cos(a) };
}

/**
 * Anisotropic reduced distance of a separation (dx, dy, dz) for one structure:
 * sqrt((u/rangeMajor)² + (v/rangeMinor)² + (dz/rangeVertical)²), with u along the major horizontal axis
 * and v perpendicular to it in plan (geometric anisotropy; Deutsch & Journel 1998, ch. II).
 * u = dx·sin(az) + dy·cos(az), v = dx·cos(az) − dy·sin(az).
 * Inner-loop helper: it does not validate its arguments.
 */
export function reducedDistance(
	s: Pick<Structure, 'rangeMajor' | 'rangeMinor' | 'rangeVertical'>,
	rot: PlanRotation,
	dx: number,
	dy: number,
	dz: number
): number {
	const u = (dx * rot.sin + dy * rot.cos) / s.rangeMajor;
	const v = (dx * rot.cos - dy * rot.sin) / s.rangeMinor;
	const w = dz / s.rangeVertical;
	return Math.sqrt(u * u + v * v + w * w);
}

/**
 * Unit-sill variogram of a structure family at reduced distance r = h / a (practical-range forms,
 * Deutsch & Journel 1998): spherical 1.5r − 0.5r³ for r < 1 and 1 beyond; exponential 1 − exp(−3r);
 * Gaussian 1 − exp(−3r²); nugget 0 at r = 0 and 1 at any r > 0.
 */
export function unitGamma(type: StructureType, r: number): number {
	if (r === 0) return 0;
	switch (type) {
		case 'nugget':
			return 1;
		case 'spherical':
			return r >= 1 ? 1 : r * (1.5 - 0.5 * r * r);
		case 'exponential':
			return 1 - exp(-3 * r);
		case 'gaussian':
			return 1 - exp(-3 * r * r);
	}
}

/** Total sill of a model: the sum of its structures' sills, nugget included. */
export function totalSill(model: VariogramModel): number {
	let s = 0;
	for (const st of model.structures) s += st.sill;
	return s;
}

/**
 * Checks a model's shape and ranges once, at a public boundary.
 * @throws {TypeError} on a malformed model or an unknown structure type
 * @throws {RangeError} on a negative or non-finite sill, or a non-positive range of a non-nugget structure
 */
export function validateVariogramModel(model: VariogramModel): void {
	if (model === null || typeof model !== 'object' || !Array.isArray(model.structures)) {
		throw new TypeError('model must have a structures array');
	}
	if (typeof model.azimuth !== 'number' || !Number.isFinite(model.azimuth)) {
		throw new TypeError('azimuth must be a finite number');
	}
	for (const s of model.structures) {
		if (s === null || typeof s !== 'object' || !TYPES.includes(s.type)) throw new TypeError('unknown structure type');
		if (!(s.sill >= 0) || !Number.isFinite(s.sill)) throw new RangeError('sill must be finite and >= 0');
		if (s.type === 'nugget') continue;
		// Infinity is allowed: an axis along which the structure does not vary (e.g. the minor axis of a section).
		if (!(s.rangeMajor > 0) || !(s.rangeMinor > 0) || !(s.rangeVertical > 0)) {
			throw new RangeError('ranges must be > 0');
		}
	}
}

/**
 * Validates a model once and returns fast gamma/covariance closures for inner loops (kriging systems).
 * @throws {TypeError} {RangeError} as validateVariogramModel
 */
export function compileVariogram(model: VariogramModel): CompiledVariogram {
	validateVariogramModel(model);
	const rot = planRotation(model.azimuth);
	const structures = model.structures.map((s) => ({ ...s }));
	const sill = totalSill(model);
	const g = (dx: number, dy: number, dz: number): number => {
		if (dx === 0 && dy === 0 && dz === 0) return 0;
		let sum = 0;
		for (const s of structures) {
			sum += s.type === 'nugget' ? s.sill : s.sill * unitGamma(s.type, reducedDistance(s, rot, dx, dy, dz));
		}
		return sum;
	};
	return { sill, gamma: g, covariance: (dx, dy, dz) => sill - g(dx, dy, dz) };
}

/**
 * Variogram γ(h) of a model at separation (dx, dy, dz): the sum over its structures of
 * sill · unitGamma(type, reduced distance). Practical ranges: spherical reaches its sill at the range,
 * exponential is c(1 − exp(−3h/a)), Gaussian c(1 − exp(−3h²/a²)); a nugget is 0 at h = 0 and its sill at
 * any h > 0, its ranges ignored (Deutsch & Journel 1998; Journel & Huijbregts 1978).
 * Geometric anisotropy as in reducedDistance. A 2D section (all y = 0) uses rangeMajor = rangeMinor.
 * @throws {TypeError} {RangeError} on an invalid model (see validateVariogramModel)
 */
export function gamma(model: VariogramModel, dx: number, dy: number, dz: number): number {
	return compileVariogram(model).gamma(dx, dy, dz);
}

/**
 * Covariance C(h) = total sill − γ(h) of a model at separation (dx, dy, dz) (second-order stationarity).
 * @throws {TypeError} {RangeError} on an invalid model (see validateVariogramModel)
 */
export function covariance(model: VariogramModel, dx: number, dy: number, dz: number): number {
	return compileVariogram(model).covariance(dx, dy, dz);
}
