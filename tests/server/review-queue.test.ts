// Who may review a version in review is who may sign it: the signing roles, less its author and its
// editors; the overview's lists follow from that, for the reviewer and for the author.
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { user } from '$lib/server/db/schema';
import { findVersionById } from '$lib/server/recipes/queries';
import { eligibleReviewers, reviewQueueFor } from '$lib/server/recipes/review-queue';
import { signingRefusal, submitForReview } from '$lib/server/recipes/workflow';
import { makeUser } from './helpers';
import { draftRecipe, line } from './recipes-fixtures';

type Person = Awaited<ReturnType<typeof makeUser>>;
let author: Person;
let engineer: Person;
let scientist: Person;
let technician: Person;
let leftTheSite: Person;

beforeAll(async () => {
	author = await makeUser(['media_scientist']);
	engineer = await makeUser(['engineer']);
	scientist = await makeUser(['media_scientist']);
	technician = await makeUser(['prep_technician']);
	leftTheSite = await makeUser(['engineer']);
	db.update(user).set({ active: false }).where(eq(user.id, leftTheSite.id)).run();
});

function submitted() {
	const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
	submitForReview(author, draft.versionId, draft.revision);
	return findVersionById(draft.versionId)!;
}

describe('the review queue', () => {
	it('names as reviewers exactly those the signing rule lets sign', () => {
		const version = submitted();
		const ids = eligibleReviewers(version).map((r) => r.id);
		expect(ids).toEqual(expect.arrayContaining([engineer.id, scientist.id]));
		for (const person of [author, technician, leftTheSite]) expect(ids).not.toContain(person.id);
		// The same answer as the sign form's own check, person by person.
		for (const person of [author, engineer, scientist, technician])
			expect(ids.includes(person.id)).toBe(signingRefusal(person, version) === null);
	});

	it('shows the version as waiting for each reviewer and as in review for its author', () => {
		const version = submitted();
		const name = (p: { recipeId: string; n: number }) => `${p.recipeId}/${p.n}`;
		const key = `${version.recipeId}/${version.n}`;
		expect(reviewQueueFor(engineer.id).waitingForMe.map(name)).toContain(key);
		expect(reviewQueueFor(scientist.id).waitingForMe.map(name)).toContain(key);
		expect(reviewQueueFor(author.id).waitingForMe.map(name)).not.toContain(key);
		expect(reviewQueueFor(technician.id).waitingForMe.map(name)).not.toContain(key);
		const mine = reviewQueueFor(author.id).mineInReview.find((v) => name(v) === key)!;
		expect(mine.reviewers.map((r) => r.id)).toEqual(
			expect.arrayContaining([engineer.id, scientist.id])
		);
		expect(reviewQueueFor(engineer.id).mineInReview.map(name)).not.toContain(key);
	});
});
