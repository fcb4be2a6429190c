import { formatDateTime } from '$lib/dates';
import type { PathOrder } from '$lib/geostat';

/** How a path order reads in the recipe form and its provenance. */
export const PATH_LABELS: Record<PathOrder, string> = {
	random: 'random',
	multigrid: 'coarse grids first',
	'random-constant': 'random, one for all realizations',
	'multigrid-constant': 'coarse grids first, one for all realizations'
};

/** A number to `digits` significant figures for tables and readouts ("–" for none, NaN or ±Infinity). */
export function figure(v: number | null | undefined, digits = 4): string {
	return v === null || v === undefined || !Number.isFinite(v) ? '–' : Number(v.toPrecision(digits)).toString();
}

/** A date and time as the app writes them ($lib/dates): "2 Dec 2026, 15:04". */
export function dateTime(iso: string): string {
	return formatDateTime(iso);
}

/** A duration as "12 s" or "3 min 20 s". */
export function duration(ms: number): string {
	const s = Math.max(0, Math.round(ms / 1000));
	return s < 60 ? `${s} s` : `${Math.floor(s / 60)} min ${s % 60} s`;
}
