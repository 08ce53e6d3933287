import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { db } from '../db';
import { mailMessage } from '../db/schema';

const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
	const list = Array.isArray(field) ? field : field ? [field] : [];
	return list.flatMap((a) => a.value.map((v) => v.address ?? '')).filter(Boolean);
}

/**
 * A loopback SMTP server that keeps every message it receives in the database, so the outbox page
 * can show what the product sent without any real mail leaving the machine.
 */
export function startMailStandIn(port: number, host = '127.0.0.1'): Promise<SMTPServer> {
	const server = new SMTPServer({
		secure: false,
		authOptional: true,
		disabledCommands: ['STARTTLS', 'AUTH'],
		size: MAX_MESSAGE_BYTES,
		banner: 'Brothwright mail stand-in',
		logger: false,
		onData(stream, smtpSession, callback) {
			const chunks: Buffer[] = [];
			stream.on('data', (chunk: Buffer) => chunks.push(chunk));
			stream.on('end', async () => {
				try {
					const raw = Buffer.concat(chunks);
					const parsed = await simpleParser(raw);
					const envelopeTo = smtpSession.envelope.rcptTo.map((r) => r.address);
					const { mailFrom } = smtpSession.envelope;
					const envelopeFrom = mailFrom ? mailFrom.address : '';
					db.insert(mailMessage)
						.values({
							sender: parsed.from?.value[0]?.address || envelopeFrom || 'unknown',
							recipients: envelopeTo.length ? envelopeTo : addresses(parsed.to),
							subject: parsed.subject ?? '(no subject)',
							textBody: parsed.text ?? '',
							htmlBody: typeof parsed.html === 'string' ? parsed.html : null,
							sizeBytes: raw.length
						})
						.run();
					callback();
				} catch (cause) {
					callback(cause instanceof Error ? cause : new Error(String(cause)));
				}
			});
		}
	});
	return new Promise((resolve, reject) => {
		server.once('error', reject);
		server.listen(port, host, () => {
			server.off('error', reject);
			resolve(server);
		});
	});
}
