/** A number typed in a field: null for an empty field, NaN for text that is not a number (a decimal comma and a minus sign − are read). */
export function parseNumber(text: string | number | null | undefined): number | null {
	if (text === null || text === undefined) return null;
	if (typeof text === 'number') return text;
	const t = text.trim().replace(',', '.').replace('−', '-');
	return t === '' ? null : Number(t);
}

/** Several fields at once: their numbers, and the names of those that are empty or not finite numbers. */
export function parseNumbers<K extends string>(texts: Record<K, string>): { values: Record<K, number>; invalid: K[] } {
	const values = {} as Record<K, number>;
	const invalid: K[] = [];
	for (const key of Object.keys(texts) as K[]) {
		const v = parseNumber(texts[key]);
		if (v === null || !Number.isFinite(v)) invalid.push(key);
		else values[key] = v;
	}
	return { values, invalid };
}
