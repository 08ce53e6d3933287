import { count } from 'drizzle-orm';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import type { DraftFieldsInput } from '$lib/recipes';
import { versionResponse } from '$lib/server/api/operations/recipes';
import { db } from '$lib/server/db';
import { recipe } from '$lib/server/db/schema';
import { checkDraft } from '$lib/server/recipes/draft';
import { recipeHeadSchema, saveEditedDraft } from '$lib/server/recipes/draft-writes';
import { createRecipe } from '$lib/server/recipes/drafts';
import { findVersion } from '$lib/server/recipes/queries';
import { submitForReview } from '$lib/server/recipes/workflow';
import { asProblems, bodyAs, byPath, callRoute, problemOf } from './api-write-calls';
import {
	at,
	lastAudit,
	LINES,
	stateOf,
	unique,
	VERSION,
	etagOf as etagAs
} from './api-write-recipe-helpers';
import { makeUser, refusalOf } from './helpers';
import { draftRecipe, EMPTY_FIELDS, line, loadLibrary } from './recipes-fixtures';

// The endpoints' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

type Person = Awaited<ReturnType<typeof makeUser>> & { name: string };
let author: Person;
let engineer: Person;

beforeAll(async () => {
	loadLibrary();
	author = { ...(await makeUser(['media_scientist'])), name: 'API author' };
	engineer = { ...(await makeUser(['engineer'])), name: 'API engineer' };
});

const recipeCount = () => db.select({ n: count() }).from(recipe).get()!.n;
const etagOf = (recipeId: string, n = 1) => etagAs(author, recipeId, n);

describe('GET /api/v1/recipes/{id}/versions/{n}', () => {
	it('sends the version’s revision as its ETag', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const response = await callRoute('GET', VERSION, {
			user: engineer,
			params: at(draft.recipeId)
		});
		const body = await bodyAs(versionResponse, response);
		expect(body.version.revision).toBe(draft.revision);
		expect(response.headers.get('etag')).toBe(`"${draft.revision}"`);
	});
});

