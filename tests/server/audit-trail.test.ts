import { eq } from 'drizzle-orm';
import Papa from 'papaparse';
import { PDFDocument } from 'pdf-lib';
import type { RequestHandler } from '@sveltejs/kit';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { allAuditEvents, listAuditEvents, recordAudit } from '$lib/server/audit';
import { checkBatchInput, createBatch } from '$lib/server/batches/create';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { db } from '$lib/server/db';
import { user } from '$lib/server/db/schema';
import { changeLines } from '$lib/server/trail/changes';
import { describeAction, readableCode } from '$lib/server/trail/describe';
import { readableEntries, type TrailEntry } from '$lib/server/trail/entries';
import { unparseCsv } from '$lib/server/csv';
import { buildTrailPdf } from '$lib/server/trail/export-pdf';
import { MAX_PDF_ENTRIES } from '$lib/server/trail/export-load';
import { resolveSubjects, subjectKey } from '$lib/server/trail/subjects';
import { A4, MARGIN } from '$lib/server/pdf/layout';
import { GET as csvGet } from '../../src/routes/(app)/admin/audit/export.csv/+server';
import { GET as pdfGet } from '../../src/routes/(app)/admin/audit/export.pdf/+server';
import { callJson } from './endpoint-call';
import { makeUser } from './helpers';
import { decideLot, makeApprovedRecipe, makeLead, makeLot, today } from './inventory-fixtures';

vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

// The route's own handler type names its route id; the caller sends a plain request event.
const csvExport = csvGet as unknown as RequestHandler;
const pdfExport = pdfGet as unknown as RequestHandler;

let lead: Awaited<ReturnType<typeof makeLead>>;
let recipe: Awaited<ReturnType<typeof makeApprovedRecipe>>;
let lotRow: ReturnType<typeof makeLot>;
let quarantined: ReturnType<typeof makeLot>;
let batchRow: Awaited<ReturnType<typeof createBatch>>;
let admin: { id: string; email: string; name: string; roles: ['admin'] };

beforeAll(async () => {
	seedReferenceLibrary();
	lead = await makeLead();
	const tech = await makeUser(['prep_technician']);
	const adminUser = await makeUser(['admin']);
	admin = { id: adminUser.id, email: adminUser.email, name: 'Admin', roles: ['admin'] };
	recipe = await makeApprovedRecipe([
		{ componentId: 'potassium-chloride', amount: 5, unit: 'g/L' }
	]);
	lotRow = makeLot(lead.actor);
	quarantined = makeLot(lead.actor, { status: 'quarantine' });
	decideLot(lead.actor, quarantined.id, 'rejected', 'Seal broken on arrival');
	const checked = checkBatchInput({
		recipeId: recipe.recipeId,
		targetVolumeL: 2,
		plannedOn: today,
		intendedUse: 'Trail test'
	});
	if (!checked.ok) throw new Error(JSON.stringify(checked.fieldErrors));
	batchRow = createBatch(tech, checked.value);
});

function entriesAbout(subjectType: string, subjectId: string): TrailEntry[] {
	return readableEntries(allAuditEvents({ subjectType, subjectId }));
}

