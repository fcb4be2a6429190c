/** Where a unit's top at a sounding comes from. */
export type ContactSource = 'measured' | 'interpolated' | 'ground';

/** A stored contact: the top elevation, and whether it was interpolated from neighbouring soundings. */
export interface StoredTop {
	top: number;
	interpolated: boolean;
}

/**
 * A sounding's unit tops as the site model uses them: the stored contacts as they are, and the top unit (the
 * first of `unitIds`, in stacking order) starting at the ground surface wherever no top is stored for it, so
 * nobody types the ground elevation at every sounding. A unit absent at the sounding has no entry; the top unit
 * is never absent, but where the next unit is entered at the ground surface it has no thickness there.
 * Not mutating.
 */
export function effectiveTops(
	unitIds: readonly string[],
	stored: ReadonlyMap<string, StoredTop>,
	groundElevation: number
): Map<string, { top: number; source: ContactSource }> {
	const out = new Map<string, { top: number; source: ContactSource }>();
	unitIds.forEach((id, k) => {
		const s = stored.get(id);
		if (s) out.set(id, { top: s.top, source: s.interpolated ? 'interpolated' : 'measured' });
		else if (k === 0) out.set(id, { top: groundElevation, source: 'ground' });
	});
	return out;
}
