/**
 * Canonical JSON of a plain value: object keys sorted by UTF-16 code units at every depth, no whitespace,
 * numbers in ECMAScript's shortest round-trip form (Number.prototype.toString, as JSON.stringify writes
 * them), undefined object members left out. Two values that differ only in key order serialise alike,
 * so their hashes agree (the idea of RFC 8785, JSON Canonicalization Scheme, for the values recipes hold).
 * −0 serialises as 0, as in JSON.stringify. Typed arrays serialise as arrays of numbers.
 * Does not mutate its input.
 * @throws {RangeError} on a non-finite number (JSON has none)
 * @throws {TypeError} on a function, symbol, bigint or a cyclic structure
 */
export function canonicalJson(value: unknown): string {
	return write(value, new Set());
}

function write(v: unknown, seen: Set<object>): string {
	if (v === null) return 'null';
	switch (typeof v) {
		case 'number':
			if (!Number.isFinite(v)) throw new RangeError('numbers must be finite');
			return JSON.stringify(v);
		case 'string':
			return JSON.stringify(v);
		case 'boolean':
			return v ? 'true' : 'false';
		case 'object':
			break;
		default:
			throw new TypeError(`cannot serialise a ${typeof v}`);
	}
	const o = v as object;
	if (seen.has(o)) throw new TypeError('cyclic structure');
	seen.add(o);
	let out: string;
	if (Array.isArray(o) || ArrayBuffer.isView(o)) {
		const arr = o as ArrayLike<unknown>;
		const parts: string[] = [];
		for (let i = 0; i < arr.length; i++) parts.push(arr[i] === undefined ? 'null' : write(arr[i], seen));
		out = `[${parts.join(',')}]`;
	} else {
		const rec = o as Record<string, unknown>;
		const keys = Object.keys(rec).filter((k) => rec[k] !== undefined).sort();
		out = `{${keys.map((k) => `${JSON.stringify(k)}:${write(rec[k], seen)}`).join(',')}}`;
	}
	seen.delete(o);
	return out;
}