describe('the sentence for each act', () => {
	it('names the lot a status change was about', () => {
		expect(
			describeAction('lot.released', { code: 'L-2026-0004', from: 'quarantine' }, 'L-2026-0004')
		).toBe('Released lot L-2026-0004');
		expect(describeAction('lot.rejected', { reason: 'Seal broken' }, 'L-2026-0005')).toBe(
			'Rejected lot L-2026-0005: Seal broken'
		);
	});

	it('tells a line signed and a lot refused at the bench', () => {
		expect(
			describeAction(
				'batch.line_done',
				{ line: 3, actual: '5.01 g', verdict: 'within' },
				'MB-2026-0007'
			)
		).toBe('Signed line 3 as done: 5.01 g (within)');
		expect(
			describeAction(
				'batch.lot_refused',
				{
					line: 2,
					scanned: 'L-2026-0009',
					lot: 'L-2026-0009',
					reason: 'Lot L-2026-0009 is in quarantine.'
				},
				'MB-2026-0007'
			)
		).toBe('Refused lot L-2026-0009 at line 2: Lot L-2026-0009 is in quarantine.');
	});

	it('reads an act it has no sentence for as its code in words', () => {
		expect(describeAction('widget.colour_changed', null, 'x')).toBe('Widget: colour changed');
		expect(readableCode('sign_out')).toBe('Sign out');
	});

	it('shows old and new values in words, whichever shape the detail has', () => {
		expect(
			changeLines('component.stock_settings_set', {
				reorderLevelG: { from: null, to: 500 },
				densityGPerMl: { from: 1.2, to: 1.2 }
			})
		).toEqual([
			{ field: 'Reorder level (g)', from: '(empty)', to: '500' },
			{ field: 'Density (g/mL)', from: '1.2', to: '1.2' }
		]);
		expect(
			changeLines('person.roles_changed', { before: ['engineer'], after: ['engineer', 'admin'] })
		).toEqual([
			{ field: 'Roles', from: 'Process engineer', to: 'Process engineer, Administrator' }
		]);
		expect(
			changeLines('study.updated', { changes: { targetPh: { from: '7.0', to: '7.2' } } })
		).toEqual([{ field: 'Target pH', from: '7.0', to: '7.2' }]);
	});
});

describe('subjects resolved to their numbers and names, with links', () => {
	it('shows a lot by its code, linked to its page, with a plain sentence', () => {
		const entries = entriesAbout('lot', lotRow.id);
		const released = entries.find((e) => e.action === 'lot.released')!;
		expect(released.subject).toEqual({
			type: 'lot',
			typeLabel: 'Lot',
			label: lotRow.code,
			href: `/lots/${lotRow.id}`
		});
		expect(released.sentence).toBe(`Released lot ${lotRow.code}`);
		expect(released.changes).toEqual([{ field: 'Status', from: 'Quarantine', to: 'Released' }]);
		const rejected = entriesAbout('lot', quarantined.id).find((e) => e.action === 'lot.rejected')!;
		expect(rejected.sentence).toBe(`Rejected lot ${quarantined.code}: Seal broken on arrival`);
	});

	it('shows a batch by its number and a recipe version by name and version', () => {
		const planned = entriesAbout('batch', batchRow.id).find((e) => e.action === 'batch.planned')!;
		expect(planned.subject.label).toBe(batchRow.number);
		expect(planned.subject.label).toMatch(/^MB-\d{4}-\d{4}$/);
		expect(planned.subject.href).toBe(`/batches/${batchRow.id}`);
		expect(planned.sentence).toBe(`Planned batch ${batchRow.number} of 2 L`);

		const approved = entriesAbout('recipe_version', recipe.versionId).find(
			(e) => e.action === 'recipe.approved'
		)!;
		expect(approved.subject.label).toMatch(/^Test medium \d+ \w+ version 1$/);
		expect(approved.subject.href).toBe(`/recipes/${recipe.recipeId}/versions/1`);
		expect(approved.sentence).toBe(`Approved ${approved.subject.label}`);
	});

	it('shows the lines a draft save added as old → new', () => {
		const saved = entriesAbout('recipe_version', recipe.versionId).find(
			(e) => e.action === 'recipe.draft_saved'
		)!;
		const line = saved.changes.find((c) => c.field === 'Line 1')!;
		expect(line.from).toBe('(empty)');
		expect(line.to).toMatch(/potassium-chloride|Potassium chloride/i);
	});

	it('names the person who acted', () => {
		const received = entriesAbout('lot', lotRow.id).find((e) => e.action === 'lot.received')!;
		expect(received.who).toMatch(/^Person \d+$/);
		expect(received.whoEmail).toBe(lead.email);
	});

	it('keeps the id of a subject that no longer resolves, with no link', () => {
		const subjects = resolveSubjects([{ subjectType: 'lot', subjectId: 'no-such-lot' }]);
		expect(subjects.get(subjectKey('lot', 'no-such-lot'))).toEqual({
			type: 'lot',
			typeLabel: 'Lot',
			label: 'no-such-lot',
			href: null
		});
	});

	it('looks subjects up with one query per subject type, not one per entry', () => {
		const rows = allAuditEvents({});
		const types = new Set(rows.filter((r) => r.subjectId).map((r) => r.subjectType));
		expect(rows.length).toBeGreaterThan(types.size + 5);
		const prepare = vi.spyOn(db.$client, 'prepare');
		readableEntries(rows);
		// one query per subject type that has a table, one for the people who acted, one for the site time zone
		expect(prepare.mock.calls.length).toBeLessThanOrEqual(types.size + 2);
		prepare.mockRestore();
	});
});

