import { beforeAll, describe, expect, it, vi } from 'vitest';
import { submitResponse } from '$lib/server/api/operations/recipe-writes';
import { versionResponse } from '$lib/server/api/operations/recipes';
import { findVersion, findVersionById } from '$lib/server/recipes/queries';
import { eligibleReviewers } from '$lib/server/recipes/review-queue';
import { signVersion, submitForReview } from '$lib/server/recipes/workflow';
import { bodyAs, callRoute, problemOf, type Caller } from './api-write-calls';
import {
	at,
	lastAudit,
	recipeName,
	stateOf,
	SUBMIT,
	etagOf as etagAs
} from './api-write-recipe-helpers';
import { makeUser, refusalOf } from './helpers';
import { latestMailTo, useMailStandIn } from './mail';
import { draftRecipe, line, loadLibrary } from './recipes-fixtures';

// The endpoints' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

useMailStandIn();

type Person = Awaited<ReturnType<typeof makeUser>> & { name: string };
let author: Person;
let reviewer: Person;
let engineer: Person;

beforeAll(async () => {
	loadLibrary();
	author = { ...(await makeUser(['media_scientist'])), name: 'API author' };
	reviewer = { ...(await makeUser(['media_scientist'])), name: 'API reviewer' };
	engineer = { ...(await makeUser(['engineer'])), name: 'API engineer' };
});

const etagOf = (recipeId: string, n = 1) => etagAs(author, recipeId, n);

describe('POST /api/v1/recipes/{id}/versions/{n}/submit', () => {
	it('submits the draft and mails the people who may review it, as the page does', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const response = await callRoute('POST', SUBMIT, {
			user: author,
			params: at(draft.recipeId),
			ifMatch: await etagOf(draft.recipeId)
		});
		expect(response.status).toBe(200);
		const body = await bodyAs(submitResponse, response);
		const version = findVersionById(draft.versionId)!;
		const reviewers = eligibleReviewers(version);
		expect(reviewers.map((r) => r.email)).toContain(reviewer.email);
		expect(body).toEqual({
			n: 1,
			status: 'in_review',
			reviewersMailed: reviewers.length,
			message: `Version 1 is submitted for review. ${reviewers.length} reviewers told by mail.`
		});
		expect(version.status).toBe('in_review');
		expect(latestMailTo(reviewer.email)?.subject).toBe(
			`For review: ${recipeName(draft.recipeId)}, version 1`
		);
		expect(lastAudit('recipe_version', draft.versionId)).toMatchObject({
			action: 'recipe.submitted',
			actorId: author.id,
			detail: { n: 1 }
		});
	});

	it('refuses an empty draft with the page’s rule, and a stale or missing If-Match', async () => {
		const empty = draftRecipe(author, []);
		const twin = draftRecipe(author, []);
		const response = await callRoute('POST', SUBMIT, {
			user: author,
			params: at(empty.recipeId),
			ifMatch: await etagOf(empty.recipeId)
		});
		const rule = await refusalOf(() => submitForReview(author, twin.versionId, twin.revision));
		expect(response.status).toBe(rule.status);
		expect((await problemOf(response)).detail).toBe(rule.message);
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		for (const ifMatch of [`"${draft.revision + 1}"`, undefined]) {
			const refused = await callRoute('POST', SUBMIT, {
				user: author,
				params: at(draft.recipeId),
				ifMatch
			});
			expect(refused.status).toBe(ifMatch ? 412 : 428);
		}
		expect(stateOf(draft.recipeId).status).toBe('draft');
		const notAuthor = await callRoute('POST', SUBMIT, {
			user: engineer,
			params: at(draft.recipeId),
			ifMatch: `"${draft.revision}"`
		});
		expect(notAuthor.status).toBe(403);
		expect(stateOf(draft.recipeId).status).toBe('draft');
	});
});

describe('POST /api/v1/recipes/{id}/drafts', () => {
	async function approvedRecipe() {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		submitForReview(author, draft.versionId, draft.revision);
		await signVersion(reviewer, draft.versionId, {
			password: reviewer.password,
			meaning: 'approved',
			comment: ''
		});
		return draft;
	}

	it('starts a draft from the latest version, as the page’s button, with Location and ETag', async () => {
		const approved = await approvedRecipe();
		const response = await callRoute('POST', '/api/v1/recipes/[id]/drafts', {
			user: author,
			params: { id: approved.recipeId },
			body: {}
		});
		expect(response.status).toBe(201);
		const body = await bodyAs(versionResponse, response);
		expect(response.headers.get('location')).toBe(
			`/api/v1/recipes/${approved.recipeId}/versions/2`
		);
		expect(response.headers.get('etag')).toBe(`"${body.version.revision}"`);
		expect(body.version).toMatchObject({
			n: 2,
			status: 'draft',
			basedOnVersionId: approved.versionId
		});
		expect(body.lines.map((l) => [l.componentId, l.amount])).toEqual([['sodium-chloride', 5]]);
		expect(lastAudit('recipe_version', body.version.id)).toMatchObject({
			action: 'recipe.draft_started',
			detail: { n: 2, basedOn: 1 }
		});
	});

	it('refuses a second open draft (409), a version the recipe lacks, an unknown recipe and a role without the act', async () => {
		const approved = await approvedRecipe();
		const call = (body: unknown, user: Caller = author, id = approved.recipeId) =>
			callRoute('POST', '/api/v1/recipes/[id]/drafts', { user, params: { id }, body });
		expect((await call({})).status).toBe(201);
		const second = await call({ fromVersion: 1 });
		expect(second.status).toBe(409);
		expect((await problemOf(second)).detail).toBe(
			'Version 2 is still draft; finish it (or return it to draft and edit it) before starting another.'
		);
		const missing = await problemOf(await call({ fromVersion: 7 }));
		expect(missing.errors).toEqual([
			{ path: 'fromVersion', message: `${recipeName(approved.recipeId)} has no version 7.` }
		]);
		expect((await call({}, author, 'no-such-recipe')).status).toBe(404);
		expect((await call({}, engineer)).status).toBe(403);
		expect(findVersion(approved.recipeId, 3)).toBeUndefined();
	});
});
