import { endpoint } from '$lib/server/api';
import { realizationFile } from '$lib/server/exports/realization-file';
import { realizationsVtk } from '$lib/server/services/exports';

/** Realization r as legacy VTK (binary), streamed from regeneration; `?transfer=` adds the transferred parameters. */
export const GET = endpoint((event) =>
	realizationFile(event, {
		extension: 'vtk',
		contentType: 'application/octet-stream',
		chunks: (ctx, r, _q, signal) => realizationsVtk(ctx, [r], [], signal)
	})
);
