/** The audit log's query: a kind, a person, and paging back in time. */
import { z } from 'zod';
import { AUDIT_KINDS } from '$lib/audit';

const blankAsNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v);

export const auditQuerySchema = z.object({
	kind: z.preprocess(blankAsNull, z.enum(AUDIT_KINDS, { error: `Choose a kind: ${AUDIT_KINDS.join(', ')}.` }).nullable().default(null)),
	/** A user id. */
	user: z.preprocess(blankAsNull, z.string().max(100).nullable().default(null)),
	/** Entries older than this entry id (the `next` of the page before). */
	before: z.preprocess(blankAsNull, z.coerce.number({ error: 'before is an entry id.' }).int().positive().nullable().default(null)),
	limit: z.preprocess(blankAsNull, z.coerce.number({ error: 'limit is a number.' }).int().min(1).max(1000).nullable().default(null)).transform((v) => v ?? 200)
});
export type AuditQueryInput = z.input<typeof auditQuerySchema>;
