import { desc, eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { outbox, type OutboxMessage } from '$lib/server/db/schema';

export interface OutboxView {
	id: number;
	from: string;
	to: string;
	subject: string;
	text: string;
	receivedAt: string;
}

function view(m: OutboxMessage): OutboxView {
	return { id: m.id, from: m.from, to: m.to, subject: m.subject, text: m.text, receivedAt: m.receivedAt.toISOString() };
}

/** The newest messages the local SMTP sink received. */
export function listOutbox(limit = 200): OutboxView[] {
	return getDb().select().from(outbox).orderBy(desc(outbox.id)).limit(limit).all().map(view);
}

export function getOutboxMessage(id: number): OutboxView | undefined {
	const m = getDb().select().from(outbox).where(eq(outbox.id, id)).get();
	return m ? view(m) : undefined;
}
