// Private helpers shared by the writers; not part of the public API.

/** A reading as fixed-point text, or `missing` for NaN. −0 prints as 0. */
export function fixed(v: number, decimals: number, missing: string): string {
	if (!Number.isFinite(v)) return missing;
	const s = v.toFixed(decimals);
	return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

/** Checks a writer's decimals option. */
export function checkDecimals(d: number, what: string): number {
	if (!Number.isInteger(d) || d < 0 || d > 20) throw new RangeError(`${what} decimals must be an integer within 0–20`);
	return d;
}

/** A text field on one line: line breaks become spaces. */
export function oneLine(s: string): string {
	return s.replace(/[\r\n]+/g, ' ');
}
