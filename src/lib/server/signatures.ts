import { createHash } from 'node:crypto';
import { and, asc, eq, inArray } from 'drizzle-orm';
import { recordAudit, type Actor } from './audit';
import { checkCountedPassword } from './auth/password-check';
import { db, type Db } from './db';
import { eSignature, user, type ESignature } from './db/schema';
import { RuleError } from './rule-error';
import { nextLink } from './trail/chain';

export interface SignatureRequest {
	user: { id: string; email: string };
	/** The signer's password, entered again for this signature. */
	password: string;
	/** What the signature means, e.g. 'reviewed', 'approved', 'performed', 'verified'. */
	meaning: string;
	subjectType: string;
	subjectId: string;
	/** SHA-256 of the content being signed (see `digestOf`). */
	subjectDigest?: string;
	comment?: string;
	address?: string;
}

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type Writer = Pick<Db, 'insert'>;

/** A stable SHA-256 of any JSON-serialisable content: what a signature is linked to. */
export function digestOf(content: unknown): string {
	return createHash('sha256').update(JSON.stringify(content)).digest('hex');
}

/**
 * A signature refused before it was tried (wrong person, wrong role): the refusal is written to the
 * trail in its own write, with what was tried and why, and the error to throw is returned.
 */
export function refusedSignature(
	signer: { id: string; email: string; address?: string | null },
	attempt: { subjectType: string; subjectId: string; meaning: string; detail?: object },
	reason: string
): RuleError {
	recordAudit(
		{ id: signer.id, email: signer.email, address: signer.address ?? null },
		{
			action: 'signature.refused',
			subjectType: attempt.subjectType,
			subjectId: attempt.subjectId,
			detail: { ...attempt.detail, meaning: attempt.meaning, reason }
		}
	);
	return new RuleError(reason, { status: 403 });
}

/**
 * The password a person re-enters to sign (their own, or a witness's): the try is counted with the
 * person's sign-in tries before it is checked, and a refusal is written to the trail. Throws a
 * field error (`field`, with `wrong` as its words) unless the password is right.
 */
export async function checkSigningPassword(
	person: { id: string; email: string; passwordHash: string },
	password: string,
	attempt: { subjectType: string; subjectId: string; meaning: string; address: string | null },
	words: { field: string; wrong: string; nothing: string } = {
		field: 'password',
		wrong: 'The password is not right for your account; nothing was signed.',
		nothing: 'Nothing was signed.'
	}
): Promise<void> {
	const actor: Actor = { id: person.id, email: person.email, address: attempt.address };
	const refuse = (reason: string) =>
		recordAudit(actor, {
			action: 'signature.refused',
			subjectType: attempt.subjectType,
			subjectId: attempt.subjectId,
			detail: { meaning: attempt.meaning, reason }
		});
	await checkCountedPassword(person, password, attempt.address, refuse, {
		field: words.field,
		wrong: words.wrong,
		held: words.nothing
	});
}

/** Whether the request in hand came with an API token (a script), not a person's session. */
async function signedInByToken(): Promise<boolean> {
	try {
		// Imported when signing, so tools that only read the API's description load no SvelteKit.
		const { getRequestEvent } = await import('$app/server');
		return getRequestEvent().locals.apiToken != null;
	} catch {
		return false; // outside a request (seeding, tests calling the rule directly)
	}
}

/**
 * Checks the re-entered password (argon2) and, if right, opens one transaction that records the
 * signature and runs `write` — the change the signature authorises — so neither exists without the
 * other. A wrong password records nothing but an audit entry, and answers with a field error.
 * (better-sqlite3 transactions are synchronous, so the password is checked before the transaction opens.)
 */
export async function signRecord<T>(
	request: SignatureRequest,
	write: (tx: Tx, signature: ESignature) => T
): Promise<T> {
	const signer = db.select().from(user).where(eq(user.id, request.user.id)).get();
	if (!signer || !signer.active || signer.kind !== 'person')
		throw new RuleError('This account cannot sign.', { status: 403 });
	if (await signedInByToken())
		throw new RuleError(
			'A signature needs the signer’s password in the app: an API token never signs.',
			{ status: 403 }
		);
	const actor: Actor = { id: signer.id, email: signer.email, address: request.address ?? null };
	if (!request.password) {
		throw new RuleError('Enter your password to sign.', { field: 'password' });
	}
	await checkSigningPassword(signer, request.password, {
		subjectType: request.subjectType,
		subjectId: request.subjectId,
		meaning: request.meaning,
		address: request.address ?? null
	});
	return db.transaction((tx) => {
		const signature = insertSignature(
			{
				signerId: signer.id,
				signerEmail: signer.email,
				signerName: signer.name,
				meaning: request.meaning,
				subjectType: request.subjectType,
				subjectId: request.subjectId,
				subjectDigest: request.subjectDigest ?? null,
				comment: request.comment ?? ''
			},
			tx
		);
		recordAudit(
			actor,
			{
				action: 'signature.recorded',
				subjectType: request.subjectType,
				subjectId: request.subjectId,
				detail: {
					meaning: request.meaning,
					signatureId: signature.id,
					digest: signature.subjectDigest
				}
			},
			tx
		);
		return write(tx, signature);
	});
}

/** The bare insert, for seeding history; normal signing goes through `signRecord`. */
export function insertSignature(
	given: Omit<typeof eSignature.$inferInsert, 'seq' | 'prevHash' | 'rowHash'>,
	writer: Writer = db
): ESignature {
	const values = {
		...given,
		id: given.id ?? crypto.randomUUID(),
		comment: given.comment ?? '',
		subjectDigest: given.subjectDigest ?? null,
		signedAt: given.signedAt ?? new Date()
	};
	const stored = {
		id: values.id,
		signer_id: values.signerId,
		signer_email: values.signerEmail,
		signer_name: values.signerName,
		meaning: values.meaning,
		subject_type: values.subjectType,
		subject_id: values.subjectId,
		subject_digest: values.subjectDigest,
		comment: values.comment,
		signed_at: values.signedAt.getTime()
	};
	return writer
		.insert(eSignature)
		.values({ ...values, ...nextLink(db.$client, 'e_signature', stored) })
		.returning()
		.get();
}

export function signaturesFor(subjectType: string, subjectIds: string[]): ESignature[] {
	if (subjectIds.length === 0) return [];
	return db
		.select()
		.from(eSignature)
		.where(and(eq(eSignature.subjectType, subjectType), inArray(eSignature.subjectId, subjectIds)))
		.orderBy(asc(eSignature.signedAt))
		.all();
}
