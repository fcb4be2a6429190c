import { Readable } from 'node:stream';
import { endpoint } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { safeFileName } from '$lib/server/download';
import { recordExportDownload } from '$lib/server/services/audit';
import { exportFile } from '$lib/server/services/export-jobs';

/** A finished export's ZIP; 409 while it runs or after its file expired. */
export const GET = endpoint((event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.download);
	const file = exportFile(project.id, event.params.eid ?? '');
	recordExportDownload({ projectId: project.id, recipe: { id: file.job.recipeId, name: file.job.recipeName, hash: file.job.recipeHash }, file: file.fileName, userId: user.id });
	return new Response(Readable.toWeb(file.open() as Readable) as ReadableStream, {
		headers: {
			'content-type': 'application/zip',
			'content-length': String(file.bytes),
			'content-disposition': `attachment; filename="${safeFileName(file.fileName)}"`,
			'cache-control': 'no-store'
		}
	});
});
