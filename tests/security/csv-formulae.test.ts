import Papa from 'papaparse';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import type { RequestHandler } from '@sveltejs/kit';
import { ROLES } from '$lib/roles';
import { recordAudit } from '$lib/server/audit';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { FORMULA_START, parseCsv, unparseCsv } from '$lib/server/csv';
import { db } from '$lib/server/db';
import { component } from '$lib/server/db/schema';
import { chooseLot } from '$lib/server/batches/lot-choice';
import { buildSheetLines } from '$lib/server/batches/sheet';
import { adjustLot } from '$lib/server/inventory/lots';
import { GET as auditCsv } from '../../src/routes/(app)/admin/audit/export.csv/+server';
import { GET as batchLotsCsv } from '../../src/routes/(app)/batches/[id]/lots.csv/+server';
import { GET as componentsCsv } from '../../src/routes/(app)/components/export.csv/+server';
import { GET as whereUsedCsv } from '../../src/routes/(app)/lots/[id]/where-used.csv/+server';
import { GET as lotsCsv } from '../../src/routes/(app)/lots/export.csv/+server';
import { GET as ledgerCsv } from '../../src/routes/(app)/lots/ledger.csv/+server';
import { GET as recipeCsv } from '../../src/routes/(app)/recipes/[id]/versions/[n]/export.csv/+server';
import { planBatch } from '../server/batch-fixtures';
import { callJson } from '../server/endpoint-call';
import { makeUser } from '../server/helpers';
import { makeApprovedRecipe, makeLead, makeLot } from '../server/inventory-fixtures';
import { draftRecipe, line } from '../server/recipes-fixtures';
import { formatSeriesCsv } from '$lib/simulation/series-csv';

vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('../server/endpoint-call')).currentEvent
}));

/*
 * Every CSV download, through its real handler, with values a spreadsheet would run as formulas
 * stored in the fields it writes. Each such cell must come out behind an apostrophe, and a
 * negative number (a stock removal) must stay a bare number.
 */
const HYPERLINK = '=HYPERLINK("http://x","y")';
const AT_SUM = '@SUM(1)';
const CMD = "+cmd|' /C calc'!A0";
const MINUS = '-2+3+cmd|x';

let everyone: Awaited<ReturnType<typeof makeUser>>;
const ids = { recipeId: '', batchId: '', lotId: '', draftRecipeId: '' };

beforeAll(async () => {
	seedReferenceLibrary();
	everyone = await makeUser([...ROLES]);
	db.update(component).set({ name: HYPERLINK }).where(eq(component.id, 'sodium-chloride')).run();
	const lead = await makeLead();
	const salt = makeLot(lead.actor, { component: 'sodium-chloride', supplier: AT_SUM });
	adjustLot(lead.actor, salt.id, { direction: 'remove', amount: 2, unit: 'g', reason: CMD });
	const medium = await makeApprovedRecipe([
		{ componentId: 'sodium-chloride', amount: 5, unit: 'g/L' }
	]);
	const tech = await makeUser(['prep_technician']);
	const batch = planBatch(tech, medium.recipeId, 1, MINUS);
	const [saltLine] = buildSheetLines(batch);
	chooseLot(tech, batch.id, saltLine.id, salt.code);
	const draft = draftRecipe(everyone, [line('potassium-chloride', 1, 'g/L', { note: CMD })]);
	recordAudit({ id: null, email: HYPERLINK }, { action: 'sign_in.failed' });
	Object.assign(ids, {
		recipeId: medium.recipeId,
		batchId: batch.id,
		lotId: salt.id,
		draftRecipeId: draft.recipeId
	});
});

async function download(handler: RequestHandler, path: string, params = {}) {
	const response = await callJson(handler, 'GET', path, undefined, { user: everyone, params });
	expect(response.status).toBe(200);
	expect(response.headers.get('content-type')).toMatch(/^text\/csv/);
	const text = await response.text();
	const cells = Papa.parse<string[]>(text, { comments: '#', skipEmptyLines: true }).data.flat();
	// A cell that would run: it starts like a formula and is not a plain number.
	const live = cells.filter((c) => FORMULA_START.test(c) && !/^-?\d+(\.\d+)?$/.test(c));
	return { cells, live };
}

