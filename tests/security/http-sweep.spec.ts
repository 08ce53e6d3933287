import { test as base, expect, type APIRequestContext, type APIResponse } from '@playwright/test';
import { DEMO, DEMO_PASSWORD, type DemoRole } from '../e2e/fixtures';
import { bodyDoors, pagesWithoutParams, type Door } from './route-doors';

/*
 * Over real HTTP, every door that takes a body gets each kind of body a client can break, as every
 * demo role and signed out (no demo account holds every role), and every list page gets absurd
 * query parameters. Bodies must be refused with a 400 and the reason before any door acts, so
 * this sweep changes nothing and needs no order with the other projects.
 */
type Visitor = DemoRole | 'signed-out';

// The order in which a page's opener is looked for: the roles that open the most pages first.
const VISITORS: readonly Visitor[] = [
	'admin',
	'media_scientist',
	'inventory_lead',
	'engineer',
	'prep_technician',
	'signed-out'
];

const test = base.extend<object, { visitors: Map<Visitor, APIRequestContext> }>({
	visitors: [
		async ({ playwright }, use, workerInfo) => {
			const baseURL = workerInfo.project.use.baseURL!;
			const visitors = new Map<Visitor, APIRequestContext>();
			for (const visitor of VISITORS) {
				// Same-origin like the app's own pages, so the origin checks let the request through.
				const context = await playwright.request.newContext({
					baseURL,
					extraHTTPHeaders: { origin: baseURL },
					maxRedirects: 0
				});
				if (visitor !== 'signed-out') {
					const signIn = await context.post('/api/v1/session', {
						data: { email: DEMO[visitor], password: DEMO_PASSWORD }
					});
					expect(signIn.status(), await signIn.text()).toBe(200);
				}
				visitors.set(visitor, context);
			}
			await use(visitors);
			// A body that reached the sign-out door would have ended the session it came with.
			for (const [visitor, context] of visitors) {
				if (visitor !== 'signed-out') {
					const me = await context.get('/api/v1/me');
					expect(me.status(), `${visitor} is still signed in after the sweep`).toBe(200);
				}
				await context.dispose();
			}
		},
		{ scope: 'worker' }
	]
});

test.describe.configure({ mode: 'parallel' });

/** `reason` is what an API door says; a page's action says `pageReason` when it differs. */
type BadBody = {
	kind: string;
	contentType: string;
	body: string;
	reason: RegExp;
	pageReason?: RegExp;
	pagesOnly?: boolean;
};

// A page takes only forms: JSON and other bodies are refused before they are read.
const NOT_A_FORM = /takes a form sent from the page itself/;

const BAD_BODIES: readonly BadBody[] = [
	{
		kind: 'multipart without a boundary',
		contentType: 'multipart/form-data',
		body: 'a=1',
		reason: /without a boundary/
	},
	{
		kind: 'truncated multipart',
		contentType: 'multipart/form-data; boundary=XyZ',
		body: '--XyZ\r\nContent-Disposition: form-data; name="a"\r\n\r\nhal',
		reason: /could not be read/
	},
	{
		kind: 'malformed urlencoded',
		contentType: 'application/x-www-form-urlencoded',
		body: '%zz=%%&a=%E0%A4%A',
		reason: /could not be read/
	},
	{
		kind: 'malformed JSON',
		contentType: 'application/json',
		body: '{"a": [1,',
		reason: /not valid JSON/,
		pageReason: NOT_A_FORM
	},
	{
		kind: 'empty JSON',
		contentType: 'application/json',
		body: '',
		reason: /not valid JSON/,
		pageReason: NOT_A_FORM
	},
	{
		kind: 'plain text',
		contentType: 'text/plain',
		body: 'a=1',
		reason: NOT_A_FORM,
		pagesOnly: true
	}
];

/** How the client asks: `use:enhance` (SvelteKit's headers), a plain form post, or an API call. */
type Mode = 'enhanced' | 'plain' | 'api';

const ACCEPT_BY_MODE: Record<Mode, Record<string, string>> = {
	enhanced: { accept: 'application/json', 'x-sveltekit-action': 'true' },
	plain: { accept: 'text/html,application/xhtml+xml;q=0.9,*/*;q=0.8' },
	api: { accept: 'application/json' }
};

/** The reason the answer carries, read the way each client reads it. */
async function reasonIn(response: APIResponse, mode: Mode): Promise<string | null> {
	const type = response.headers()['content-type'] ?? '';
	const text = await response.text();
	if (mode === 'plain') return type.startsWith('text/html') ? text : null;
	if (mode === 'api' && !type.startsWith('application/problem+json')) return null;
	if (mode === 'enhanced' && !type.startsWith('application/json')) return null;
	const body = JSON.parse(text) as { detail?: string; error?: { message?: string } };
	return (mode === 'api' ? body.detail : body.error?.message) ?? null;
}

type Ask = { visitor: Visitor; mode: Mode; bad: BadBody };

