import { describe, expect, it } from 'vitest';
import * as mesh from '../../src/lib/mesh/index';
import { parseMeshCsv, previewMesh, type MeshMapping } from '../../src/lib/mesh/index';
import { CptParseError } from '../../src/lib/cpt/index';

const mapping2d: MeshMapping = { id: 'element', x: 'x', z: 'y', group: 'material' };
const good = ['element,x,y,material', '1,0.5,-0.125,loose', '2,1.5,-0.125,loose', '', '3,0.5,-1.5,dense', ''].join('\n');

/** The CptParseError a call throws, for its line, column and message. */
function refusal(fn: () => unknown): CptParseError {
	try {
		fn();
	} catch (err) {
		if (err instanceof CptParseError) return err;
		throw err;
	}
	throw new Error('expected a CptParseError');
}

describe('src/lib/mesh/index.ts', () => {
	it('exports exactly the pinned names', () => {
		expect(Object.keys(mesh).sort()).toEqual(['MESH_ELEMENTS_MAX', 'MESH_FILE_BYTES_MAX', 'MESH_LABEL_MAX', 'parseMeshCsv', 'previewMesh'].sort());
	});
});

describe('parseMeshCsv(text, mapping, options)', () => {
	it('reads ids, coordinates and groups, skipping blank lines; 2D has no northings', () => {
		const m = parseMeshCsv(good, mapping2d, { geometry: '2d' });
		expect(m.ids).toEqual(['1', '2', '3']);
		expect(Array.from(m.x)).toEqual([0.5, 1.5, 0.5]);
		expect(Array.from(m.z)).toEqual([-0.125, -0.125, -1.5]);
		expect(m.y).toBeNull();
		expect(m.group).toEqual(['loose', 'loose', 'dense']);
	});

	it('reads 3D files, semicolons with decimal commas, CRLF and a byte-order mark', () => {
		const text = '\ufeffid;e;n;z\r\nA;10,5;20;-1,25\r\nB;11;21;-2\r\n';
		const m = parseMeshCsv(text, { id: 'id', x: 'e', y: 'n', z: 'z' }, { geometry: '3d' });
		expect([m.ids, Array.from(m.x), Array.from(m.y!), Array.from(m.z), m.group]).toEqual([['A', 'B'], [10.5, 11], [20, 21], [-1.25, -2], null]);
	});

	it('refuses a value that is not a number with its line and column', () => {
		const e = refusal(() => parseMeshCsv(good.replace('1.5,-0.125', '1.5,abc'), mapping2d, { file: 'mesh.csv', geometry: '2d' }));
		expect([e.code, e.line, e.column]).toEqual(['not-a-number', 3, 'y']);
		expect(e.message).toBe("mesh.csv: line 3, column y: 'abc' is not a number");
	});

	it('refuses missing values, duplicate ids, coordinates out of bounds and long labels, each where it is', () => {
		expect(refusal(() => parseMeshCsv(good.replace('3,0.5,-1.5', '3,,-1.5'), mapping2d, { geometry: '2d' }))).toMatchObject({ code: 'missing-value', line: 5, column: 'x' });
		expect(refusal(() => parseMeshCsv(good.replace('3,0.5', '2,0.5'), mapping2d, { geometry: '2d' }))).toMatchObject({ code: 'malformed', line: 5, column: 'element', detail: 'element 2 appears twice' });
		expect(refusal(() => parseMeshCsv(good.replace('-1.5', '-40000'), mapping2d, { geometry: '2d' }))).toMatchObject({ line: 5, column: 'y', detail: 'elevation -40000 is outside ±30,000' });
		expect(refusal(() => parseMeshCsv(good.replace(',dense', ',' + 'd'.repeat(65)), mapping2d, { geometry: '2d' }))).toMatchObject({ line: 5, column: 'material' });
		expect(refusal(() => parseMeshCsv(good.replace('2,1.5,-0.125,loose', '2,1.5,-0.125,'), mapping2d, { geometry: '2d' }))).toMatchObject({ code: 'missing-value', line: 3, column: 'material' });
		expect(refusal(() => parseMeshCsv('element,x,y\n"1,0.5,0\n', { id: 'element', x: 'x', z: 'y' }, { geometry: '2d' }))).toMatchObject({ code: 'malformed', line: 2 });
	});

	it('refuses a mapping to a column the header lacks, a 3D file without northings, an empty file and too many elements', () => {
		expect(refusal(() => parseMeshCsv(good, { ...mapping2d, z: 'elevation' }, { geometry: '2d' }))).toMatchObject({ code: 'missing-column', line: 1, column: 'elevation' });
		expect(refusal(() => parseMeshCsv(good, mapping2d, { geometry: '3d' }))).toMatchObject({ code: 'missing-column', line: 1 });
		expect(refusal(() => parseMeshCsv('  \n', mapping2d, { geometry: '2d' })).code).toBe('empty-file');
		expect(refusal(() => parseMeshCsv('element,x,y,material\n', mapping2d, { geometry: '2d' })).detail).toBe('the file lists no elements');
		expect(refusal(() => parseMeshCsv(good, mapping2d, { geometry: '2d', maxElements: 2 }))).toMatchObject({ line: 5, detail: 'the mesh has more than 2 elements' });
		expect(refusal(() => parseMeshCsv('a,b\n1,2\u0000', mapping2d, { geometry: '2d' })).code).toBe('binary-file');
	});

	it('does not mutate its mapping', () => {
		const m = { ...mapping2d };
		parseMeshCsv(good, m, { geometry: '2d' });
		expect(m).toEqual(mapping2d);
	});
});

describe('previewMesh(text, options)', () => {
	it('guesses id, chainage and elevation (y read as the elevation of a 2D mesh) and the group, and counts the rows', () => {
		const p = previewMesh(good, { geometry: '2d' });
		expect(p.headers).toEqual(['element', 'x', 'y', 'material']);
		expect(p.rowCount).toBe(3);
		expect(p.rows[0]).toEqual(['1', '0.5', '-0.125', 'loose']);
		expect(p.guess).toEqual({ delimiter: ',', id: 'element', x: 'x', z: 'y', group: 'material' });
	});

	it('keeps y as the northing in 3D and finds an elevation column by its name', () => {
		const p = previewMesh('Elem ID;Easting (m);Northing (m);Elevation (m NAP);Mat\n1;2;3;4;5\n', { geometry: '3d' });
		expect(p.guess).toEqual({ delimiter: ';', id: 'Elem ID', x: 'Easting (m)', y: 'Northing (m)', z: 'Elevation (m NAP)', group: 'Mat' });
	});
});
