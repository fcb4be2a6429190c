import { CptParseError } from '../cpt/errors';
import { splitQuoted } from '../cpt/text';
import { locateHeader, trimTrailing, type Delimiter } from '../cpt/delimitedText';
import { headerKey, splitName } from '../cpt/headerNames';
import type { MeshMapping } from './parse-mesh';

/** The column-mapping step of a mesh upload: the header, the first rows and a guessed mapping. */
export interface MeshPreview {
	delimiter: Delimiter;
	headers: string[];
	rows: string[][];
	/** Non-blank lines after the header. */
	rowCount: number;
	guess: Partial<MeshMapping> & { delimiter: Delimiter };
}

/**
 * Reads the header and first rows of a mesh's centroid file and guesses which column is which, by name (case,
 * spaces and punctuation ignored): the id (id, element, elem, eid, number …), x (x, chainage, station, easting,
 * xc …), y (y, northing, yc …), the elevation (z, elevation, elev, level, zc …) and a group (group, material,
 * mat, zone, region, set …). In 2D a file with x and y but no elevation column is read as x = chainage and
 * y = elevation, as 2D meshes are usually drawn. Rules of our own; the guess is for a person to confirm.
 * @throws CptParseError for an empty file or a header without a delimiter
 */
export function previewMesh(text: string, { file, geometry, rows: wanted = 10 }: { file?: string; geometry: '2d' | '3d'; rows?: number }): MeshPreview {
	const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
	if (body.trim() === '') throw new CptParseError({ code: 'empty-file', file, line: 1, detail: 'file is empty' });
	// The first 200 kB are enough to read the header and the first rows; the rows are counted over the whole text.
	const lines = body.slice(0, 200_000).split(/\r\n|\n|\r/);
	const { header, delimiter } = locateHeader(lines, file);
	const headers = splitQuoted(lines[header], delimiter);
	if (!headers) throw new CptParseError({ code: 'malformed', file, line: header + 1, detail: 'a quoted field is not closed' });
	trimTrailing(headers, 0);
	const rows: string[][] = [];
	for (let i = header + 1; i < lines.length - 1 && rows.length < wanted; i++) {
		if (lines[i].trim() === '') continue;
		const f = splitQuoted(lines[i], delimiter);
		if (f) rows.push(trimTrailing(f, headers.length));
	}
	let rowCount = 0;
	let seenHeader = -1;
	for (let i = 0, start = 0; i <= body.length; i++) {
		const c = i < body.length ? body.charCodeAt(i) : 10;
		if (c !== 10 && c !== 13) continue;
		if (c === 13 && body.charCodeAt(i + 1) === 10) continue;
		seenHeader++;
		if (seenHeader > header && body.slice(start, i).trim() !== '') rowCount++;
		start = i + 1;
	}

	const keys = headers.map((h) => headerKey(splitName(h).key));
	const find = (re: RegExp, not: Set<string>): string | undefined => {
		const k = keys.findIndex((key, i) => re.test(key) && !not.has(headers[i]));
		return k >= 0 ? headers[k] : undefined;
	};
	const taken = new Set<string>();
	const pick = (re: RegExp) => {
		const h = find(re, taken);
		if (h !== undefined) taken.add(h);
		return h;
	};
	const id = pick(/^(id|elementid|element|elem|elemid|eid|elementno|elementnumber|number|no|nr|n)$/);
	const z = pick(/^(z|zc|zcentroid|centroidz|elevation|elev|level|el|zcoord)$/);
	const x = pick(geometry === '2d' ? /^(x|xc|xcentroid|centroidx|chainage|ch|station|distance|xcoord)$/ : /^(x|xc|xcentroid|centroidx|easting|east|e|xcoord)$/);
	let y = pick(/^(y|yc|ycentroid|centroidy|northing|north|n|ycoord)$/);
	const group = pick(/^(group|material|mat|matid|materialid|zone|region|set|part|domain|layer|unit)$/);
	const guess: MeshPreview['guess'] = { delimiter };
	if (id !== undefined) guess.id = id;
	if (x !== undefined) guess.x = x;
	if (geometry === '2d') {
		if (z !== undefined) guess.z = z;
		else if (y !== undefined) {
			guess.z = y;
			y = undefined;
		}
	} else {
		if (y !== undefined) guess.y = y;
		if (z !== undefined) guess.z = z;
	}
	if (group !== undefined) guess.group = group;
	return { delimiter, headers, rows, rowCount, guess };
}
