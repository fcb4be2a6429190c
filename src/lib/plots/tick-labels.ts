/** A tick label placed on an axis: where, what, and how it is anchored. */
export interface PlacedLabel {
	x: number;
	text: string;
	anchor: 'start' | 'middle' | 'end';
}

/**
 * Tick labels that stay inside their axis span [left, right] and do not run into each other: each is centred
 * on its tick unless that would cross an end of the span, where it is anchored to the end instead; then labels
 * that would overlap the previous one (with `gap` px between) are dropped, keeping the first and, where it
 * fits, the last. Widths are estimated as characters × `charWidth` (tabular figures at the plots' 10 px).
 * Ticks must be in increasing x. Not mutating.
 */
export function fitTickLabels(
	ticks: ReadonlyArray<{ x: number; text: string }>,
	[left, right]: [number, number],
	{ charWidth = 5.8, gap = 4 }: { charWidth?: number; gap?: number } = {}
): PlacedLabel[] {
	const placed = ticks.map((t) => {
		const w = t.text.length * charWidth;
		const anchor: PlacedLabel['anchor'] = t.x - w / 2 < left ? 'start' : t.x + w / 2 > right ? 'end' : 'middle';
		const from = anchor === 'start' ? t.x : anchor === 'end' ? t.x - w : t.x - w / 2;
		return { label: { x: t.x, text: t.text, anchor }, from, to: from + w };
	});
	const kept: typeof placed = [];
	for (const p of placed) {
		const prev = kept[kept.length - 1];
		if (!prev || p.from >= prev.to + gap) kept.push(p);
		else if (p === placed[placed.length - 1] && kept.length > 1) {
			// The last tick closes the axis: keep it over the one before, if that one is not the first.
			const before = kept[kept.length - 2];
			if (p.from >= before.to + gap) kept[kept.length - 1] = p;
		}
	}
	return kept.map((p) => p.label);
}
