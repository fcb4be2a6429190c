import type { Recipe } from './schema';
import { float64Column, int32Column, withTypedPoints } from './typed-points';

/**
 * The recipe of a stored document (its canonical JSON, see canonicalJson), with a points target's columns as typed
 * arrays (withTypedPoints). Not validated: a stored document was validated when it was stored, and its hash names it.
 *
 * A mesh recipe's document is mostly its four columns of up to two million numbers each. They are read number by
 * number straight into their typed arrays, so parsing leaves no large garbage: JSON.parse's arrays (8 bytes a number)
 * and the typed copies made of them are large objects, which V8 frees only at a full collection, and on a million
 * targets the server's resident memory grew by some 90 MB for the parse before one came (measured). Number() of a
 * JSON number's text is the double JSON.parse gives (both round the decimal correctly; ECMA-262 StringToNumber).
 *
 * This relies on canonical JSON alone: the targets are the root's last member (keys sorted), the columns are its
 * members in key order, a column holds only numbers and commas, so the markers below cannot occur inside a string.
 * Any other text (not canonical, or not points) is parsed whole by JSON.parse, with the same result.
 * @throws {SyntaxError} as JSON.parse on text that is not JSON; {RangeError} on a column entry that is not a number
 */
export function parseRecipeDocument(text: string, { shared = false }: { shared?: boolean } = {}): Recipe {
	const head = ',"targets":{"domain":[';
	const at = text.lastIndexOf(head);
	const marks = ['],"kind":"points","x":[', '],"y":[', '],"z":[', ']}}'];
	const bounds = [at + head.length];
	for (const m of marks) {
		const i = at < 0 ? -1 : text.indexOf(m, bounds[bounds.length - 1]);
		if (i < 0) return withTypedPoints(JSON.parse(text) as Recipe, { shared });
		bounds.push(i, i + m.length);
	}
	if (bounds[bounds.length - 1] !== text.length) return withTypedPoints(JSON.parse(text) as Recipe, { shared });
	const column = <T extends Float64Array | Int32Array>(k: number, make: (n: number) => T) => numbers(text, bounds[2 * k], bounds[2 * k + 1], make);
	const f64 = (n: number) => float64Column(n, shared);
	const domain = column(0, (n) => int32Column(n, shared));
	const x = column(1, f64);
	const y = column(2, f64);
	const z = column(3, f64);
	if (y.length !== x.length || z.length !== x.length || domain.length !== x.length) throw new RangeError('point columns must have equal lengths');
	const rest = JSON.parse(`${text.slice(0, at)}}`) as Omit<Recipe, 'targets'>;
	return { ...rest, targets: { kind: 'points', x, y, z, domain } } as Recipe;
}

/** The comma-separated numbers of text[from, to) into an array made for their count. */
function numbers<T extends Float64Array | Int32Array>(text: string, from: number, to: number, make: (n: number) => T): T {
	if (to === from) return make(0);
	let n = 1;
	for (let i = text.indexOf(',', from); i >= 0 && i < to; i = text.indexOf(',', i + 1)) n++;
	const out = make(n);
	let start = from;
	let k = 0;
	for (let i = from; i <= to; i++) {
		if (i < to && text.charCodeAt(i) !== 44) continue;
		const token = text.slice(start, i);
		const v = Number(token);
		if (token === '' || v !== v) throw new RangeError(`not a number in a point column: ${JSON.stringify(token.slice(0, 24))}`);
		out[k++] = v;
		start = i + 1;
	}
	return out;
}
