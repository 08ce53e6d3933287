import { count, eq, ne } from 'drizzle-orm';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { runResponse } from '$lib/server/api/operations/run-writes';
import { auditEventsFor } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { batch, run, study } from '$lib/server/db/schema';
import {
	createRun,
	RUN_FORM_DEFAULTS,
	runBatchLinkSchema,
	runSchema
} from '$lib/server/runs/run-store';
import { studyRecord } from '$lib/server/studies/study-api';
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
let yeastId: string;

beforeAll(async () => {
	engineer = { ...(await makeUser(['engineer'])), name: 'API engineer' };
	technician = { ...(await makeUser(['prep_technician'])), name: 'API technician' };
	yeastId = db
		.select()
		.from(study)
		.where(eq(study.name, 'Yeast glycerol fed-batch, bench (demo)'))
		.get()!.id;
});

const unique = () => crypto.randomUUID().slice(0, 8);
const lastAudit = (subjectType: string, id: string) => auditEventsFor(subjectType, id, 1)[0];

describe('runs', () => {
	const RUN = '/api/v1/runs/[id]';
	const runState = (id: string) => db.select().from(run).where(eq(run.id, id)).get()!;

	async function newRun(body: Record<string, unknown> = {}) {
		return callRoute('POST', '/api/v1/runs', {
			user: engineer,
			body: {
				name: `API run ${unique()}`,
				studyId: yeastId,
				startedAt: '2026-12-02T09:30',
				...body
			}
		});
	}

	it('POST starts a run as /runs/new: the study’s vessel and organism, the form’s gas reference, its audit', async () => {
		const response = await newRun({ people: 'A. Tester' });
		expect(response.status).toBe(201);
		const body = await bodyAs(runResponse, response);
		const plan = studyRecord(yeastId);
		expect(response.headers.get('location')).toBe(`/api/v1/runs/${body.run.id}`);
		expect(response.headers.get('etag')).toBe(`"${body.run.revision}"`);
		expect(body.run).toMatchObject({
			number: expect.stringMatching(/^RUN-2026-\d{3}$/),
			state: 'open',
			vesselId: plan.vesselId,
			profileId: plan.profileId,
			gasReferenceTemperatureC: Number(RUN_FORM_DEFAULTS.gasReferenceTemperatureC),
			gasReferencePressureKPa: Number(RUN_FORM_DEFAULTS.gasReferencePressureKPa),
			people: 'A. Tester'
		});
		const page = createRun(
			engineer,
			runSchema.parse({
				...RUN_FORM_DEFAULTS,
				name: 'Page run',
				studyId: yeastId,
				startedAt: '2026-12-02T09:30'
			})
		);
		const ours = lastAudit('run', body.run.id);
		const theirs = lastAudit('run', page.id);
		expect(ours.action).toBe('run.created');
		expect(Object.keys(ours.detail as object).sort()).toEqual(
			Object.keys(theirs.detail as object).sort()
		);
		expect(ours.detail).toMatchObject({ number: body.run.number, studyId: yeastId });
	});

	it('POST refuses what the new-run form refuses, all its fields at once, then the store’s rule', async () => {
		const before = db.select({ n: count() }).from(run).get()!.n;
		const sent = {
			name: '',
			studyId: '',
			gasReferenceTemperatureC: 500,
			gasReferencePressureKPa: 'x'
		};
		const response = await newRun({ ...sent, startedAt: '' });
		const page = runSchema.safeParse({ ...RUN_FORM_DEFAULTS, ...sent, startedAt: '' });
		const problem = await problemOf(response);
		expect(response.status).toBe(400);
		expect(byPath(problem.errors!)).toEqual(
			byPath(page.error!.issues.map((i) => ({ path: String(i.path[0]), message: i.message })))
		);
		expect(problem.errors!.map((e) => e.path).sort()).toEqual([
			'gasReferencePressureKPa',
			'gasReferenceTemperatureC',
			'name',
			'startedAt',
			'studyId'
		]);
		const badStart = await newRun({ startedAt: '2026-02-30T09:00' });
		const rule = await refusalOf(() =>
			createRun(
				engineer,
				runSchema.parse({
					...RUN_FORM_DEFAULTS,
					name: 'x',
					studyId: yeastId,
					startedAt: '2026-02-30T09:00'
				})
			)
		);
		expect((await problemOf(badStart)).errors).toEqual([
			{ path: 'startedAt', message: rule.message }
		]);
		const noStudy = await newRun({ studyId: 'no-such-study' });
		expect((await problemOf(noStudy)).errors).toEqual([
			{
				path: 'studyId',
				message: 'Choose the study this run follows: the one given does not exist.'
			}
		]);
		const refused = await callRoute('POST', '/api/v1/runs', {
			user: technician,
			body: { name: 'x', studyId: yeastId, startedAt: '2026-12-02T09:30' }
		});
		expect(refused.status).toBe(403);
		expect(db.select({ n: count() }).from(run).get()!.n).toBe(before);
	});

	it('GET answers the run with its ETag; 404 for an unknown id', async () => {
		const created = await bodyAs(runResponse, await newRun());
		const response = await callRoute('GET', RUN, {
			user: technician,
			params: { id: created.run.id }
		});
		expect(response.headers.get('etag')).toBe(`"${created.run.revision}"`);
		expect((await bodyAs(runResponse, response)).run.number).toBe(created.run.number);
		expect((await callRoute('GET', RUN, { user: engineer, params: { id: 'nope' } })).status).toBe(
			404
		);
	});

	it('close and reopen with If-Match as the page does: audit, 409 when already so, the reason required', async () => {
		const created = await newRun();
		const id = (await bodyAs(runResponse, created)).run.id;
		const etag = created.headers.get('etag')!;
		const close = (ifMatch?: string) =>
			callRoute('POST', `${RUN}/close`, { user: engineer, params: { id }, ifMatch });
		const reopen = (body: unknown, ifMatch?: string) =>
			callRoute('POST', `${RUN}/reopen`, { user: engineer, params: { id }, ifMatch, body });
		expect((await close()).status).toBe(428);
		expect(runState(id).state).toBe('open');
		const closed = await close(etag);
		expect(closed.status).toBe(200);
		const closedBody = await bodyAs(runResponse, closed);
		expect(closedBody.run.state).toBe('closed');
		expect(closedBody.run.endedAt).not.toBeNull();
		expect(lastAudit('run', id)).toMatchObject({ action: 'run.closed', detail: { reason: null } });
		const closedTag = closed.headers.get('etag')!;
		expect(closedTag).toBe(`"${closedBody.run.revision}"`);
		expect((await close(etag)).status).toBe(412);
		const again = await close(closedTag);
		expect(again.status).toBe(409);
		expect((await problemOf(again)).detail).toBe('The run has already ended.');
		const noReason = await reopen({ reason: '  ' }, closedTag);
		expect((await problemOf(noReason)).errors).toEqual([
			{ path: 'reason', message: 'Say why the run is opened again.' }
		]);
		expect((await reopen({ reason: 'More data' }, etag)).status).toBe(412);
		expect(runState(id).state).toBe('closed');
		const reopened = await reopen({ reason: 'Feed pump restarted' }, closedTag);
		expect((await bodyAs(runResponse, reopened)).run.state).toBe('open');
		expect(lastAudit('run', id)).toMatchObject({
			action: 'run.reopened',
			detail: { reason: 'Feed pump restarted' }
		});
		const byTechnician = await callRoute('POST', `${RUN}/close`, {
			user: technician,
			params: { id },
			ifMatch: reopened.headers.get('etag')!
		});
		expect(byTechnician.status).toBe(403);
		expect(runState(id).state).toBe('open');
		expect(
			(
				await callRoute('POST', `${RUN}/close`, {
					user: engineer,
					params: { id: 'nope' },
					ifMatch: '"1"'
				})
			).status
		).toBe(404);
	});

	it('links a released batch by number as the page: 201 with the run, its audit; the page’s refusals', async () => {
		const id = (await bodyAs(runResponse, await newRun())).run.id;
		const link = (body: unknown, user: Person = engineer) =>
			callRoute('POST', `${RUN}/batches`, { user, params: { id }, body });
		const released = db.select().from(batch).where(eq(batch.state, 'released')).get()!;
		const linked = await link({ batchNumber: released.number, role: 'medium' });
		expect(linked.status).toBe(201);
		expect(linked.headers.get('location')).toBe(`/api/v1/runs/${id}`);
		const body = await bodyAs(runResponse, linked);
		expect(body.batches.map((b) => [b.number, b.role])).toEqual([[released.number, 'medium']]);
		expect(lastAudit('run', id)).toMatchObject({
			action: 'run.batch_linked',
			detail: { batchId: released.id, batchNumber: released.number, role: 'medium' }
		});
		const twice = await link({ batchNumber: released.number, role: 'feed' });
		expect(twice.status).toBe(409);
		expect((await problemOf(twice)).errors).toEqual([
			{ path: 'batchNumber', message: `Batch ${released.number} is already linked to this run.` }
		]);
		const role = await link({ batchNumber: released.number, role: 'broth' });
		const pageRole = runBatchLinkSchema.safeParse({ batchNumber: released.number, role: 'broth' });
		expect((await problemOf(role)).errors).toEqual([
			{ path: 'role', message: pageRole.error!.issues[0].message }
		]);
		const other = db.select().from(batch).where(ne(batch.state, 'released')).get()!;
		const notReleased = await problemOf(await link({ batchNumber: other.number, role: 'feed' }));
		expect(notReleased.errors![0]).toMatchObject({
			path: 'batchNumber',
			message: expect.stringMatching(/not released: only a released batch may go into a run\.$/)
		});
		expect((await problemOf(await link({ batchNumber: ' ', role: 'feed' }))).errors).toEqual([
			{ path: 'batchNumber', message: 'Scan or type the batch number.' }
		]);
		expect((await link({ batchNumber: released.number, role: 'feed' }, technician)).status).toBe(
			403
		);
		expect(
			(
				await callRoute('POST', `${RUN}/batches`, {
					user: engineer,
					params: { id: 'nope' },
					body: { batchNumber: released.number, role: 'feed' }
				})
			).status
		).toBe(404);
		const stored = await bodyAs(
			runResponse,
			await callRoute('GET', RUN, { user: engineer, params: { id } })
		);
		expect(stored.batches).toHaveLength(1);
	});
});
