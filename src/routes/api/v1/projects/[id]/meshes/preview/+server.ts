import { json } from '@sveltejs/kit';
import { ApiError, endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { MESH_FILE_BYTES_MAX } from '$lib/mesh';
import { ImportRejected } from '$lib/server/services/import';
import { previewMeshFile } from '$lib/server/services/meshes';
import { filesOf, readMultipart, rejectedUploadResponse } from '$lib/server/upload';

/** The column-mapping step of a mesh upload: header, first rows (`?rows=`, ≤ 100) and a guessed mapping. */
export const POST = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const form = await readMultipart(event.request, MESH_FILE_BYTES_MAX + 1024 * 1024);
	const [file] = await filesOf(form, 'file');
	if (!file) throw new ApiError(400, 'Send one file in the `file` field.');
	const rows = Number(event.url.searchParams.get('rows') ?? 10);
	try {
		return json({ file: file.name, preview: previewMeshFile(project.id, file, Number.isInteger(rows) && rows > 0 && rows <= 100 ? rows : 10) });
	} catch (err) {
		if (err instanceof ImportRejected) return rejectedUploadResponse(err);
		throw err;
	}
});
