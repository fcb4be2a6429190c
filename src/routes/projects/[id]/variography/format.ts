/** A number to `digits` significant figures for tables ("–" for none, NaN or ±Infinity). */
export function figure(v: number | null | undefined, digits = 3): string {
	return v === null || v === undefined || !Number.isFinite(v) ? '–' : Number(v.toPrecision(digits)).toString();
}

/** A date and time as "Dec 2, 2026, 3:04 PM" in the reader's locale. */
export function dateTime(iso: string): string {
	return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}