describe('POST /api/v1/recipes', () => {
	it('creates the recipe with its version 1 draft: fields and lines, Location and ETag', async () => {
		const name = `API basal ${unique()}`;
		const response = await callRoute('POST', '/api/v1/recipes', {
			user: author,
			body: {
				name,
				kind: 'basal',
				targetPh: 7.2,
				preparationTemperatureC: '30',
				instructions: 'Dissolve in order.',
				lines: [
					{ componentId: 'sodium-chloride', amount: 5, unit: 'g/L' },
					{ componentId: 'd-glucose', amount: '20', unit: 'mM', tolerancePercent: 1 }
				]
			}
		});
		expect(response.status).toBe(201);
		const body = await bodyAs(versionResponse, response);
		expect(response.headers.get('location')).toBe(`/api/v1/recipes/${body.recipe.id}/versions/1`);
		expect(response.headers.get('etag')).toBe(`"${body.version.revision}"`);
		expect(body.recipe).toMatchObject({ name, kind: 'basal', ownerId: author.id });
		expect(body.version).toMatchObject({
			n: 1,
			status: 'draft',
			targetPh: 7.2,
			preparationTemperatureC: 30,
			instructions: 'Dissolve in order.'
		});
		expect(body.lines.map((l) => [l.componentId, l.amount, l.unit, l.tolerancePercent])).toEqual([
			['sodium-chloride', 5, 'g/L', 2],
			['d-glucose', 20, 'mM', 1]
		]);
		expect(lastAudit('recipe', body.recipe.id)).toMatchObject({
			action: 'recipe.created',
			actorId: author.id,
			detail: { name, kind: 'basal', versionId: body.version.id, lines: 2 }
		});
	});

	it('without lines writes the same audit entry as the new-recipe page', async () => {
		const response = await callRoute('POST', '/api/v1/recipes', {
			user: author,
			body: { name: `API feed ${unique()}`, kind: 'feed' }
		});
		const body = await bodyAs(versionResponse, response);
		const pageMade = createRecipe(author, { name: `Page feed ${unique()}`, kind: 'feed' });
		const ours = lastAudit('recipe', body.recipe.id);
		const page = lastAudit('recipe', pageMade);
		expect(ours.action).toBe(page.action);
		expect(Object.keys(ours.detail as object).sort()).toEqual(
			Object.keys(page.detail as object).sort()
		);
		expect(body.version.preparationTemperatureC).toBe(
			findVersion(pageMade, 1)!.preparationTemperatureC
		);
	});

	it('refuses every mistake at once, at its body path, in the pages’ words, and stores nothing', async () => {
		const before = recipeCount();
		const fields = { targetPh: '15', osmolalityMinMOsmPerKg: 400, osmolalityMaxMOsmPerKg: 300 };
		const sentLines = [
			{ componentId: 'sodium-chlorde', amount: 5, unit: 'g/L' },
			{ componentId: 'd-glucose', unit: 'g/L' },
			{ kind: 'stock', amount: 5, unit: 'g/L' }
		];
		const response = await callRoute('POST', '/api/v1/recipes', {
			user: author,
			body: { name: '  ', kind: 'soup', ...fields, lines: sentLines }
		});
		expect(response.status).toBe(400);
		const problem = await problemOf(response);
		// The same values through the new-recipe form's schema and the editor's check.
		const head = recipeHeadSchema.safeParse({ name: '  ', kind: 'soup' });
		const editor = checkDraft(
			{
				fields: {
					...EMPTY_FIELDS,
					targetPh: '15',
					osmolalityMinMOsmPerKg: '400',
					osmolalityMaxMOsmPerKg: '300',
					instructions: ''
				},
				lines: [line('sodium-chlorde', 5), line('d-glucose', ''), { ...line('', 5), kind: 'stock' }]
			},
			null
		);
		expect(head.success || editor.ok).toBe(false);
		const expected = [
			...head.error!.issues.map((i) => ({ path: String(i.path[0]), message: i.message })),
			...asProblems(editor.ok ? {} : editor.fieldErrors)
		];
		expect(byPath(problem.errors!)).toEqual(byPath(expected));
		expect(problem.errors).toEqual(
			expect.arrayContaining([
				{ path: 'name', message: 'Give the recipe a name.' },
				{ path: 'kind', message: 'Choose what kind of recipe this is.' },
				{ path: 'targetPh', message: 'Target pH is between 0 and 14, not 15.' },
				{ path: 'lines.1.amount', message: 'Line 2: give an amount.' },
				{
					path: 'lines.0.componentId',
					message: expect.stringMatching(
						/^Line 1: no component “sodium-chlorde” in the library; did you mean Sodium chloride \(NaCl\)/
					)
				}
			])
		);
		expect(problem.detail).toMatch(/^Nothing was saved: \d+ inputs need attention\./);
		expect(recipeCount()).toBe(before);
	});

	it('refuses a name another recipe has, as the page’s rule does', async () => {
		const name = `API taken ${unique()}`;
		createRecipe(author, { name, kind: 'basal' });
		const before = recipeCount();
		const response = await callRoute('POST', '/api/v1/recipes', {
			user: author,
			body: { name: name.toUpperCase(), kind: 'feed' }
		});
		const rule = await refusalOf(() =>
			createRecipe(author, { name: name.toUpperCase(), kind: 'feed' })
		);
		expect(response.status).toBe(rule.status);
		expect((await problemOf(response)).errors).toEqual([{ path: 'name', message: rule.message }]);
		expect(recipeCount()).toBe(before);
	});

	it('refuses a misspelt key and a person who may not write recipes', async () => {
		const misspelt = await callRoute('POST', '/api/v1/recipes', {
			user: author,
			body: { name: 'x', kind: 'basal', targetPH: 7 }
		});
		expect(misspelt.status).toBe(400);
		expect((await problemOf(misspelt)).errors?.[0].path).toBe('targetPH');
		const before = recipeCount();
		const refused = await callRoute('POST', '/api/v1/recipes', {
			user: engineer,
			body: { name: `Engineer's ${unique()}`, kind: 'basal' }
		});
		expect(refused.status).toBe(403);
		expect((await problemOf(refused)).type).toBe('urn:brothwright:problem:forbidden');
		expect(recipeCount()).toBe(before);
	});
});

