/**
 * Legacy VTK files (Kitware, "VTK File Formats": "# vtk DataFile Version 3.0", BINARY, big-endian) for viewing
 * fields in common open viewers: a grid as a RECTILINEAR_GRID whose cells carry the values (CELL_DATA; the cell
 * edges along each axis as coordinates, so variable cell heights show as they are), a mesh as an UNSTRUCTURED_GRID
 * of its element centroids, one vertex cell (VTK_VERTEX) each, carrying the values as POINT_DATA (a point cloud
 * that every reader of the legacy format takes, where some take no POLYDATA). A 2D section lies in the x–z plane
 * (chainage along x, elevation along z, y = 0). Not-simulated targets hold NaN. Arrays are written one at a time,
 * so a file of many realizations streams without holding them all.
 */
import type { ExportTargets } from './table';

const encoder = new TextEncoder();
/** Doubles converted to big-endian bytes per piece. */
const PIECE = 65536;

/** A name VTK readers take for an array: letters, digits and underscores. */
export function vtkName(name: string): string {
	const s = name.replace(/[^A-Za-z0-9]+/g, '_').replace(/^_+|_+$/g, '');
	return s === '' ? 'values' : s;
}

/** Big-endian doubles, in pieces. */
function* doublesBE(values: ArrayLike<number>): Generator<Uint8Array> {
	for (let start = 0; start < values.length; start += PIECE) {
		const end = Math.min(values.length, start + PIECE);
		const bytes = new Uint8Array((end - start) * 8);
		const view = new DataView(bytes.buffer);
		for (let i = start; i < end; i++) view.setFloat64((i - start) * 8, values[i], false);
		yield bytes;
	}
}

/** Big-endian 32-bit integers, in pieces. */
function* intsBE(values: ArrayLike<number>): Generator<Uint8Array> {
	for (let start = 0; start < values.length; start += PIECE) {
		const end = Math.min(values.length, start + PIECE);
		const bytes = new Uint8Array((end - start) * 4);
		const view = new DataView(bytes.buffer);
		for (let i = start; i < end; i++) view.setInt32((i - start) * 4, values[i], false);
		yield bytes;
	}
}

/** The file's head and geometry, up to and including the CELL_DATA or POINT_DATA line. */
export function* vtkGeometry(t: ExportTargets, title: string): Generator<Uint8Array> {
	const line = (s: string) => encoder.encode(s + '\n');
	yield line('# vtk DataFile Version 3.0');
	yield line(title.replace(/[\r\n]+/g, ' ').slice(0, 255));
	yield line('BINARY');
	const n = t.domain.length;
	if (t.grid) {
		const { x, y, z } = t.grid.edges;
		yield line('DATASET RECTILINEAR_GRID');
		yield line(`DIMENSIONS ${x.length} ${y.length} ${z.length}`);
		for (const [axis, list] of [['X', x], ['Y', y], ['Z', z]] as const) {
			yield line(`${axis}_COORDINATES ${list.length} double`);
			yield* doublesBE(list);
			yield line('');
		}
		yield line(`CELL_DATA ${n}`);
		return;
	}
	yield line('DATASET UNSTRUCTURED_GRID');
	yield line(`POINTS ${n} double`);
	const xyz = new Float64Array(3 * n);
	for (let i = 0; i < n; i++) {
		xyz[3 * i] = t.x[i];
		xyz[3 * i + 1] = t.geometry === '2d' ? 0 : t.y[i];
		xyz[3 * i + 2] = t.z[i];
	}
	yield* doublesBE(xyz);
	yield line('');
	yield line(`CELLS ${n} ${2 * n}`);
	const cells = new Int32Array(2 * n);
	for (let i = 0; i < n; i++) {
		cells[2 * i] = 1;
		cells[2 * i + 1] = i;
	}
	yield* intsBE(cells);
	yield line('');
	yield line(`CELL_TYPES ${n}`);
	// VTK_VERTEX (1): each element centroid is a cell of one point.
	yield* intsBE(new Int32Array(n).fill(1));
	yield line('');
	yield line(`POINT_DATA ${n}`);
}

/** One data array (SCALARS … LOOKUP_TABLE default): doubles, or 32-bit integers (the domain index). */
export function* vtkArray(name: string, values: ArrayLike<number>, type: 'double' | 'int' = 'double'): Generator<Uint8Array> {
	yield encoder.encode(`SCALARS ${vtkName(name)} ${type} 1\nLOOKUP_TABLE default\n`);
	yield* type === 'double' ? doublesBE(values) : intsBE(values);
	yield encoder.encode('\n');
}
