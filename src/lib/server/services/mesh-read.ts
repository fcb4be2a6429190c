/**
 * The pure half of a mesh upload: bytes to element centroids, checked, in the compact form they are stored in
 * (ids joined by line breaks, coordinates as Float64Arrays, groups as indices into a list). Runs in the mesh
 * worker thread (mesh.worker.ts) so a 2 000 000-element file never blocks the server. Relative imports only.
 */
import { CptParseError } from '../../cpt/errors';
import { parseMeshCsv, type MeshMapping } from '../../mesh/parse-mesh';

export interface MeshReadRequest {
	file: string;
	bytes: Uint8Array;
	mapping: MeshMapping;
	geometry: '2d' | '3d';
}

export interface ReadMesh {
	elements: number;
	ids: string;
	x: Float64Array;
	y: Float64Array | null;
	z: Float64Array;
	groupIndex: Int32Array | null;
	groups: { name: string; elements: number }[];
	bounds: { x: [number, number]; y: [number, number] | null; z: [number, number] };
}

export type MeshReadResult = { ok: true; mesh: ReadMesh } | { ok: false; problem: { file: string; line?: number; column?: string; message: string; code: string } };

export function readMeshUpload({ file, bytes, mapping, geometry }: MeshReadRequest): MeshReadResult {
	try {
		const text = new TextDecoder('utf-8').decode(bytes);
		const parsed = parseMeshCsv(text, mapping, { file, geometry });
		let groupIndex: Int32Array | null = null;
		const groups: { name: string; elements: number }[] = [];
		if (parsed.group) {
			const index = new Map<string, number>();
			groupIndex = new Int32Array(parsed.ids.length);
			parsed.group.forEach((g, i) => {
				let k = index.get(g);
				if (k === undefined) {
					k = groups.length;
					index.set(g, k);
					groups.push({ name: g, elements: 0 });
				}
				groups[k].elements++;
				groupIndex![i] = k;
			});
		}
		const extent = (v: Float64Array): [number, number] => {
			let lo = Infinity;
			let hi = -Infinity;
			for (const a of v) {
				if (a < lo) lo = a;
				if (a > hi) hi = a;
			}
			return [lo, hi];
		};
		if (parsed.ids.some((id) => /[\r\n]/.test(id))) throw new CptParseError({ code: 'malformed', file, detail: 'an element id holds a line break' });
		return {
			ok: true,
			mesh: {
				elements: parsed.ids.length,
				ids: parsed.ids.join('\n'),
				x: parsed.x,
				y: parsed.y,
				z: parsed.z,
				groupIndex,
				groups,
				bounds: { x: extent(parsed.x), y: parsed.y ? extent(parsed.y) : null, z: extent(parsed.z) }
			}
		};
	} catch (err) {
		if (err instanceof CptParseError) return { ok: false, problem: { file, line: err.line, column: err.column, message: err.message, code: err.code } };
		throw err;
	}
}
