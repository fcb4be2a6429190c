import { planRotation } from '../variogram/model';
import type { VariogramModel } from '../types';

/**
 * A search ellipsoid: semi-axes along the model's major and minor plan axes and the vertical, and the
 * plan rotation of its azimuth. `empty` marks a model without spatial structure (pure nugget), whose
 * neighbourhood holds nothing but the target itself.
 */
export interface SearchEllipsoid {
	major: number;
	minor: number;
	vertical: number;
	sin: number;
	cos: number;
	empty: boolean;
}

/**
 * The search ellipsoid of a variogram model: the given radii, or by default the largest range of any
 * non-nugget structure along each axis (common practice: search as far as the data are correlated;
 * Deutsch & Journel 1998, ch. V). An infinite semi-axis (a 2D section's minor axis) is allowed.
 * @throws {RangeError} if a radius is not > 0
 */
export function searchEllipsoid(
	model: VariogramModel,
	radius?: { major: number; minor: number; vertical: number }
): SearchEllipsoid {
	const rot = planRotation(model.azimuth);
	let major = 0;
	let minor = 0;
	let vertical = 0;
	let empty = true;
	for (const s of model.structures) {
		if (s.type === 'nugget' || s.sill === 0) continue;
		empty = false;
		major = Math.max(major, s.rangeMajor);
		minor = Math.max(minor, s.rangeMinor);
		vertical = Math.max(vertical, s.rangeVertical);
	}
	if (radius !== undefined) {
		if (!(radius.major > 0) || !(radius.minor > 0) || !(radius.vertical > 0)) throw new RangeError('search radii must be > 0');
		({ major, minor, vertical } = radius);
	}
	return { major, minor, vertical, sin: rot.sin, cos: rot.cos, empty };
}

/**
 * Coordinates of a point in the ellipsoid's normalised frame, where the ellipsoid is the unit sphere:
 * u along the major axis / major, v along the minor axis / minor, w = z / vertical. Writes into `out`.
 */
export function normalisedCoordinates(e: SearchEllipsoid, x: number, y: number, z: number, out: Float64Array, at = 0): void {
	out[at] = e.major === Infinity ? 0 : (x * e.sin + y * e.cos) / e.major;
	out[at + 1] = e.minor === Infinity ? 0 : (x * e.cos - y * e.sin) / e.minor;
	out[at + 2] = e.vertical === Infinity ? 0 : z / e.vertical;
}
