// Private helpers shared by the writers; not part of the public API.
import type { ParsedSounding } from './types';

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

/** Checks that a sounding's columns have equal lengths. */
export function checkColumns(s: ParsedSounding): void {
	const n = s.depth.length;
	if (s.qc.length !== n || s.fs.length !== n || (s.u2 && s.u2.length !== n)) throw new RangeError('columns must have equal lengths');
}

/** Checks a multi-sounding writer's input: equal column lengths and unique ids. */
export function checkSoundings(soundings: ParsedSounding[]): void {
	const ids = new Set<string>();
	for (const s of soundings) {
		checkColumns(s);
		if (ids.has(s.id)) throw new RangeError('sounding ids must be unique');
		ids.add(s.id);
	}
}

/** A text field on one line: line breaks become spaces. */
export function oneLine(s: string): string {
	return s.replace(/[\r\n]+/g, ' ');
}
