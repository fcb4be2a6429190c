/**
 * A project's uploaded meshes: element centroids read from a CSV (off the request thread), stored compactly, listed,
 * read back as columns for recipes and exports, and deleted while no recipe uses them.
 */
import { and, asc, eq } from 'drizzle-orm';
import { previewMesh, type MeshMapping, type MeshPreview } from '$lib/mesh';
import { CptParseError } from '$lib/cpt';
import { getDb } from '$lib/server/db';
import { fromFloat64Blob, toFloat64Blob } from '$lib/server/db/float64';
import { meshes, type MeshRow } from '$lib/server/db/export-schema';
import { recipes } from '$lib/server/db/recipe-schema';
import type { DbOrTx } from '$lib/server/db/transaction';
import { ServiceError } from '$lib/server/errors';
import { ElementIds, type ElementGroups } from '$lib/server/exports/element-ids';
import { ImportRejected } from './import';
import { readMeshOffThread } from './mesh-thread';
import { getSite } from './site';

/** A mesh as the API lists it (no coordinates). */
export interface MeshView {
	id: string;
	name: string;
	geometry: '2d' | '3d';
	sourceFile: string;
	elements: number;
	groups: { name: string; elements: number }[];
	bounds: MeshRow['bounds'];
	createdAt: string;
}

/** A mesh's element columns. */
export interface MeshColumns {
	x: Float64Array;
	/** Zeros in 2D (the engine's y of a section). */
	y: Float64Array;
	z: Float64Array;
	/** Each element's group name, or null without groups. */
	group: string[] | null;
}

const viewColumns = {
	id: meshes.id,
	name: meshes.name,
	geometry: meshes.geometry,
	sourceFile: meshes.sourceFile,
	elements: meshes.elements,
	groups: meshes.groups,
	bounds: meshes.bounds,
	createdAt: meshes.createdAt
};

function view(r: Omit<MeshView, 'createdAt'> & { createdAt: Date }): MeshView {
	return { ...r, createdAt: r.createdAt.toISOString() };
}

/** The column-mapping step: header, first rows and a guessed mapping. @throws ImportRejected 422 naming the file */
export function previewMeshFile(projectId: string, file: { name: string; bytes: Uint8Array }, rows = 10, db: DbOrTx = getDb()): MeshPreview {
	const geometry = getSite(projectId, db).geometry;
	try {
		return previewMesh(new TextDecoder('utf-8').decode(file.bytes.subarray(0, 4_000_000)), { file: file.name, geometry, rows });
	} catch (err) {
		if (err instanceof CptParseError) throw new ImportRejected(422, err.message, [{ file: file.name, code: err.code, line: err.line, column: err.column, message: err.message }]);
		throw err;
	}
}

/**
 * Reads and stores a mesh; nothing is stored when the file is refused.
 * @throws ImportRejected 422 naming file, line and column; ServiceError 409 for a name already taken
 */
export async function createMesh(
	projectId: string,
	userId: string,
	input: { name: string; mapping: MeshMapping; file: { name: string; bytes: Uint8Array } },
	db: DbOrTx = getDb()
): Promise<MeshView> {
	const geometry = getSite(projectId, db).geometry;
	if (geometry === '3d' && !input.mapping.y) throw new ImportRejected(422, 'A 3D site needs the northing column mapped.', [{ file: input.file.name, code: 'missing-column', message: 'A 3D site needs the northing column mapped.' }]);
	if (nameTaken(projectId, input.name, db)) throw new ServiceError(409, `A mesh named ${input.name} already exists.`);
	const result = await readMeshOffThread({ file: input.file.name, bytes: input.file.bytes, mapping: input.mapping, geometry });
	if (!result.ok) throw new ImportRejected(422, result.problem.message, [{ file: result.problem.file, code: result.problem.code, line: result.problem.line, column: result.problem.column, message: result.problem.message }]);
	const m = result.mesh;
	const row = db
		.insert(meshes)
		.values({
			projectId,
			name: input.name,
			geometry,
			sourceFile: input.file.name,
			elements: m.elements,
			ids: m.ids,
			x: toFloat64Blob(m.x),
			y: m.y ? toFloat64Blob(m.y) : null,
			z: toFloat64Blob(m.z),
			groupIndex: m.groupIndex ? Buffer.from(m.groupIndex.buffer, m.groupIndex.byteOffset, m.groupIndex.byteLength) : null,
			groups: m.groups,
			bounds: m.bounds,
			createdBy: userId
		})
		.onConflictDoNothing({ target: [meshes.projectId, meshes.name] })
		.returning(viewColumns)
		.get();
	if (!row) throw new ServiceError(409, `A mesh named ${input.name} already exists.`);
	return view(row);
}

