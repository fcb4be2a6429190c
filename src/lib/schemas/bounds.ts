import { z } from 'zod';

/**
 * Sane bounds for what locates a sounding, checked at every entry point (uploads, the API, forms) so that
 * no stored value can overflow the geometry (a squared distance of 1e160 is already Infinity).
 *
 * - Coordinates (easting, northing, chainage, section-line points): |v| ≤ 1e8 in the project's length unit.
 *   Projected grids stay far inside it: UTM eastings are below 1e6 m and northings below 1e7 m; zone-prefixed
 *   eastings (e.g. 32 500 000 m) and US state-plane feet below 1e8 (common practice).
 * - Elevations (ground, groundwater, contacts, zone boundaries): |v| ≤ 30 000 in the project's unit — the
 *   Earth's surface lies within about −430 m and +8 850 m (29 000 ft), so one bound serves m and ft.
 * - Depth below ground: 0–1 000 m; CPTs rarely pass 100 m.
 * - Readings per sounding: at most 100 000 (a 100 m sounding at 1 mm spacing; 1–2 cm is usual).
 * - Sounding names: at most 100 characters.
 */
export const COORDINATE_LIMIT = 1e8;
export const ELEVATION_LIMIT = 30_000;
export const DEPTH_LIMIT_M = 1000;
export const READINGS_PER_SOUNDING_MAX = 100_000;
export const SOUNDING_NAME_MAX = 100;

/** Why a value is out of bounds, or null when it is within them. */
export function outOfBounds(value: number, limit: number, what: string): string | null {
	if (!Number.isFinite(value)) return `${what} must be a finite number`;
	return Math.abs(value) <= limit ? null : `${what} ${value} is outside ±${limit.toLocaleString('en-US')}`;
}

const finiteNumber = (label: string) =>
	z.number({ error: `${label} must be a number.` }).refine(Number.isFinite, { error: `${label} must be finite.` });

/** An easting, northing or chainage within ±COORDINATE_LIMIT. */
export const coordinate = (label: string) =>
	finiteNumber(label).refine((v) => Math.abs(v) <= COORDINATE_LIMIT, { error: `${label} must lie within ±100,000,000.` });

/** An elevation within ±ELEVATION_LIMIT. */
export const elevation = (label: string) =>
	finiteNumber(label).refine((v) => Math.abs(v) <= ELEVATION_LIMIT, { error: `${label} must lie within ±30,000.` });