const EXPORTS: {
	name: string;
	path: () => string;
	handler: RequestHandler;
	params?: () => Record<string, string>;
	hostile: string[];
}[] = [
	{
		name: 'components',
		path: () => '/components/export.csv',
		handler: componentsCsv as RequestHandler,
		hostile: [HYPERLINK]
	},
	{
		name: 'lots',
		path: () => '/lots/export.csv',
		handler: lotsCsv as RequestHandler,
		hostile: [AT_SUM]
	},
	{
		name: 'stock ledger',
		path: () => `/lots/ledger.csv?lot=${ids.lotId}`,
		handler: ledgerCsv as RequestHandler,
		hostile: [CMD, HYPERLINK]
	},
	{
		name: 'where a lot was used',
		path: () => `/lots/${ids.lotId}/where-used.csv`,
		params: () => ({ id: ids.lotId }),
		handler: whereUsedCsv as RequestHandler,
		hostile: [MINUS]
	},
	{
		name: 'lots a batch used',
		path: () => `/batches/${ids.batchId}/lots.csv`,
		params: () => ({ id: ids.batchId }),
		handler: batchLotsCsv as RequestHandler,
		hostile: [HYPERLINK, AT_SUM]
	},
	{
		name: 'recipe version',
		path: () => `/recipes/${ids.draftRecipeId}/versions/1/export.csv`,
		params: () => ({ id: ids.draftRecipeId, n: '1' }),
		handler: recipeCsv as RequestHandler,
		hostile: [CMD]
	},
	{
		name: 'audit trail',
		path: () => '/admin/audit/export.csv',
		handler: auditCsv as RequestHandler,
		hostile: [HYPERLINK]
	}
];

describe('every CSV export neutralises formulae', () => {
	it.each(EXPORTS)('$name', async ({ path, handler, params, hostile }) => {
		const { cells, live } = await download(handler, path(), params?.());
		expect(live).toEqual([]);
		for (const value of hostile) expect(cells).toContain(`'${value}`);
	});

	it('keeps a removal in the ledger a negative number a spreadsheet can sum', async () => {
		const { cells } = await download(
			ledgerCsv as RequestHandler,
			`/lots/ledger.csv?lot=${ids.lotId}`
		);
		expect(cells).toContain('-2000');
		expect(cells).not.toContain("'-2000");
	});
});

describe('the shared CSV rule', () => {
	it('escapes a formula followed by a line break, which papaparse’s default pattern misses', () => {
		expect(unparseCsv(['c'], [['=1+1\nnote']])).toBe('c\r\n"\'=1+1\nnote"');
	});

	it('imports an exported cell back to the value that was stored', () => {
		const csv = unparseCsv(
			['name', 'category'],
			[
				[HYPERLINK, 'salt'],
				["it's", 'salt']
			]
		);
		const table = parseCsv(csv, { required: ['name', 'category'], allowed: ['name', 'category'] });
		expect(table.rows.map((r) => r.values.name)).toEqual([HYPERLINK, "it's"]);
	});
});

describe('the simulation series download (built in the browser)', () => {
	it('escapes a scenario name that reads as a formula and keeps negative numbers bare', () => {
		const result = {
			t: [0],
			biomassGPerL: [-1],
			substrateGPerL: [2],
			productGPerL: [0],
			volumeL: [1],
			dissolvedOxygenMgPerL: null,
			feedLPerH: [0],
			ourMmolPerLH: null,
			maxOtrMmolPerLH: null
		} as unknown as Parameters<typeof formatSeriesCsv>[0][number]['result'];
		const rows = formatSeriesCsv([
			{ label: HYPERLINK, result },
			{ label: 'B', result }
		]).split('\n');
		expect(rows[1].startsWith(`"'${HYPERLINK.replaceAll('"', '""')}",0,-1,`)).toBe(true);
	});
});
