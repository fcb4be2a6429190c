import { json } from '@sveltejs/kit';
import { ApiError, endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { MESH_FILE_BYTES_MAX } from '$lib/mesh';
import { meshUploadOptionsSchema } from '$lib/schemas/exports';
import { ImportRejected } from '$lib/server/services/import';
import { createMesh, listMeshes } from '$lib/server/services/meshes';
import { filesOf, jsonField, readMultipart, rejectedUploadResponse } from '$lib/server/upload';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ meshes: listMeshes(project.id) });
});

/** Multipart `file` (element centroids) and `options` ({name, mapping}): 201 {mesh}, or 422 naming file, line and column. */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const form = await readMultipart(event.request, MESH_FILE_BYTES_MAX + 1024 * 1024);
	const [file] = await filesOf(form, 'file');
	if (!file) throw new ApiError(400, 'Send the mesh file in the `file` field.');
	const parsed = meshUploadOptionsSchema.safeParse(jsonField(form, 'options'));
	if (!parsed.success) throw new ApiError(422, 'The options are not valid.', parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })));
	try {
		return json({ mesh: await createMesh(project.id, user.id, { ...parsed.data, file }) }, { status: 201 });
	} catch (err) {
		if (err instanceof ImportRejected) return rejectedUploadResponse(err);
		throw err;
	}
});