describe('PUT /api/v1/recipes/{id}/versions/{n}/lines', () => {
	const newLines = [
		{ componentId: 'sodium-chloride', amount: 6, unit: 'g/L' },
		{ componentId: 'd-glucose', amount: '10', unit: 'g/L', tolerancePercent: 1, note: 'anhydrous' }
	];

	it('saves the lines as the editor does: new revision as ETag, the same audit entry', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const twin = draftRecipe(author, [line('sodium-chloride', 5)]);
		const response = await callRoute('PUT', LINES, {
			user: author,
			params: at(draft.recipeId),
			ifMatch: await etagOf(draft.recipeId),
			body: { lines: newLines }
		});
		expect(response.status).toBe(200);
		const body = await bodyAs(versionResponse, response);
		expect(response.headers.get('etag')).toBe(`"${draft.revision + 1}"`);
		expect(body.lines.map((l) => [l.componentId, l.amount, l.note])).toEqual([
			['sodium-chloride', 6, ''],
			['d-glucose', 10, 'anhydrous']
		]);
		// The editor's save of the same lines on a twin draft, through the page's own function.
		const saved = saveEditedDraft(
			author,
			{ recipeId: twin.recipeId, versionId: twin.versionId, revision: twin.revision },
			{
				fields: EMPTY_FIELDS,
				lines: [
					line('sodium-chloride', 6),
					line('d-glucose', 10, 'g/L', { tolerancePercent: '1', note: 'anhydrous' })
				]
			}
		);
		expect(saved.ok).toBe(true);
		const ours = lastAudit('recipe_version', draft.versionId);
		const page = lastAudit('recipe_version', twin.versionId);
		expect(ours.action).toBe('recipe.draft_saved');
		expect(ours.detail).toEqual(page.detail);
		expect(ours.detail).toMatchObject({
			changes: {},
			lineChanges: [
				{ position: 1, from: { amount: 5 }, to: { amount: 6 } },
				{ position: 2, from: null, to: { componentId: 'd-glucose', tolerancePercent: 1 } }
			]
		});
	});

	it('refuses bad lines with the editor’s messages at lines.<i>.<field> and changes nothing', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const sent = [
			{ componentId: 'sodium-chloride', amount: '-1', unit: 'g/L' },
			{ componentId: 'sodium-chloride', amount: 1, unit: 'furlongs' },
			{ kind: 'stock', stockRecipeId: 'no-such-stock', amount: '2', unit: 'mL/L' },
			{ componentId: 'd-glucose', amount: '1,5', unit: 'g/L', tolerancePercent: 80 }
		];
		const before = stateOf(draft.recipeId);
		const response = await callRoute('PUT', LINES, {
			user: author,
			params: at(draft.recipeId),
			ifMatch: await etagOf(draft.recipeId),
			body: { lines: sent }
		});
		expect(response.status).toBe(400);
		const editor = checkDraft(
			{
				fields: EMPTY_FIELDS,
				lines: [
					line('sodium-chloride', '-1'),
					line('sodium-chloride', 1, 'furlongs'),
					{ ...line('', 2, 'mL/L'), kind: 'stock', stockRecipeId: 'no-such-stock' },
					line('d-glucose', '1,5', 'g/L', { tolerancePercent: '80' })
				]
			},
			draft.recipeId
		);
		expect(editor.ok).toBe(false);
		const problem = await problemOf(response);
		expect(byPath(problem.errors!)).toEqual(
			byPath(asProblems(editor.ok ? {} : editor.fieldErrors))
		);
		expect(problem.errors!.map((e) => e.path)).toEqual(
			expect.arrayContaining([
				'lines.0.amount',
				'lines.1.componentId',
				'lines.1.unit',
				'lines.2.stockRecipeId',
				'lines.3.amount',
				'lines.3.tolerancePercent'
			])
		);
		expect(stateOf(draft.recipeId)).toEqual(before);
	});

	it('answers 412 to a stale If-Match and 428 without one, changing nothing', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const stale = await etagOf(draft.recipeId);
		const first = await callRoute('PUT', LINES, {
			user: author,
			params: at(draft.recipeId),
			ifMatch: stale,
			body: { lines: newLines }
		});
		expect(first.status).toBe(200);
		const after = stateOf(draft.recipeId);
		const again = await callRoute('PUT', LINES, {
			user: author,
			params: at(draft.recipeId),
			ifMatch: stale,
			body: { lines: [{ componentId: 'sodium-chloride', amount: 9, unit: 'g/L' }] }
		});
		expect(again.status).toBe(412);
		expect((await problemOf(again)).type).toBe('urn:brothwright:problem:stale-edit');
		const blind = await callRoute('PUT', LINES, {
			user: author,
			params: at(draft.recipeId),
			body: { lines: [{ componentId: 'sodium-chloride', amount: 9, unit: 'g/L' }] }
		});
		expect(blind.status).toBe(428);
		expect(stateOf(draft.recipeId)).toEqual(after);
	});

	it('answers 404 for an unknown recipe or version, 403 for a role without recipe.edit, 409 past draft', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const body = { lines: newLines };
		for (const params of [
			at('no-such-recipe'),
			at(draft.recipeId, 9),
			{ id: draft.recipeId, n: 'x' }
		]) {
			const response = await callRoute('PUT', LINES, {
				user: author,
				params,
				ifMatch: '"1"',
				body
			});
			expect(response.status, JSON.stringify(params)).toBe(404);
		}
		const before = stateOf(draft.recipeId);
		const refused = await callRoute('PUT', LINES, {
			user: engineer,
			params: at(draft.recipeId),
			ifMatch: await etagOf(draft.recipeId),
			body
		});
		expect(refused.status).toBe(403);
		expect(stateOf(draft.recipeId)).toEqual(before);
		submitForReview(author, draft.versionId, draft.revision);
		const locked = await callRoute('PUT', LINES, {
			user: author,
			params: at(draft.recipeId),
			ifMatch: await etagOf(draft.recipeId),
			body
		});
		expect(locked.status).toBe(409);
		expect((await problemOf(locked)).detail).toBe(
			'Version 1 is in review and can no longer be edited; start a new draft from it.'
		);
	});
});

