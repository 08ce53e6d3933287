// The stand-in accepts mail only from the app: a secret made when the stand-in starts, kept in a
// file only this user can read beside the database, so the app (and its own commands, such as the
// digest) can authenticate and no other local process can post into the outbox.
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { config } from '../config';

export const STAND_IN_USER = 'brothwright';

function secretPath(): string {
	return join(dirname(config.databasePath), '.mail-stand-in.key');
}

/** A new secret for a stand-in that is starting; replaces any older one. */
export function createStandInSecret(): string {
	const secret = randomBytes(32).toString('hex');
	writeFileSync(secretPath(), secret, { mode: 0o600 });
	return secret;
}

/** The secret of the stand-in running for this database, or null when none has started. */
export function readStandInSecret(): string | null {
	const path = secretPath();
	return existsSync(path) ? readFileSync(path, 'utf8').trim() : null;
}

/** Constant-time comparison of what a client sent with the secret. */
export function isStandInSecret(given: string, secret: string): boolean {
	const a = Buffer.from(given);
	const b = Buffer.from(secret);
	return a.length === b.length && timingSafeEqual(a, b);
}
