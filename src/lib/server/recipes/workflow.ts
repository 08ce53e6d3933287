import { and, eq } from 'drizzle-orm';
import { may } from '$lib/permissions';
import type { Role } from '$lib/roles';
import { SIGNATURE_MEANINGS, type SignatureMeaning } from '$lib/recipes';
import { recordAudit, type Actor } from '../audit';
import { db, type Db } from '../db';
import { recipeLine, recipeVersion, type RecipeVersion } from '../db/schema';
import { RuleError } from '../rule-error';
import { digestOf, refusedSignature, signRecord } from '../signatures';
import { analyseVersion } from './analysis';
import { checkAcknowledgements, openWarnings, signedComment } from './open-warnings';
import { fieldsOf } from './drafts';
import { componentSnapshotOf, dropComponentSnapshot, takeComponentSnapshot } from './snapshot';
import {
	currentApprovedVersion,
	editorIdsOf,
	findRecipe,
	findVersionById,
	linesOf
} from './queries';

function requireVersion(id: string): RecipeVersion {
	const version = findVersionById(id);
	if (!version) throw new RuleError('No such recipe version.', { status: 404 });
	return version;
}

function requireStatus(version: RecipeVersion, status: RecipeVersion['status'], doing: string) {
	if (version.status !== status) {
		throw new RuleError(
			`Version ${version.n} is ${version.status.replace('_', ' ')}; only a version ${status.replace('_', ' ')} can be ${doing}.`,
			{ status: 409 }
		);
	}
}

/** What a signature on a version is linked to: the recipe, the version's fields and its lines. */
export function versionDigest(version: RecipeVersion): string {
	const recipe = findRecipe(version.recipeId)!;
	const lines = linesOf(version.id).map(({ id: _id, versionId: _v, ...line }) => line);
	const components = [...componentSnapshotOf(version.id).values()]
		.sort((a, b) => a.id.localeCompare(b.id))
		.map(({ createdAt: _c, updatedAt: _u, ...row }) => row);
	return digestOf({
		recipe: { id: recipe.id, name: recipe.name, kind: recipe.kind },
		n: version.n,
		fields: fieldsOf(version),
		lines,
		components
	});
}

/**
 * Draft → in review. The draft must be analysable and every stock it doses must have an approved
 * version, which is pinned on the line so the reviewed recipe means exactly one thing.
 */
export function submitForReview(actor: Actor, versionId: string, revision: number): void {
	const version = requireVersion(versionId);
	requireStatus(version, 'draft', 'submitted');
	if (version.revision !== revision) {
		throw new RuleError(
			'Someone saved this draft after you opened it; reload and check their change before submitting.',
			{ status: 409 }
		);
	}
	const lines = linesOf(version.id);
	if (lines.length === 0)
		throw new RuleError('Add at least one line before submitting for review.');
	analyseVersion(version);
	db.transaction((tx) => {
		for (const line of lines.filter((l) => l.kind === 'stock')) {
			const approved = currentApprovedVersion(line.stockRecipeId!, tx);
			const stock = findRecipe(line.stockRecipeId!, tx)!;
			if (!approved) {
				throw new RuleError(
					`Line ${line.position}: ${stock.name} has no approved version yet; it must be approved first.`,
					{
						field: `lines.${line.position - 1}.stockRecipeId`
					}
				);
			}
			tx.update(recipeLine)
				.set({ stockVersionId: approved.id })
				.where(eq(recipeLine.id, line.id))
				.run();
		}
		takeComponentSnapshot(tx, versionId);
		const done = tx
			.update(recipeVersion)
			.set({ status: 'in_review', submittedAt: new Date() })
			.where(
				and(
					eq(recipeVersion.id, versionId),
					eq(recipeVersion.status, 'draft'),
					eq(recipeVersion.revision, revision)
				)
			)
			.run();
		if (done.changes !== 1)
			throw new RuleError(
				'This draft changed while you were submitting it; reload and try again.',
				{ status: 409 }
			);
		recordAudit(
			actor,
			{
				action: 'recipe.submitted',
				subjectType: 'recipe_version',
				subjectId: versionId,
				detail: { n: version.n }
			},
			tx
		);
	});
}

/** In review → draft, with the reason, so the author can change it. */
export function returnToDraft(actor: Actor, versionId: string, comment: string): void {
	const version = requireVersion(versionId);
	requireStatus(version, 'in_review', 'returned to draft');
	if (!comment.trim())
		throw new RuleError('Say what needs to change, so the author knows.', { field: 'comment' });
	db.transaction((tx) => {
		tx.update(recipeLine)
			.set({ stockVersionId: null })
			.where(eq(recipeLine.versionId, versionId))
			.run();
		tx.update(recipeVersion)
			.set({
				status: 'draft',
				submittedAt: null,
				revision: version.revision + 1,
				updatedAt: new Date()
			})
			.where(eq(recipeVersion.id, versionId))
			.run();
		dropComponentSnapshot(tx, versionId);
		recordAudit(
			actor,
			{
				action: 'recipe.returned_to_draft',
				subjectType: 'recipe_version',
				subjectId: versionId,
				detail: { n: version.n, comment: comment.trim() }
			},
			tx
		);
	});
}