describe('PUT /api/v1/recipes/{id}/versions/{n}', () => {
	it('saves the fields sent, keeps the others and the lines, and audits each change', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const response = await callRoute('PUT', VERSION, {
			user: author,
			params: at(draft.recipeId),
			ifMatch: await etagOf(draft.recipeId),
			body: { targetPh: 7.4, storage: '2–8 °C, dark', shelfLifeDays: '30', changeNote: null }
		});
		expect(response.status).toBe(200);
		const body = await bodyAs(versionResponse, response);
		expect(body.version).toMatchObject({
			targetPh: 7.4,
			storage: '2–8 °C, dark',
			shelfLifeDays: 30,
			instructions: 'Dissolve in order.',
			preparationTemperatureC: 25,
			revision: draft.revision + 1
		});
		expect(body.lines.map((l) => l.amount)).toEqual([5]);
		expect(lastAudit('recipe_version', draft.versionId)).toMatchObject({
			action: 'recipe.draft_saved',
			detail: {
				changes: {
					targetPh: { from: 7, to: 7.4 },
					storage: { from: '', to: '2–8 °C, dark' },
					shelfLifeDays: { from: null, to: 30 }
				},
				lineChanges: []
			}
		});
		const cleared = await callRoute('PUT', VERSION, {
			user: author,
			params: at(draft.recipeId),
			ifMatch: response.headers.get('etag')!,
			body: { instructions: null }
		});
		expect((await bodyAs(versionResponse, cleared)).version.instructions).toBe('');
	});

	it('refuses the fields as the editor does, all at once, and changes nothing', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const before = stateOf(draft.recipeId);
		const sent = {
			targetPh: '7,2',
			osmolalityMinMOsmPerKg: 400,
			osmolalityMaxMOsmPerKg: '300',
			shelfLifeDays: 1.5,
			preparationTemperatureC: 140
		};
		const response = await callRoute('PUT', VERSION, {
			user: author,
			params: at(draft.recipeId),
			ifMatch: await etagOf(draft.recipeId),
			body: sent
		});
		expect(response.status).toBe(400);
		const typed: DraftFieldsInput = {
			...EMPTY_FIELDS,
			targetPh: '7,2',
			osmolalityMinMOsmPerKg: '400',
			osmolalityMaxMOsmPerKg: '300',
			shelfLifeDays: '1.5',
			preparationTemperatureC: '140'
		};
		const editor = checkDraft(
			{ fields: typed, lines: [line('sodium-chloride', 5)] },
			draft.recipeId
		);
		const problem = await problemOf(response);
		expect(byPath(problem.errors!)).toEqual(
			byPath(asProblems(editor.ok ? {} : editor.fieldErrors))
		);
		expect(problem.errors!.map((e) => e.path).sort()).toEqual([
			'osmolalityMaxMOsmPerKg',
			'preparationTemperatureC',
			'shelfLifeDays',
			'targetPh'
		]);
		expect(stateOf(draft.recipeId)).toEqual(before);
		const stale = await callRoute('PUT', VERSION, {
			user: author,
			params: at(draft.recipeId),
			ifMatch: `"${draft.revision - 1}"`,
			body: { targetPh: 7 }
		});
		expect(stale.status).toBe(412);
		const blind = await callRoute('PUT', VERSION, {
			user: author,
			params: at(draft.recipeId),
			body: { targetPh: 7 }
		});
		expect(blind.status).toBe(428);
		expect(stateOf(draft.recipeId)).toEqual(before);
	});
});