/** What is wrong with one answer, in words that name who asked how; null when it is right. */
async function wrongAnswer(
	client: APIRequestContext,
	door: Door,
	ask: Ask
): Promise<string | null> {
	const { visitor, mode, bad } = ask;
	const response = await client.fetch(door.url, {
		method: door.method,
		headers: { 'content-type': bad.contentType, ...ACCEPT_BY_MODE[mode] },
		data: Buffer.from(bad.body)
	});
	const reason = await reasonIn(response, mode).catch(() => null);
	const expected = mode === 'api' ? bad.reason : (bad.pageReason ?? bad.reason);
	if (response.status() === 400 && reason && expected.test(reason)) return null;
	const type = response.headers()['content-type'] ?? 'no content type';
	const excerpt = (await response.text()).replace(/\s+/g, ' ').slice(0, 200);
	return `${visitor}, ${mode}, ${bad.kind}: ${response.status()} ${type} ${excerpt}`;
}

const doors = bodyDoors();

test('the sweep finds the doors of the route tree', () => {
	const names = doors.map((door) => door.name);
	expect(doors.length).toBeGreaterThan(40);
	expect(names).toContain('api/v1/session/+server.ts POST');
	expect(names).toContain('(app)/sign-out/+page.server.ts default action');
	expect(names).toContain('(app)/admin/settings/+page.server.ts ?/lotSigning');
});

for (const door of doors) {
	test(`${door.method} ${door.url} (${door.name}) refuses unreadable bodies`, async ({
		visitors
	}) => {
		const mode: Mode = door.isAction ? 'enhanced' : 'api';
		const kinds = BAD_BODIES.filter((bad) => door.isAction || !bad.pagesOnly);
		const asks: Ask[] = VISITORS.flatMap((visitor) => kinds.map((bad) => ({ visitor, mode, bad })));
		// The check reads the content type and nothing of who asks, so a plain form post differs
		// only in how the refusal is written (an HTML page): one visitor is enough to read it.
		if (door.isAction)
			asks.push(...kinds.map((bad): Ask => ({ visitor: VISITORS[0], mode: 'plain', bad })));
		const answers = await Promise.all(
			asks.map((ask) => wrongAnswer(visitors.get(ask.visitor)!, door, ask))
		);
		expect(answers.filter((wrong) => wrong !== null)).toEqual([]);
	});
}

// What the check lets through: bodies a browser sends, escapes and all, reach the door intact.
test('a well-formed form body passes the check and reaches the door', async ({ visitors }) => {
	const admin = visitors.get('admin')!;
	const headers = ACCEPT_BY_MODE.enhanced;
	const urlencoded = await admin.post('/batches/open', {
		headers: { ...headers, 'content-type': 'application/x-www-form-urlencoded' },
		data: 'code=Sheet+%C3%A4%25'
	});
	const multipart = await admin.post('/batches/open', {
		headers,
		multipart: { code: 'Sheet ä%' }
	});
	for (const response of [urlencoded, multipart]) {
		expect(response.status()).toBe(200);
		const result = (await response.json()) as { type: string; data: string };
		expect(result.type).toBe('failure');
		expect(result.data).toContain('Sheet ä%');
	}
	const json = await admin.post('/api/v1/formula', { data: { formula: 'H2O' } });
	expect(json.status(), await json.text()).toBe(200);
});

const LONG_SEARCH = ("batch_%'" + 'x'.repeat(92)).repeat(50);

const ABSURD_QUERIES = [
	'page=99999999999999999999',
	'page=-5',
	'page=abc',
	'sort=%00nonsense',
	'dir=sideways',
	`q=${encodeURIComponent(LONG_SEARCH)}`,
	'page=2&page=abc&q=a&q=b&sort=name&sort=%00&dir=asc&dir=sideways'
];

// Reading the outbox records who read it (an audit entry per read), so the sweep leaves it out.
const PAGES_THAT_WRITE_ON_READ = ['/admin/outbox'];

/** The first visitor the page opens for, with every visitor's answer when none does. */
async function openerOf(visitors: Map<Visitor, APIRequestContext>, path: string) {
	const refusals: string[] = [];
	for (const visitor of VISITORS) {
		const status = (await visitors.get(visitor)!.get(path)).status();
		if (status === 200) return { visitor, refusals };
		refusals.push(`${visitor}: ${status}`);
	}
	return { visitor: null, refusals };
}

for (const path of pagesWithoutParams().filter((p) => !PAGES_THAT_WRITE_ON_READ.includes(p))) {
	test(`GET ${path} with absurd query parameters answers without a server error`, async ({
		visitors
	}) => {
		const { visitor, refusals } = await openerOf(visitors, path);
		expect(visitor, `nobody opens ${path}: ${refusals.join(', ')}`).not.toBeNull();
		const client = visitors.get(visitor!)!;
		const answers = await Promise.all(
			ABSURD_QUERIES.map(async (query) => {
				const response = await client.get(`${path}?${query}`);
				const status = response.status();
				const text = await response.text();
				if (status === 200 || (status === 400 && text.trim() !== '')) return null;
				const excerpt = text.replace(/\s+/g, ' ').slice(0, 200);
				return `${visitor}, ?${query.slice(0, 60)}: ${status} ${excerpt}`;
			})
		);
		expect(answers.filter((wrong) => wrong !== null)).toEqual([]);
	});
}
