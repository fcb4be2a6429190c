import { json } from '@sveltejs/kit';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { ServiceError } from '$lib/server/errors';
import { recipeRealization } from '$lib/server/services/summaries';
import { jsonColumn } from '$lib/server/services/derived';

/**
 * Realization r regenerated on the server: JSON with null where a target is not simulated, or with
 * `Accept: application/octet-stream` its little-endian Float64 bytes (NaN where not simulated).
 */
export const GET = endpoint(async (event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const text = event.params.r ?? '';
	if (!/^\d{1,9}$/.test(text)) throw new ServiceError(404, `Realization ${text} does not exist.`);
	const result = await recipeRealization(project.id, event.params.rid ?? '', Number(text));
	if ((event.request.headers.get('accept') ?? '').includes('application/octet-stream')) {
		const v = result.values;
		return new Response(new Uint8Array(v.buffer as ArrayBuffer, v.byteOffset, v.byteLength), {
			headers: { 'content-type': 'application/octet-stream', 'x-recipe-hash': result.hash, 'x-engine-version': result.engineVersion }
		});
	}
	return json({ hash: result.hash, engineVersion: result.engineVersion, realization: result.realization, values: jsonColumn(result.values) });
});