function nameTaken(projectId: string, name: string, db: DbOrTx): boolean {
	return db
		.select({ name: meshes.name })
		.from(meshes)
		.where(eq(meshes.projectId, projectId))
		.all()
		.some((m) => m.name.toLowerCase() === name.toLowerCase());
}

export function listMeshes(projectId: string, db: DbOrTx = getDb()): MeshView[] {
	return db.select(viewColumns).from(meshes).where(eq(meshes.projectId, projectId)).orderBy(asc(meshes.name)).all().map(view);
}

/** @throws ServiceError 404 when the mesh is not in the project */
export function getMesh(projectId: string, meshId: string, db: DbOrTx = getDb()): MeshView {
	const row = db
		.select(viewColumns)
		.from(meshes)
		.where(and(eq(meshes.id, meshId), eq(meshes.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Mesh not found.');
	return view(row);
}

/** A mesh's element coordinates and groups. @throws ServiceError 404 */
export function meshColumns(projectId: string, meshId: string, db: DbOrTx = getDb()): MeshColumns {
	const row = db
		.select({ x: meshes.x, y: meshes.y, z: meshes.z, groupIndex: meshes.groupIndex, groups: meshes.groups })
		.from(meshes)
		.where(and(eq(meshes.id, meshId), eq(meshes.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Mesh not found.');
	const x = fromFloat64Blob(row.x);
	const groups = groupsOf(row);
	return { x, y: row.y ? fromFloat64Blob(row.y) : new Float64Array(x.length), z: fromFloat64Blob(row.z), group: groups && Array.from(groups.index, (k) => groups.names[k]) };
}

/**
 * A mesh's element ids and groups, as an export writes them beside each element's values (its coordinates come
 * from the recipe). Compact: the ids stay in their stored text. @throws ServiceError 404
 */
export function meshElements(projectId: string, meshId: string, db: DbOrTx = getDb()): { ids: ElementIds; group: ElementGroups | null } {
	const row = db
		.select({ ids: meshes.ids, groupIndex: meshes.groupIndex, groups: meshes.groups })
		.from(meshes)
		.where(and(eq(meshes.id, meshId), eq(meshes.projectId, projectId)))
		.get();
	if (!row) throw new ServiceError(404, 'Mesh not found.');
	return { ids: new ElementIds(row.ids), group: groupsOf(row) };
}

function groupsOf(row: { groupIndex: Buffer | null; groups: MeshRow['groups'] }): ElementGroups | null {
	if (!row.groupIndex) return null;
	const { buffer, byteOffset, byteLength } = row.groupIndex;
	return { names: row.groups.map((g) => g.name), index: new Int32Array(buffer.slice(byteOffset, byteOffset + byteLength)) };
}

/** Deletes a mesh. @throws ServiceError 404; 409 while a recipe of the project was made on it */
export function deleteMesh(projectId: string, meshId: string, db: DbOrTx = getDb()): void {
	const mesh = getMesh(projectId, meshId, db);
	const users = db
		.select({ name: recipes.name, provenance: recipes.provenance })
		.from(recipes)
		.where(eq(recipes.projectId, projectId))
		.all()
		.filter((r) => (r.provenance as { mesh?: { id: string } }).mesh?.id === meshId);
	if (users.length) throw new ServiceError(409, `${mesh.name} is the target of ${users.map((u) => u.name).join(', ')}; delete those recipes first.`);
	db.delete(meshes).where(eq(meshes.id, meshId)).run();
}
