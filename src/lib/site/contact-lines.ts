/**
 * A unit's top drawn along the section: the runs of consecutive stations (in the order given, by chainage)
 * where the unit is present, as [chainage, elevation] polylines. A station where it is absent (null) breaks
 * the line, since the pinch-out lies somewhere between two soundings and cannot be placed. Not mutating.
 */
export function contactLines(stations: ReadonlyArray<{ chainage: number; topElevation: number | null }>): [number, number][][] {
	const lines: [number, number][][] = [];
	let run: [number, number][] = [];
	for (const s of stations) {
		if (s.topElevation === null) {
			if (run.length) lines.push(run);
			run = [];
		} else run.push([s.chainage, s.topElevation]);
	}
	if (run.length) lines.push(run);
	return lines;
}
