import { z } from 'zod';
import { READINGS_PER_SOUNDING_MAX } from '$lib/schemas/bounds';
import { derivedJson, jsonColumn, type DerivedSoundingResult } from './derived';
import type { SoundingDetail } from './soundings';

/**
 * Which readings of a sounding a request asks for: `offset` (default 0) and `limit` (default and largest
 * READINGS_PER_SOUNDING_MAX), so every sounding imported within the limit comes whole in one page, and one
 * stored before the limit existed comes in pages instead of one response of hundreds of megabytes.
 */
export const readingsPageSchema = z.strictObject({
	offset: z.coerce.number().int().min(0, { error: 'offset is a whole number from 0.' }).default(0),
	limit: z.coerce
		.number()
		.int()
		.min(1, { error: 'limit is a whole number from 1.' })
		.max(READINGS_PER_SOUNDING_MAX, { error: `limit is at most ${READINGS_PER_SOUNDING_MAX}.` })
		.default(READINGS_PER_SOUNDING_MAX)
});
export type ReadingsPage = z.output<typeof readingsPageSchema>;

/** Which readings a page holds; `next` is the path of the next page (null on the last, or without a request URL). */
export interface ReadingsPageView {
	total: number;
	offset: number;
	count: number;
	next: string | null;
}

/** The readings, derived properties and per-reading unit and flags of one page, as JSON columns (NaN → null). */
export function readingsPageJson(detail: SoundingDetail, derived: DerivedSoundingResult, { offset, limit }: ReadingsPage, url?: URL) {
	const total = detail.columns.depth.length;
	const start = Math.min(offset, total);
	const end = Math.min(total, start + limit);
	const slice = (values: Float64Array) => jsonColumn(values.subarray(start, end));
	let next: string | null = null;
	if (url && end < total) {
		const u = new URL(url);
		u.searchParams.set('offset', String(end));
		u.searchParams.set('limit', String(limit));
		next = `${u.pathname}${u.search}`;
	}
	const readings: ReadingsPageView = { total, offset: start, count: end - start, next };
	return {
		readings,
		columns: {
			depth: slice(detail.columns.depth),
			qc: slice(detail.columns.qc),
			fs: slice(detail.columns.fs),
			u2: detail.columns.u2 ? slice(detail.columns.u2) : null,
			extras: Object.fromEntries(Object.entries(detail.columns.extras).map(([k, v]) => [k, slice(v)]))
		},
		derived: derivedJson(derived, start, end),
		unit: Array.from(derived.unit.subarray(start, end)),
		flags: Array.from(derived.flags.subarray(start, end))
	};
}
