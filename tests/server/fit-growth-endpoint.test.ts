import { describe, expect, it, vi } from 'vitest';
import { postJson } from './endpoint-call';
import { fitGrowthResponse } from '$chemistry';
import reference from '../chemistry/reference/growth-curves.json';

// The endpoints' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

const { POST } = await import('../../src/routes/api/v1/fit/growth/+server');

const engineer = {
	id: 'u-engineer',
	email: 'engineer@lab.test',
	name: 'Engineer',
	roles: ['engineer']
};

const postFit = (body: unknown, user: typeof engineer | null = engineer) =>
	postJson(POST, '/api/v1/fit/growth', body, { user });

async function expectProblem(response: Response, path: string) {
	expect(response.status).toBe(400);
	expect(response.headers.get('content-type')).toContain('application/problem+json');
	const body = await response.json();
	expect(body.errors.map((e: { path: string }) => e.path)).toEqual([path]);
	return body as { detail: string; errors: { path: string; message: string }[] };
}

// Noisy samples (3 %) of a Monod batch (μmax 0.4 /h, Ks 0.2 g/L, Yx/s 0.5) every 2 h, made and fitted
// by an independent script (tests/chemistry/reference/growth-curves.py): the substrate runs out
// between two samples, and that fit finds Ks undetermined.
const sparse = reference.monodFits.find((c) => c.label === 'every 2 h')!;

describe('POST /api/v1/fit/growth', () => {
	it('answers the documented shape, with intervals for the whole-curve parameters and plain warnings', async () => {
		const response = await postFit({
			timeH: sparse.timeH,
			biomassGPerL: sparse.biomassGPerL,
			substrateGPerL: sparse.substrateGPerL
		});
		expect(response.status).toBe(200);
		const body = fitGrowthResponse.parse(await response.json());
		const { muMaxPerH, ksGPerL, yieldXS } = body.monodFit!.estimates;
		// μmax and Yx/s are determined (intervals within a factor of 3) and hold the script's truth.
		for (const [estimate, truth] of [
			[muMaxPerH, sparse.truth.muMaxPerH],
			[yieldXS!, sparse.truth.yieldXS]
		] as const) {
			expect(estimate.lower95!).toBeLessThanOrEqual(truth);
			expect(estimate.upper95!).toBeGreaterThanOrEqual(truth);
			expect(estimate.poorlyDetermined).toBe(false);
		}
		expect(ksGPerL).toMatchObject({
			poorlyDetermined: true,
			lower95: null,
			upper95: null,
			standardError: null
		});
		expect(body.warnings.some((w) => /^Ks is (poorly|not) determined by these data/.test(w))).toBe(
			true
		);
	});

	it('refuses too few points as a problem naming timeH', async () => {
		const body = await expectProblem(
			await postFit({ timeH: [0, 1, 2], biomassGPerL: [0.1, 0.2, 0.4] }),
			'timeH'
		);
		expect(body.detail).toBe('At least 4 data points are needed (got 3).');
	});

	it('refuses time that does not increase, naming the point', async () => {
		const body = await expectProblem(
			await postFit({ timeH: [0, 1, 1, 2, 3], biomassGPerL: [0.1, 0.2, 0.3, 0.4, 0.8] }),
			'timeH.2'
		);
		expect(body.detail).toBe('timeH must increase strictly; timeH[2] = 1 follows 1.');
	});

	it('refuses all-flat biomass, saying nothing grew', async () => {
		const body = await expectProblem(
			await postFit({ timeH: [0, 1, 2, 3, 4], biomassGPerL: [0.3, 0.3, 0.3, 0.3, 0.3] }),
			'biomassGPerL'
		);
		expect(body.detail).toMatch(/the culture did not grow/);
	});

	it('passes the reason of a refused fit through, naming the test that failed', async () => {
		const timeH = [0, 1, 2, 3, 4, 5, 6, 7];
		const body = await expectProblem(
			await postFit({ timeH, biomassGPerL: [1, 1.1, 0.95, 1.05, 1.0, 1.08, 0.97, 1.02] }),
			'biomassGPerL'
		);
		expect(body.detail).toMatch(/^No exponential phase found: /);
	});

	it('checks the shape first: a word among the numbers and an unknown key', async () => {
		const response = await postFit({
			timeH: [0, 1, 2, 3],
			biomassGPerL: [0.1, 'x', 0.3, 0.4],
			smoothing: true
		});
		expect(response.status).toBe(400);
		const body = await response.json();
		// The unknown key is named at its own path (strict request shapes).
		expect(body.errors.map((e: { path: string }) => e.path).sort()).toEqual([
			'biomassGPerL.1',
			'smoothing'
		]);
	});

	it('runs behind the real guard: signed out is a 401', async () => {
		expect(
			(await postFit({ timeH: [0, 1, 2, 3], biomassGPerL: [0.1, 0.2, 0.4, 0.8] }, null)).status
		).toBe(401);
	});
});
