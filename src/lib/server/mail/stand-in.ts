import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { db } from '../db';
import { mailMessage } from '../db/schema';
import { createStandInSecret, isStandInSecret, STAND_IN_USER } from './stand-in-secret';

const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
	const list = Array.isArray(field) ? field : field ? [field] : [];
	return list.flatMap((a) => a.value.map((v) => v.address ?? '')).filter(Boolean);
}

/**
 * A loopback SMTP server that keeps every message it receives in the database, so the outbox page
 * can show what the product sent without any real mail leaving the machine. It takes mail only from
 * a client that authenticates with the secret made when it starts (stand-in-secret.ts).
 */
export function startMailStandIn(port: number, host = '127.0.0.1'): Promise<SMTPServer> {
	const secret = createStandInSecret();
	const server = new SMTPServer({
		secure: false,
		// Only the app, with the secret made at start, may post; loopback only, so no TLS is needed
		// for the password to stay on this machine.
		authOptional: false,
		allowInsecureAuth: true,
		authMethods: ['PLAIN', 'LOGIN'],
		disabledCommands: ['STARTTLS'],
		onAuth(auth, _session, callback) {
			if (auth.username === STAND_IN_USER && isStandInSecret(auth.password ?? '', secret))
				return callback(null, { user: STAND_IN_USER });
			return callback(new Error('Only Brothwright may post to its mail stand-in.'));
		},
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
