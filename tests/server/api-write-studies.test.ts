import { count, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { studyResponse } from '$lib/server/api/operations/study-writes';
import { auditEventsFor } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { recipe, recipeVersion, study } from '$lib/server/db/schema';
import { studyBodyPath, studyRecord } from '$lib/server/studies/study-api';
import { studySchema } from '$lib/server/studies/study-form';
import { createStudy } from '$lib/server/studies/study-store';
import { bodyAs, byPath, callRoute, problemOf } from './api-write-calls';
import { makeUser, refusalOf } from './helpers';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

// The endpoints' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

type Person = Awaited<ReturnType<typeof makeUser>> & { name: string };
let engineer: Person;
let technician: Person;
const YEAST_STUDY = 'Yeast glycerol fed-batch, bench (demo)';
let yeastId: string;

beforeAll(async () => {
	engineer = { ...(await makeUser(['engineer'])), name: 'API engineer' };
	technician = { ...(await makeUser(['prep_technician'])), name: 'API technician' };
	yeastId = db.select().from(study).where(eq(study.name, YEAST_STUDY)).get()!.id;
});

const unique = () => crypto.randomUUID().slice(0, 8);
const studyCount = () => db.select({ n: count() }).from(study).get()!.n;
const lastAudit = (subjectType: string, id: string) => auditEventsFor(subjectType, id, 1)[0];

/** The demo yeast study as a POST body: its fields and feeds, under another name. */
function yeastBody(name = `API study ${unique()}`) {
	const {
		id: _id,
		createdById: _by,
		createdByName: _byName,
		revision: _revision,
		createdAt: _created,
		updatedAt: _updated,
		feeds,
		...fields
	} = studyRecord(yeastId);
	return { ...fields, name, feeds };
}

/** The same values as the study form would hold them: each feed in its slot, blanks as ''. */
function asForm(body: { feeds: object[] } & Record<string, unknown>): Record<string, unknown> {
	const { feeds, ...fields } = body;
	const form: Record<string, unknown> = Object.fromEntries(
		Object.entries(fields).map(([k, v]) => [k, v ?? ''])
	);
	feeds.forEach((feed, i) => {
		for (const [key, value] of Object.entries(feed))
			form[`feed${i + 1}${key[0].toUpperCase()}${key.slice(1)}`] = value ?? '';
	});
	return form;
}

const versionOfKind = (kind: 'basal' | 'feed') =>
	db
		.select({ id: recipeVersion.id })
		.from(recipeVersion)
		.innerJoin(recipe, eq(recipeVersion.recipeId, recipe.id))
		.where(eq(recipe.kind, kind))
		.get()!.id;

describe('POST /api/v1/studies', () => {
	it('saves the study as the new-study form does: 201, Location, ETag and the page’s audit entry', async () => {
		const body = yeastBody();
		const response = await callRoute('POST', '/api/v1/studies', { user: engineer, body });
		expect(response.status).toBe(201);
		const saved = await bodyAs(studyResponse, response);
		expect(response.headers.get('location')).toBe(`/api/v1/studies/${saved.id}`);
		expect(response.headers.get('etag')).toBe(`"${saved.revision}"`);
		expect(saved).toMatchObject({ name: body.name, targetValue: body.targetValue });
		expect(saved.feeds).toEqual(body.feeds);
		// The page's own store with the same values, under a third name.
		const parsed = studySchema.parse(asForm(yeastBody(`Page study ${unique()}`)));
		const pageId = await createStudy(engineer, parsed);
		const ours = lastAudit('study', saved.id);
		const page = lastAudit('study', pageId);
		expect(ours.action).toBe('study.created');
		expect(ours.action).toBe(page.action);
		expect(ours.detail).toEqual({ name: body.name });
		expect(Object.keys(page.detail as object)).toEqual(['name']);
	});

	it('refuses every mistake at once with the form’s words (labels), each feed’s at feeds.<i>', async () => {
		const before = studyCount();
		const body = {
			...yeastBody(),
			name: '',
			targetValue: -1,
			durationH: 'two days',
			safetyFactor: 9,
			feeds: [
				{ versionId: versionOfKind('feed'), volumeL: 2, strategy: 'exponential', startH: 8 },
				{ volumeL: 1, strategy: 'doStat', startH: 99 }
			]
		};
		const response = await callRoute('POST', '/api/v1/studies', { user: engineer, body });
		expect(response.status).toBe(400);
		const problem = await problemOf(response);
		const page = studySchema.safeParse(asForm(body));
		expect(page.success).toBe(false);
		const expected = page.error!.issues.map((i) => ({
			path: studyBodyPath(String(i.path[0])),
			message: i.message
		}));
		expect(byPath(problem.errors!)).toEqual(byPath(expected));
		expect(problem.errors).toEqual(
			expect.arrayContaining([
				{ path: 'name', message: 'Name is required' },
				{ path: 'targetValue', message: 'Target density must be greater than 0' },
				{ path: 'safetyFactor', message: 'Safety factor must be at most 5' },
				{
					path: 'feeds.0.muSetPerH',
					message: 'An exponential plan needs μset, the growth rate it is shaped for.'
				},
				{
					path: 'feeds.1.versionId',
					message: 'Choose the feed recipe version for this volume, or clear the volume.'
				},
				{ path: 'feeds.1.maxRateLPerH', message: "A DO-stat plan needs the pump's top rate, L/h." }
			])
		);
		expect(problem.errors!.some((e) => e.path === 'durationH')).toBe(true);
		expect(problem.errors!.every((e) => !/feed\d[A-Z]/.test(e.message))).toBe(true);
		expect(studyCount()).toBe(before);
	});

	it('refuses a target beyond physical sense as the save does, at targetValue', async () => {
		const body = { ...yeastBody(), targetValue: 500 };
		const before = studyCount();
		const response = await callRoute('POST', '/api/v1/studies', { user: engineer, body });
		const rule = await refusalOf(() =>
			createStudy(engineer, studySchema.parse(asForm({ ...body, name: `Twin ${unique()}` })))
		);
		expect(rule.field).toBe('targetValue');
		expect(response.status).toBe(rule.status);
		expect((await problemOf(response)).errors).toEqual([
			{ path: 'targetValue', message: rule.message }
		]);
		expect(rule.message).toMatch(/beyond physical sense/);
		expect(studyCount()).toBe(before);
	});

	it('refuses references of the wrong kind at their body paths, and a name already used (409)', async () => {
		const basal = versionOfKind('basal');
		const wrongBasal = await callRoute('POST', '/api/v1/studies', {
			user: engineer,
			body: { ...yeastBody(), basalVersionId: versionOfKind('feed') }
		});
		expect((await problemOf(wrongBasal)).errors).toEqual([
			{ path: 'basalVersionId', message: 'The basal medium must be a version of a basal recipe.' }
		]);
		const body = yeastBody();
		const wrongFeed = await callRoute('POST', '/api/v1/studies', {
			user: engineer,
			body: { ...body, feeds: [body.feeds[0], { ...body.feeds[0], versionId: basal }] }
		});
		expect((await problemOf(wrongFeed)).errors).toEqual([
			{ path: 'feeds.1.versionId', message: 'A feed must be a version of a feed recipe.' }
		]);
		const taken = await callRoute('POST', '/api/v1/studies', {
			user: engineer,
			body: yeastBody(YEAST_STUDY)
		});
		expect(taken.status).toBe(409);
		expect((await problemOf(taken)).errors).toEqual([
			{ path: 'name', message: 'A study with this name exists; choose another name.' }
		]);
		const refused = await callRoute('POST', '/api/v1/studies', {
			user: technician,
			body: yeastBody()
		});
		expect(refused.status).toBe(403);
	});
});

describe('GET and PUT /api/v1/studies/{id}', () => {
	const STUDY = '/api/v1/studies/[id]';

	async function newStudy(): Promise<{ id: string; etag: string }> {
		const response = await callRoute('POST', '/api/v1/studies', {
			user: engineer,
			body: yeastBody()
		});
		const saved = await bodyAs(studyResponse, response);
		return { id: saved.id, etag: response.headers.get('etag')! };
	}

	it('GET answers the study with its revision as ETag; 404 for an unknown id', async () => {
		const response = await callRoute('GET', STUDY, { user: engineer, params: { id: yeastId } });
		const body = await bodyAs(studyResponse, response);
		expect(body.name).toBe(YEAST_STUDY);
		expect(response.headers.get('etag')).toBe(`"${body.revision}"`);
		const missing = await callRoute('GET', STUDY, { user: engineer, params: { id: 'nope' } });
		expect(missing.status).toBe(404);
	});

	it('PUT saves what is sent, keeps the rest, and audits each change as the edit form', async () => {
		const { id, etag } = await newStudy();
		const before = studyRecord(id);
		const response = await callRoute('PUT', STUDY, {
			user: engineer,
			params: { id },
			ifMatch: etag,
			body: { targetValue: 30, notes: 'Lower target for the API test' }
		});
		expect(response.status).toBe(200);
		const saved = await bodyAs(studyResponse, response);
		expect(response.headers.get('etag')).toBe(`"${before.revision + 1}"`);
		expect(saved).toMatchObject({
			targetValue: 30,
			notes: 'Lower target for the API test',
			durationH: before.durationH
		});
		expect(saved.feeds).toEqual(before.feeds);
		expect(lastAudit('study', id)).toMatchObject({
			action: 'study.updated',
			detail: {
				changes: {
					targetValue: { from: before.targetValue, to: 30 },
					notes: { from: before.notes, to: 'Lower target for the API test' }
				}
			}
		});
	});

	it('PUT refuses a stale If-Match (412), none (428), bad values, a role without study.use, and changes nothing', async () => {
		const { id, etag } = await newStudy();
		const first = await callRoute('PUT', STUDY, {
			user: engineer,
			params: { id },
			ifMatch: etag,
			body: { notes: 'first' }
		});
		expect(first.status).toBe(200);
		const after = studyRecord(id);
		const attempts = [
			{ user: engineer, ifMatch: etag, status: 412 },
			{ user: engineer, ifMatch: undefined, status: 428 },
			{ user: technician, ifMatch: first.headers.get('etag')!, status: 403 }
		];
		for (const { user, ifMatch, status } of attempts) {
			const response = await callRoute('PUT', STUDY, {
				user,
				params: { id },
				ifMatch,
				body: { notes: 'second' }
			});
			expect(response.status).toBe(status);
		}
		const bad = await callRoute('PUT', STUDY, {
			user: engineer,
			params: { id },
			ifMatch: first.headers.get('etag')!,
			body: { temperatureC: '3O', o2MoleFraction: 2 }
		});
		const form = { ...asForm(yeastBody(after.name)), temperatureC: '3O', o2MoleFraction: 2 };
		const page = studySchema.safeParse(form);
		expect(page.success).toBe(false);
		const refusal = await problemOf(bad);
		expect(refusal.errors).toHaveLength(2);
		expect(byPath(refusal.errors!)).toEqual(
			byPath(page.error!.issues.map((i) => ({ path: String(i.path[0]), message: i.message })))
		);
		expect(studyRecord(id)).toEqual(after);
		const missing = await callRoute('PUT', STUDY, {
			user: engineer,
			params: { id: 'nope' },
			ifMatch: '"1"',
			body: {}
		});
		expect(missing.status).toBe(404);
	});
});
