// Who may review a version in review, what waits for each person, and the mail that tells the
// reviewers a version was submitted. Eligibility is the signing rule itself (signingRefusal): the
// role that may sign, and neither the author nor anyone who edited the version.
import { and, asc, eq, inArray } from 'drizzle-orm';
import { rolesFor } from '$lib/permissions';
import { countOf } from '$lib/plural';
import type { Role } from '$lib/roles';
import { config } from '../config';
import { db } from '../db';
import { recipe, recipeVersion, user, userRole } from '../db/schema';
import { sendMail } from '../mail/send';
import { editorIdsOf } from './queries';

export interface Reviewer {
	id: string;
	name: string;
	email: string;
}

function activeSigners(): Reviewer[] {
	const signingRoles = rolesFor('recipe.sign') as Role[];
	return db
		.selectDistinct({ id: user.id, name: user.name, email: user.email })
		.from(user)
		.innerJoin(userRole, eq(userRole.userId, user.id))
		.where(
			and(eq(user.active, true), eq(user.kind, 'person'), inArray(userRole.role, signingRoles))
		)
		.orderBy(asc(user.name))
		.all();
}

/**
 * The people who may sign this version: signers by role, less its author and its editors. A caller
 * judging many versions reads the signers once and passes them.
 */
export function eligibleReviewers(
	version: { id: string; authorId: string },
	signers: Reviewer[] = activeSigners()
): Reviewer[] {
	const excluded = new Set([version.authorId, ...editorIdsOf(version.id)]);
	return signers.filter((p) => !excluded.has(p.id));
}

export interface QueuedVersion {
	recipeId: string;
	recipeName: string;
	n: number;
	submittedAt: Date | null;
	authorName: string;
	reviewers: Reviewer[];
}

function versionsInReview(): (QueuedVersion & { versionId: string; authorId: string })[] {
	const signers = activeSigners();
	return db
		.select({
			versionId: recipeVersion.id,
			authorId: recipeVersion.authorId,
			recipeId: recipe.id,
			recipeName: recipe.name,
			n: recipeVersion.n,
			submittedAt: recipeVersion.submittedAt,
			authorName: user.name
		})
		.from(recipeVersion)
		.innerJoin(recipe, eq(recipe.id, recipeVersion.recipeId))
		.innerJoin(user, eq(user.id, recipeVersion.authorId))
		.where(eq(recipeVersion.status, 'in_review'))
		.orderBy(asc(recipeVersion.submittedAt))
		.all()
		.map((row) => ({
			...row,
			reviewers: eligibleReviewers({ id: row.versionId, authorId: row.authorId }, signers)
		}));
}

/** The overview's two lists: versions this person may review, and their own versions in review. */
export function reviewQueueFor(personId: string): {
	waitingForMe: QueuedVersion[];
	mineInReview: QueuedVersion[];
} {
	const all = versionsInReview();
	const strip = ({
		versionId: _v,
		authorId: _a,
		...rest
	}: QueuedVersion & { versionId: string; authorId: string }) => rest;
	return {
		waitingForMe: all.filter((v) => v.reviewers.some((r) => r.id === personId)).map(strip),
		mineInReview: all.filter((v) => v.authorId === personId).map(strip)
	};
}

/** Mails each eligible reviewer that the version waits for review; the addresses it went to. */
export async function mailReviewers(version: {
	id: string;
	recipeId: string;
	authorId: string;
	n: number;
}): Promise<string[]> {
	const reviewers = eligibleReviewers(version);
	if (!reviewers.length) return [];
	const found = db.select().from(recipe).where(eq(recipe.id, version.recipeId)).get();
	const author = db.select().from(user).where(eq(user.id, version.authorId)).get();
	const link = `${config.origin}/recipes/${version.recipeId}/versions/${version.n}`;
	await sendMail({
		to: reviewers.map((r) => r.email),
		subject: `For review: ${found?.name ?? 'a recipe'}, version ${version.n}`,
		text: [
			`${author?.name ?? 'A colleague'} submitted ${found?.name ?? 'a recipe'}, version ${version.n}, for review.`,
			'',
			`You are one of ${countOf(reviewers.length, 'person', 'people')} who may review and approve it: ${link}`,
			'',
			'Open the version to see its analysis and any warnings; the sign form asks you to acknowledge each one.'
		].join('\n')
	});
	return reviewers.map((r) => r.email);
}

/**
 * After a submission: mails the reviewers and says what came of it, as the author reads it. A mail
 * that cannot be sent does not undo the submission.
 */
export async function tellReviewers(version: {
	id: string;
	recipeId: string;
	authorId: string;
	n: number;
}): Promise<{ mailed: number; told: string }> {
	try {
		const to = await mailReviewers(version);
		return to.length
			? { mailed: to.length, told: `${countOf(to.length, 'reviewer')} told by mail.` }
			: {
					mailed: 0,
					told: 'Nobody else may review it yet: ask an administrator to give someone the role.'
				};
	} catch {
		return { mailed: 0, told: 'The mail to the reviewers could not be sent; tell them yourself.' };
	}
}
