import type { PageServerLoad } from './$types';
import { requireAdmin } from '$lib/server/auth/guard';
import { usesLocalOutbox } from '$lib/server/mail';
import { getOutboxMessage, listOutbox } from '$lib/server/services/outbox';

export const load: PageServerLoad = (event) => {
	requireAdmin(event);
	const messages = listOutbox();
	const selected = Number(event.url.searchParams.get('m'));
	const open = Number.isInteger(selected) && selected > 0 ? getOutboxMessage(selected) : messages[0];
	return { messages, open: open ?? null, local: usesLocalOutbox() };
};