/** Why this person may not sign the version, or null when they may. */
export function signingRefusal(
	signer: { id: string; roles: readonly Role[] },
	version: RecipeVersion
): string | null {
	if (!may(signer, 'recipe.sign'))
		return 'Review and approval need the role Media scientist or Process engineer.';
	if (version.authorId === signer.id)
		return 'You wrote this version, so someone else must review and approve it.';
	if (editorIdsOf(version.id).includes(signer.id))
		return 'You edited this version, so someone who did not write it must review and approve it.';
	return null;
}

export interface SignInput {
	password: string;
	meaning: string;
	comment: string;
	/** Per open warning's key, why it is acceptable (open-warnings.ts); each one is required. */
	acknowledgements?: Record<string, string>;
}

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** Approval: the version is released and the one it replaces retired, both audited. */
function releaseVersion(tx: Tx, actor: Actor, version: RecipeVersion, digest: string): void {
	const previous = currentApprovedVersion(version.recipeId, tx);
	if (previous) {
		tx.update(recipeVersion)
			.set({ status: 'retired', retiredAt: new Date() })
			.where(eq(recipeVersion.id, previous.id))
			.run();
		recordAudit(
			actor,
			{
				action: 'recipe.retired',
				subjectType: 'recipe_version',
				subjectId: previous.id,
				detail: { n: previous.n, reason: `superseded by version ${version.n}` }
			},
			tx
		);
	}
	tx.update(recipeVersion)
		.set({ status: 'approved', approvedAt: new Date(), approvedById: actor.id })
		.where(eq(recipeVersion.id, version.id))
		.run();
	recordAudit(
		actor,
		{
			action: 'recipe.approved',
			subjectType: 'recipe_version',
			subjectId: version.id,
			detail: { n: version.n, digest }
		},
		tx
	);
}

/**
 * An electronic signature on a version in review. "reviewed" records the review and leaves it in
 * review; "approved" releases it, retiring the version it replaces, in the same transaction.
 */
export async function signVersion(
	signer: { id: string; email: string; roles: readonly Role[]; address?: string },
	versionId: string,
	input: SignInput
): Promise<void> {
	const version = requireVersion(versionId);
	requireStatus(version, 'in_review', input.meaning === 'approved' ? 'approved' : 'signed');
	const refusal = signingRefusal(signer, version);
	if (refusal) {
		throw refusedSignature(
			signer,
			{
				subjectType: 'recipe_version',
				subjectId: versionId,
				meaning: input.meaning,
				detail: { n: version.n }
			},
			refusal
		);
	}
	if (!(SIGNATURE_MEANINGS as readonly string[]).includes(input.meaning)) {
		throw new RuleError('Choose what your signature means: reviewed or approved.', {
			field: 'meaning'
		});
	}
	const meaning = input.meaning as SignatureMeaning;
	const acknowledged = checkAcknowledgements(openWarnings(version), input.acknowledgements ?? {});
	const digest = versionDigest(version);
	const actor: Actor = { id: signer.id, email: signer.email, address: signer.address ?? null };
	await signRecord(
		{
			user: signer,
			password: input.password,
			meaning,
			subjectType: 'recipe_version',
			subjectId: versionId,
			subjectDigest: digest,
			comment: signedComment(input.comment, acknowledged),
			address: signer.address
		},
		(tx) => {
			const now = findVersionById(versionId, tx);
			if (!now || now.status !== 'in_review' || now.revision !== version.revision) {
				throw new RuleError(
					'This version changed while you were signing; nothing was signed. Reload and look again.',
					{ status: 409 }
				);
			}
			if (meaning === 'reviewed') {
				recordAudit(
					actor,
					{
						action: 'recipe.reviewed',
						subjectType: 'recipe_version',
						subjectId: versionId,
						detail: { n: version.n, warningsAcknowledged: acknowledged.length }
					},
					tx
				);
				return;
			}
			releaseVersion(tx, actor, version, digest);
		}
	);
}

/** Approved → retired: no longer for new batches; the record stays. */
export function retireVersion(actor: Actor, versionId: string, reason: string): void {
	const version = requireVersion(versionId);
	requireStatus(version, 'approved', 'retired');
	db.transaction((tx) => {
		tx.update(recipeVersion)
			.set({ status: 'retired', retiredAt: new Date() })
			.where(eq(recipeVersion.id, versionId))
			.run();
		recordAudit(
			actor,
			{
				action: 'recipe.retired',
				subjectType: 'recipe_version',
				subjectId: versionId,
				detail: { n: version.n, reason: reason.trim() }
			},
			tx
		);
	});
}
