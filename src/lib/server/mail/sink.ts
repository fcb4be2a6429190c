import { simpleParser, type AddressObject } from 'mailparser';
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import type { Db } from '$lib/server/db';
import { outbox } from '$lib/server/db/schema';

export interface SmtpSink {
	port: number;
	close(): Promise<void>;
}

function addresses(value: AddressObject | AddressObject[] | undefined): string {
	const list = Array.isArray(value) ? value : value ? [value] : [];
	return list.map((a) => a.text).join(', ');
}

/**
 * A real SMTP server on loopback that accepts every message and stores it in the outbox table,
 * so local installs and tests exercise the same SMTP path as a deployment.
 */
export function startSmtpSink(db: Db, port = 0): Promise<SmtpSink> {
	const server = new SMTPServer({
		authOptional: true,
		disabledCommands: ['AUTH', 'STARTTLS'],
		banner: 'Conefield local outbox',
		logger: false,
		async onData(stream, _session, callback) {
			try {
				const mail = await simpleParser(stream);
				db.insert(outbox)
					.values({
						from: addresses(mail.from),
						to: addresses(mail.to),
						subject: mail.subject ?? '',
						text: mail.text ?? '',
						html: typeof mail.html === 'string' ? mail.html : null
					})
					.run();
				callback();
			} catch (err) {
				callback(err instanceof Error ? err : new Error(String(err)));
			}
		}
	});
	return new Promise((resolve, reject) => {
		server.once('error', reject);
		server.listen(port, '127.0.0.1', () => {
			const { port: bound } = server.server.address() as AddressInfo;
			// The sink serves this process only: it must not keep it alive once the HTTP server has shut down.
			server.server.unref();
			resolve({ port: bound, close: () => new Promise((done) => server.close(() => done())) });
		});
	});
}
