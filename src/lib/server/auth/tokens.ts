import { createHash, randomBytes } from 'node:crypto';

/** A URL-safe secret for a link; only its hash is stored, so a database leak reveals no live link. */
export function createLinkToken(): { token: string; tokenHash: string } {
	const token = randomBytes(32).toString('base64url');
	return { token, tokenHash: hashLinkToken(token) };
}

export function hashLinkToken(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}
