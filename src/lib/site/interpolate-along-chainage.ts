/** A value known at a chainage; NaN marks a unit absent at that sounding. */
export interface Station {
	chainage: number;
	value: number;
}

/**
 * Linear interpolation along chainage between the two neighbouring stations; constant beyond the first
 * and last station. Where either neighbour is NaN (the unit is absent there) the result is NaN: the
 * pinch-out lies somewhere between them and linear interpolation cannot place it. Stations need not be
 * sorted; at equal chainages the first given wins. Not mutating.
 * @throws {RangeError} on no stations or a non-finite chainage
 */
export function interpolateAlongChainage(stations: ReadonlyArray<Station>, chainage: number): number {
	if (stations.length === 0) throw new RangeError('no stations');
	if (!Number.isFinite(chainage)) throw new RangeError('chainage must be finite');
	const sorted = sortStations(stations);
	if (chainage <= sorted[0].chainage) return sorted[0].value;
	const last = sorted[sorted.length - 1];
	if (chainage >= last.chainage) return last.value;
	let lo = 0;
	let hi = sorted.length - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (sorted[mid].chainage <= chainage) lo = mid;
		else hi = mid;
	}
	const a = sorted[lo];
	const b = sorted[hi];
	if (chainage === a.chainage) return a.value;
	const t = (chainage - a.chainage) / (b.chainage - a.chainage);
	return a.value + t * (b.value - a.value);
}

function sortStations(stations: ReadonlyArray<Station>): Station[] {
	for (const s of stations) if (!Number.isFinite(s.chainage)) throw new RangeError('chainage must be finite');
	const sorted = stations.map((s, i) => ({ s, i })).sort((a, b) => a.s.chainage - b.s.chainage || a.i - b.i).map(({ s }) => s);
	return sorted.filter((s, k) => k === 0 || s.chainage !== sorted[k - 1].chainage);
}
