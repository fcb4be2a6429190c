import { json } from '@sveltejs/kit';
import { ApiError, endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { ImportRejected, importSoundingsOffThread } from '$lib/server/services/import';
import { listSoundings } from '$lib/server/services/soundings';
import { filesOf, jsonField, readMultipart, rejectedUploadResponse } from '$lib/server/upload';
import { uploadOptionsSchema } from '$lib/schemas/soundings';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, 'viewer');
	return json({ soundings: listSoundings(project.id) });
});

/**
 * Uploads CPT files (multipart: `files`, several; `options`, JSON with the column mapping for delimited
 * text and fallbacks). All or nothing: 201 with what was imported, or the refused files with line and column.
 */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, 'analyst');
	const form = await readMultipart(event.request);
	const parsed = uploadOptionsSchema.safeParse(jsonField(form, 'options') ?? {});
	if (!parsed.success) {
		throw new ApiError(422, 'The upload options are not valid.', parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })));
	}
	const files = await filesOf(form, 'files');
	try {
		return json(await importSoundingsOffThread(project.id, user.id, { files, ...parsed.data }), { status: 201 });
	} catch (err) {
		if (err instanceof ImportRejected) return rejectedUploadResponse(err);
		throw err;
	}
});
