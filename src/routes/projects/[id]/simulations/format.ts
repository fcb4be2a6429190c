/** A number to `digits` significant figures for tables and readouts ("–" for none, NaN or ±Infinity). */
export function figure(v: number | null | undefined, digits = 4): string {
	return v === null || v === undefined || !Number.isFinite(v) ? '–' : Number(v.toPrecision(digits)).toString();
}

/** A date and time as "Dec 2, 2026, 3:04 PM" in the reader's locale. */
export function dateTime(iso: string): string {
	return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

/** A duration as "12 s" or "3 min 20 s". */
export function duration(ms: number): string {
	const s = Math.max(0, Math.round(ms / 1000));
	return s < 60 ? `${s} s` : `${Math.floor(s / 60)} min ${s % 60} s`;
}
