import { endpoint } from '$lib/server/api';
import { realizationFile } from '$lib/server/exports/realization-file';
import { realizationCsv } from '$lib/server/services/exports';

/** Realization r as CSV, streamed from regeneration: `?digits=` significant digits, `?transfer=` a transfer set. */
export const GET = endpoint((event) =>
	realizationFile(event, {
		extension: 'csv',
		contentType: 'text/csv; charset=utf-8',
		chunks: (ctx, r, q, signal) => realizationCsv(ctx, r, q.digits ?? null, signal)
	})
);
