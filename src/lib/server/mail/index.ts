import nodemailer, { type Transporter } from 'nodemailer';
import { getDb } from '$lib/server/db';
import { mailFrom } from '$lib/server/config';
import { startSmtpSink } from './sink';

export interface Message {
	to: string;
	subject: string;
	text: string;
	html?: string;
}

let transport: Promise<Transporter> | undefined;
let sinkClose: (() => Promise<void>) | undefined;

/**
 * The SMTP transport: SMTP_URL when set, otherwise the in-process sink on 127.0.0.1
 * (SMTP_SINK_PORT or a free port) that stores mail in the outbox.
 */
export function getTransport(): Promise<Transporter> {
	transport ??= (async () => {
		const url = process.env.SMTP_URL?.trim();
		if (url) return nodemailer.createTransport(url);
		const sink = await startSmtpSink(getDb(), Number(process.env.SMTP_SINK_PORT ?? 0) || 0);
		sinkClose = sink.close;
		console.info(`[conefield] SMTP_URL not set; local outbox listening on 127.0.0.1:${sink.port}`);
		return nodemailer.createTransport({ host: '127.0.0.1', port: sink.port, secure: false, ignoreTLS: true });
	})();
	return transport;
}

/** Stops the local SMTP sink, if one runs, so the process can exit. */
export async function closeMail(): Promise<void> {
	await sinkClose?.();
	sinkClose = undefined;
}

/** True when mail stays on this machine, so the Outbox page has something to show. */
export function usesLocalOutbox(): boolean {
	return !process.env.SMTP_URL?.trim();
}

export async function sendMail(message: Message): Promise<void> {
	const t = await getTransport();
	const info = await t.sendMail({ from: mailFrom(), ...message });
	if (info.rejected.length > 0) throw new Error(`mail to ${message.to} was rejected`);
}

function escapeHtml(s: string): string {
	return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** A plain message with one call to action, as text and matching HTML. */
export function actionMail(to: string, subject: string, lines: string[], action: { label: string; url: string }): Message {
	const text = [...lines, '', `${action.label}: ${action.url}`, '', '— Conefield'].join('\n');
	const html = [
		...lines.map((l) => `<p>${escapeHtml(l)}</p>`),
		`<p><a href="${escapeHtml(action.url)}">${escapeHtml(action.label)}</a></p>`,
		`<p style="color:#78716c">${escapeHtml(action.url)}</p>`,
		'<p>— Conefield</p>'
	].join('\n');
	return { to, subject, text, html };
}
