/** A number to `digits` significant figures for tables ("–" for none, NaN or ±Infinity). */
export function figure(v: number | null | undefined, digits = 3): string {
	return v === null || v === undefined || !Number.isFinite(v) ? '–' : Number(v.toPrecision(digits)).toString();
}

/** A date and time as the whole app writes them ("2 Dec 2026, 15:04"; $lib/dates). */
export { formatDateTime as dateTime } from '$lib/dates';
