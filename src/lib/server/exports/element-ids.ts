/**
 * A mesh's element ids as the database stores them (one per line, in element order), read by position without
 * splitting: the text and where each line starts. A million ids of seven characters take about 11 MB this way,
 * where a million separate strings take about 50 MB, and an export of a large mesh holds them for its whole run.
 */
export class ElementIds {
	/** Where line i starts in the text; starts[length] is one past the text's end. */
	private readonly starts: Int32Array;

	/** @param text ids joined by '\n' (no id holds a line break; the mesh reader refuses one) */
	constructor(private readonly text: string) {
		let n = 1;
		for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) n++;
		const starts = new Int32Array(n + 1);
		let k = 1;
		for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) starts[k++] = i + 1;
		starts[n] = text.length + 1;
		this.starts = starts;
	}

	/** Number of ids. */
	get length(): number {
		return this.starts.length - 1;
	}

	/** Id of element i (0 ≤ i < length). */
	at(i: number): string {
		return this.text.slice(this.starts[i], this.starts[i + 1] - 1);
	}
}

/** Each element's group: the mesh's group names and, per element, the index of its group's name. */
export interface ElementGroups {
	names: readonly string[];
	index: Int32Array;
}
