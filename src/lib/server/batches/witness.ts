// A second person who saw the weighing, signing at the bench with their own e-mail and password.
import { may } from '$lib/permissions';
import type { Role } from '$lib/roles';
import { recordAudit, type Actor } from '../audit';
import type { Db } from '../db';
import { findUserByEmail, rolesOf } from '../people';
import { RuleError } from '../rule-error';
import { checkSigningPassword, digestOf, insertSignature, refusedSignature } from '../signatures';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export interface WitnessInput {
	witnessEmail?: string;
	witnessPassword?: string;
}

export interface Witness {
	id: string;
	email: string;
	name: string;
	roles: Role[];
}

/**
 * The witness named, with the password checked (argon2 is asynchronous, so before the transaction
 * that records the line). Null when none was named. Each refusal is written to the trail.
 */
export async function checkWitness(
	actor: Actor & { id: string },
	input: WitnessInput,
	subject: { subjectType: string; subjectId: string }
): Promise<Witness | null> {
	const email = (input.witnessEmail ?? '').trim().toLowerCase();
	if (!email) return null;
	const person = findUserByEmail(email);
	const attempt = { ...subject, meaning: 'witnessed' };
	if (!person || !person.active)
		throw new RuleError(`No active person has the e-mail “${email}”.`, { field: 'witnessEmail' });
	const roles = rolesOf(person.id);
	const refusal =
		person.id === actor.id
			? 'The witness must be someone other than the person weighing.'
			: !may(roles, 'batch.execute') && !may(roles, 'batch.review')
				? 'A witness needs the role Prep technician, Media scientist or Process engineer.'
				: null;
	if (refusal) {
		const error = refusedSignature(person, attempt, refusal);
		throw new RuleError(error.message, { field: 'witnessEmail', status: 403 });
	}
	await checkSigningPassword(
		person,
		input.witnessPassword ?? '',
		{ ...subject, meaning: 'witnessed', address: actor.address ?? null },
		{
			field: 'witnessPassword',
			wrong: "The witness's password is not right; nothing was signed.",
			nothing: 'Nothing was signed.'
		}
	);
	return { id: person.id, email: person.email, name: person.name, roles };
}

/** The witness's signature on what was weighed, in the transaction that records it. */
export function recordWitnessSignature(
	tx: Tx,
	witness: Witness,
	subject: { subjectType: string; subjectId: string },
	content: unknown
): string {
	const signature = insertSignature(
		{
			signerId: witness.id,
			signerEmail: witness.email,
			signerName: witness.name,
			meaning: 'witnessed',
			subjectType: subject.subjectType,
			subjectId: subject.subjectId,
			subjectDigest: digestOf(content)
		},
		tx
	);
	recordAudit(
		{ id: witness.id, email: witness.email },
		{
			action: 'signature.recorded',
			...subject,
			detail: { meaning: 'witnessed', signatureId: signature.id, digest: signature.subjectDigest }
		},
		tx
	);
	return signature.id;
}
