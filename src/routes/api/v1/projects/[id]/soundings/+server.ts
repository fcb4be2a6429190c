import { json } from '@sveltejs/kit';
import { endpoint, parseValue } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { ImportRejected, importSoundingsOffThread, planImportOffThread } from '$lib/server/services/import';
import { listSoundings } from '$lib/server/services/soundings';
import { filesOf, jsonField, readMultipart, rejectedUploadResponse } from '$lib/server/upload';
import { uploadOptionsSchema } from '$lib/schemas/soundings';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	return json({ soundings: listSoundings(project.id) });
});

/**
 * Uploads CPT files (multipart: `files`, several; `options`, JSON with the column mapping for delimited
 * text, fallbacks, clash resolutions and GEOL contacts). All or nothing: 201 with what was imported, or the
 * refused files with line and column (a 409 also carries the plan). With `dryRun`, 200 with the plan only.
 */
export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.editData);
	const form = await readMultipart(event.request);
	const options = parseValue(jsonField(form, 'options') ?? {}, uploadOptionsSchema, 'The upload options are not valid.');
	const files = await filesOf(form, 'files');
	const { dryRun, ...request } = options;
	try {
		if (dryRun) return json({ plan: await planImportOffThread(project.id, { files, ...request }) });
		return json(await importSoundingsOffThread(project.id, user.id, { files, ...request }), { status: 201 });
	} catch (err) {
		if (err instanceof ImportRejected) return rejectedUploadResponse(err);
		throw err;
	}
});
