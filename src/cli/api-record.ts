// `npm run api:record`: sends each request of src/cli/api-requests.ts to a running server and writes
// what it answered to tests/api-recordings/<operationId>.json, which tests/server/api-recordings.test.ts
// checks against the OpenAPI document. Start the server on the demo data first (`npm start`).
//
//   API_URL                 the server (default http://127.0.0.1:3000)
//   API_TOKEN / API_SESSION  a bearer token, or the brothwright_session cookie's value, to call as;
//                           without either, it signs in as API_EMAIL (default scientist@demo.test)
//   API_ADMIN_TOKEN / API_ADMIN_SESSION / API_ADMIN_EMAIL  the same for requests only an administrator may send
//   API_PASSWORD            the password for signing in (default: the demo's)
//   --only=<text>           records only the operations whose id contains the text
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { allOperations } from '../lib/server/api/openapi';
import { operationIdOf } from '../lib/server/api/operation-naming';
import {
	EXAMPLE_SCENARIO,
	RECORDED_REQUESTS,
	type Found,
	type RecordedRequest
} from './api-requests';

const RECORDINGS = join(process.cwd(), 'tests', 'api-recordings');
const DEMO_PASSWORD = 'brothwright-demo';
const SESSION_COOKIE = 'brothwright_session';

const env = (name: string) => process.env[name] || undefined;
const baseUrl = (env('API_URL') ?? 'http://127.0.0.1:3000').replace(/\/$/, '');

type Headers = Record<string, string>;

async function signIn(email: string): Promise<Headers> {
	const response = await fetch(`${baseUrl}/api/v1/session`, {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify({ email, password: env('API_PASSWORD') ?? DEMO_PASSWORD })
	});
	if (!response.ok)
		throw new Error(`Signing in as ${email} answered ${response.status}: ${await response.text()}`);
	const cookie = response.headers
		.getSetCookie()
		.find((c) => c.startsWith(`${SESSION_COOKIE}=`))
		?.split(';')[0];
	if (!cookie) throw new Error(`Signing in as ${email} set no session cookie.`);
	return { cookie };
}

/** The headers to call as: a token, a session, or a fresh sign-in. */
async function credentials(prefix: 'API' | 'API_ADMIN', email: string): Promise<Headers> {
	const token = env(`${prefix}_TOKEN`);
	if (token) return { authorization: `Bearer ${token}` };
	const session = env(`${prefix}_SESSION`);
	if (session) return { cookie: `${SESSION_COOKIE}=${session}` };
	return signIn(env(`${prefix}_EMAIL`) ?? email);
}

async function send(headers: Headers, method: string, path: string, body?: unknown) {
	return fetch(`${baseUrl}${path}`, {
		method: method.toUpperCase(),
		headers: body === undefined ? headers : { ...headers, 'content-type': 'application/json' },
		body: body === undefined ? undefined : JSON.stringify(body)
	});
}

async function sendForJson(headers: Headers, method: string, path: string, body?: unknown) {
	const response = await send(headers, method, path, body);
	const text = await response.text();
	if (!response.ok) throw new Error(`${method} ${path} answered ${response.status}: ${text}`);
	return JSON.parse(text) as Record<string, unknown>;
}

type Row = Record<string, unknown>;
const first = (list: unknown, what: string): Row => {
	const row = (list as Row[] | undefined)?.[0];
	if (!row) throw new Error(`The server has no ${what} to record with: start it on the demo data.`);
	return row;
};

/** The records the requests name, found through the lists; a scenario is made when there is none. */
async function findRecords(headers: Headers): Promise<{ found: Found; madeScenario: boolean }> {
	const get = (path: string) => sendForJson(headers, 'get', path);
	const recipe = first(
		(await get('/api/v1/recipes?status=approved&limit=1')).items,
		'approved recipe'
	);
	const study = first(
		(await get('/api/v1/studies?q=Bacterium%20glucose&limit=1')).items,
		'bacterium study'
	);
	const batch = first((await get('/api/v1/batches?state=released&limit=1')).items, 'batch');
	const lot = first((await get('/api/v1/lots?status=released&limit=1')).items, 'lot');
	const run = first((await get('/api/v1/runs?limit=1')).items, 'run');
	const profile = first((await get('/api/v1/profiles?limit=1')).items, 'organism profile');
	const vessel = first((await get('/api/v1/vessels?limit=1')).items, 'vessel');
	const scenarios = (await get('/api/v1/scenarios')) as unknown as Row[];
	const scenario =
		scenarios[0] ?? (await sendForJson(headers, 'post', '/api/v1/scenarios', EXAMPLE_SCENARIO));
	return {
		found: {
			recipeId: String(recipe.id),
			approvedN: String(recipe.approvedN),
			studyId: String(study.id),
			lotId: String(lot.id),
			batchId: String(batch.id),
			runId: String(run.id),
			scenarioId: String(scenario.id),
			profileId: String(profile.id),
			vesselId: String(vessel.id)
		},
		madeScenario: scenarios.length === 0
	};
}

function concretePath(request: RecordedRequest, found: Found): string {
	const params = request.params?.(found) ?? {};
	const path = request.template.replace(/\{(\w+)\}/g, (_, name: string) => {
		if (!(name in params)) throw new Error(`${request.template}: no value for {${name}}`);
		return encodeURIComponent(params[name]);
	});
	const query = new URLSearchParams(request.query ?? {}).toString();
	return query ? `${path}?${query}` : path;
}

async function record(request: RecordedRequest, headers: Headers, found: Found, name: string) {
	const path = concretePath(request, found);
	const body = request.bodyFrom
		? await request.bodyFrom(found, (m, p, b) => sendForJson(headers, m, p, b))
		: request.body;
	const response = await send(headers, request.method, path, body);
	const contentType = response.headers.get('content-type') ?? '';
	const text = await response.text();
	const recording = {
		method: request.method,
		path,
		status: response.status,
		contentType,
		body: /\bjson\b/.test(contentType) ? JSON.parse(text) : text
	};
	writeFileSync(join(RECORDINGS, `${name}.json`), `${JSON.stringify(recording, null, '\t')}\n`);
	console.log(
		`${String(response.status).padEnd(4)}${name}  ${request.method.toUpperCase()} ${path}`
	);
}

async function main() {
	const only = process.argv.find((a) => a.startsWith('--only='))?.slice('--only='.length);
	const known = new Set(allOperations().map((op) => `${op.method} ${op.path}`));
	const unknown = RECORDED_REQUESTS.filter((r) => !known.has(`${r.method} ${r.template}`));
	if (unknown.length)
		throw new Error(
			`No such operation: ${unknown.map((r) => `${r.method} ${r.template}`).join(', ')}`
		);
	const user = await credentials('API', 'scientist@demo.test');
	const needsAdmin = RECORDED_REQUESTS.some((r) => r.asAdmin);
	const admin = needsAdmin ? await credentials('API_ADMIN', 'admin@demo.test') : user;
	const { found, madeScenario } = await findRecords(user);
	mkdirSync(RECORDINGS, { recursive: true });
	try {
		for (const request of RECORDED_REQUESTS) {
			const id = operationIdOf(request.method, request.template);
			const name = request.variant ? `${id}.${request.variant}` : id;
			if (only && !name.includes(only)) continue;
			await record(request, request.asAdmin ? admin : user, found, name);
		}
	} finally {
		if (madeScenario) await send(user, 'delete', `/api/v1/scenarios/${found.scenarioId}`);
	}
}

main().catch((cause: Error) => {
	console.error(cause.message);
	process.exit(1);
});