describe('filtering and order', () => {
	it('filters by subject, and pages oldest first on request', () => {
		const newest = listAuditEvents({
			subjectType: 'lot',
			subjectId: lotRow.id,
			page: 1,
			pageSize: 1
		});
		const oldest = listAuditEvents({
			subjectType: 'lot',
			subjectId: lotRow.id,
			order: 'oldest',
			page: 1,
			pageSize: 1
		});
		expect(newest.total).toBe(2); // received, then released
		expect(oldest.rows[0].action).toBe('lot.received');
		expect(newest.rows[0].action).toBe('lot.released');
	});

	it('finds a person by name as well as by e-mail', () => {
		const byEmail = listAuditEvents({ actor: lead.email.toUpperCase(), page: 1, pageSize: 100 });
		expect(byEmail.total).toBeGreaterThan(0);
		expect(byEmail.rows.every((r) => r.actorEmail === lead.email)).toBe(true);
		const { name } = db.select({ name: user.name }).from(user).where(eq(user.id, lead.id)).get()!;
		const byName = listAuditEvents({ actor: name, page: 1, pageSize: 100 });
		expect(byName.total).toBe(byEmail.total);
		expect(byName.rows.every((r) => r.actorId === lead.id)).toBe(true);
	});
});

describe('exports of the filtered view', () => {
	it('writes CSV with every matching row, guarding cells a spreadsheet would run', async () => {
		const hostile = '=HYPERLINK("http://example.test","x")';
		recordAudit(
			{ id: null, email: hostile },
			{ action: 'sign_in.failed', detail: { reason: 'unknown e-mail' } }
		);
		for (const start of ['=', '+', '-', '@', '\t', '\r'])
			expect(unparseCsv(['c'], [[`${start}1`]])).toBe(`c\r\n"'${start}1"`);
		expect(unparseCsv(['c'], [['L-2026-0004']])).toBe('c\r\nL-2026-0004');

		const response = await callJson(
			csvExport,
			'GET',
			'/admin/audit/export.csv?action=sign_in.failed',
			undefined,
			{
				user: admin
			}
		);
		expect(response.status).toBe(200);
		expect(response.headers.get('content-type')).toMatch(/^text\/csv/);
		const parsed = Papa.parse<Record<string, string>>(await response.text(), { header: true });
		const row = parsed.data.find((r) => r['E-mail']?.includes('HYPERLINK'))!;
		expect(row['E-mail']).toBe(`'${hostile}`);
		expect(row['Person']).toBe(`'${hostile}`);
		expect(row['What happened']).toBe('Sign-in failed: unknown e-mail');
		expect(parsed.data.every((r) => r['Action code'] === 'sign_in.failed')).toBe(true);
	});

	it('writes every page of a long filtered view into the CSV, not just the first', async () => {
		for (let i = 0; i < 120; i++)
			recordAudit({ id: null, email: null }, { action: 'test.long_list' });
		const response = await callJson(
			csvExport,
			'GET',
			'/admin/audit/export.csv?action=test.long_list',
			undefined,
			{
				user: admin
			}
		);
		const parsed = Papa.parse<string[]>((await response.text()).trim());
		expect(parsed.data).toHaveLength(1 + 120);
	});

	it('streams a trail longer than a chunk in order, and refuses it as a PDF past the PDF limit', async () => {
		db.transaction(() => {
			for (let i = 0; i < MAX_PDF_ENTRIES + 1; i++)
				recordAudit(
					{ id: null, email: null },
					{ action: 'test.beyond_pdf', detail: { from: i, to: i + 1 } }
				);
		});
		const csv = await callJson(
			csvExport,
			'GET',
			'/admin/audit/export.csv?action=test.beyond_pdf&order=oldest',
			undefined,
			{ user: admin }
		);
		const parsed = Papa.parse<Record<string, string>>((await csv.text()).trim(), { header: true });
		// More rows than one chunk (2,000), each once, in the order written.
		expect(parsed.data).toHaveLength(MAX_PDF_ENTRIES + 1);
		const written = allAuditEvents({ action: 'test.beyond_pdf', order: 'oldest' });
		expect(parsed.data.map((r) => r['When'])).toEqual(readableEntries(written).map((e) => e.atIso));
		const newestFirst = await callJson(
			csvExport,
			'GET',
			'/admin/audit/export.csv?action=test.beyond_pdf',
			undefined,
			{ user: admin }
		);
		const details = Papa.parse<Record<string, string>>((await newestFirst.text()).trim(), {
			header: true
		}).data.map((r) => r['Changes']);
		expect(new Set(details).size).toBe(MAX_PDF_ENTRIES + 1);
		expect(details).toEqual(
			readableEntries(written)
				.reverse()
				.map((e) => e.changes.map((c) => `${c.field}: ${c.from} → ${c.to}`).join('; '))
		);
		await expect(
			callJson(pdfExport, 'GET', '/admin/audit/export.pdf?action=test.beyond_pdf', undefined, {
				user: admin
			})
		).rejects.toMatchObject({
			status: 400,
			body: { message: expect.stringMatching(/matches 5,001 entries; a PDF holds at most 5,000/) }
		});
	});

	it('refuses an export whose filter cannot be read, naming the field', async () => {
		await expect(
			callJson(csvExport, 'GET', '/admin/audit/export.csv?from=yesterday', undefined, {
				user: admin
			})
		).rejects.toMatchObject({ status: 400, body: { message: expect.stringMatching(/^From:/) } });
	});

	it('writes a PDF with as many pages as the rows need', async () => {
		const response = await callJson(
			pdfExport,
			'GET',
			'/admin/audit/export.pdf?action=test.long_list',
			undefined,
			{
				user: admin
			}
		);
		expect(response.status).toBe(200);
		expect(response.headers.get('content-type')).toBe('application/pdf');
		const pdf = await PDFDocument.load(new Uint8Array(await response.arrayBuffer()));
		// Independent count from the layout: each row is two 11.5 pt lines (the date above the time),
		// the table header 11.5 pt + 2 pt rule on every page, the heading 19 + 11.5 + 11.5 + 8 pt.
		const rowPt = 2 * 11.5;
		const top = A4[1] - MARGIN;
		const firstPageRows = Math.floor((top - 50 - 13.5 - MARGIN) / rowPt);
		const laterPageRows = Math.floor((top - 13.5 - MARGIN) / rowPt);
		const expectedPages = 1 + Math.ceil((120 - firstPageRows) / laterPageRows);
		expect(expectedPages).toBeGreaterThan(2);
		expect(pdf.getPageCount()).toBe(expectedPages);

		const empty = await buildTrailPdf([], { filterSummary: 'nothing' });
		expect((await PDFDocument.load(empty)).getPageCount()).toBe(1);
	});
});
