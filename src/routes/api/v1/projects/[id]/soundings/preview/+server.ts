import { json } from '@sveltejs/kit';
import { ApiError, endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { ImportRejected, previewUpload } from '$lib/server/services/import';
import { filesOf, readMultipart, rejectedUploadResponse } from '$lib/server/upload';
import { MAX_FILE_BYTES } from '$lib/cpt';

/** The column-mapping step: header, first rows and a guessed mapping of one delimited file (multipart `file`). */
export const POST = endpoint(async (event) => {
	requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const form = await readMultipart(event.request, MAX_FILE_BYTES + 1024 * 1024);
	const [file] = await filesOf(form, 'file');
	if (!file) throw new ApiError(400, 'Send one file in the `file` field.');
	const rows = Number(event.url.searchParams.get('rows') ?? 10);
	try {
		return json({ file: file.name, preview: previewUpload(file, Number.isInteger(rows) && rows > 0 && rows <= 100 ? rows : 10) });
	} catch (err) {
		if (err instanceof ImportRejected) return rejectedUploadResponse(err);
		throw err;
	}
});
