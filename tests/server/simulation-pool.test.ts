import { describe, expect, it, vi } from 'vitest';
import type { Worker } from 'node:worker_threads';
import { resolve } from 'node:path';
import { simulateRun } from '$chemistry';
import { simulateRequest } from '$lib/server/api/operations/simulation';
import { RuleError } from '$lib/server/rule-error';
import {
	MAX_WAITING_RUNS,
	runInPool,
	SIMULATION_THREADS,
	simulationPoolState
} from '$lib/server/simulation-pool';
import {
	DEFAULT_SIMULATION_TIME_LIMIT_S,
	setSimulationTimeLimitS
} from '$lib/server/simulation-settings';
import { DEV_SIMULATION_WORKER } from '$lib/server/simulation-worker-files.js';
import { cellCultureThreeStreams, swingingStreams } from '../simulation-requests';
import { callJson, postJson } from './endpoint-call';
import { makeUser } from './helpers';

// The endpoints' guard reads the event through getRequestEvent: see endpoint-call.ts.
vi.mock('$app/server', async (importOriginal) => ({
	...(await importOriginal<typeof import('$app/server')>()),
	getRequestEvent: (await import('./endpoint-call')).currentEvent
}));

const simulate = await import('../../src/routes/api/v1/simulate/+server');
const health = await import('../../src/routes/api/v1/health/+server');

const engineer = { id: 'u-engineer', email: 'engineer@lab.test', name: 'E', roles: ['engineer'] };
const postSimulate = (body: unknown) =>
	postJson(simulate.POST, '/api/v1/simulate', body, { user: engineer });

// The 14-day cell-culture fed-batch with an O2 balance and three feed streams (DO-stat, constant,
// capped exponential) of the benchmarks, every quarter hour: events, regimes and every series.
const threeStreams = { ...cellCultureThreeStreams, outputEveryH: 0.25 };

const shortBatch = {
	mode: 'batch',
	kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 },
	initial: { biomassGPerL: 0.1, substrateGPerL: 10, volumeL: 1 },
	endH: 10,
	outputEveryH: 1
};

async function withTimeLimit(seconds: string, run: () => Promise<void>) {
	const admin = await makeUser(['admin']);
	setSimulationTimeLimitS(admin, seconds);
	try {
		await run();
	} finally {
		setSimulationTimeLimitS(admin, String(DEFAULT_SIMULATION_TIME_LIMIT_S));
	}
}

function exitOf(worker: Worker, withinMs: number): Promise<number> {
	return new Promise((done, fail) => {
		const timer = setTimeout(() => fail(new Error('the thread did not exit')), withinMs);
		worker.once('exit', (code) => {
			clearTimeout(timer);
			done(code);
		});
	});
}

const percentile = (sorted: number[], fraction: number) =>
	sorted[Math.min(sorted.length - 1, Math.floor(sorted.length * fraction))];

describe('simulations run in the worker pool', () => {
	it('answers exactly what simulateRun answers in this thread, from a pool thread', async () => {
		const before = simulationPoolState().completed;
		const response = await postSimulate(threeStreams);
		expect(response.status).toBe(200);
		const throughPool = await response.json();
		const inThread = simulateRun(simulateRequest.parse(threeStreams));
		expect(throughPool).toEqual(JSON.parse(JSON.stringify(inThread)));
		expect(throughPool.events.length).toBeGreaterThan(0);
		const state = simulationPoolState();
		expect(state.completed).toBe(before + 1);
		expect(state.threads).toHaveLength(SIMULATION_THREADS);
		expect(state.workerFile).toBe(resolve(DEV_SIMULATION_WORKER));
	});

	it('stops a run past the time limit with a 422 that says what to change, ends its thread and serves the next', async () => {
		await withTimeLimit('0.25', async () => {
			expect((await postSimulate(shortBatch)).status).toBe(200);
			const { threads } = simulationPoolState();
			const exits = Promise.all(threads.map((thread) => exitOf(thread, 5_000)));
			const started = performance.now();
			const response = await postSimulate(swingingStreams(400));
			expect(response.status).toBe(422);
			expect(response.headers.get('content-type')).toContain('application/problem+json');
			const problem = await response.json();
			expect(problem.detail).toBe(
				'The simulation took longer than the time limit of 0.25 s and was stopped: try a shorter end time (endH), fewer or smoother feed streams, or a coarser output interval (outputEveryH). An administrator sets the limit under Settings.'
			);
			// The run alone takes about 4 s here; the answer came at the limit, not at its end.
			expect(performance.now() - started).toBeLessThan(2_000);
			// The thread that ran it was terminated, not left computing, and another took its place.
			await exits;
			const replaced = simulationPoolState().threads;
			expect(replaced).toHaveLength(SIMULATION_THREADS);
			for (const thread of threads) expect(replaced).not.toContain(thread);
			const next = await postSimulate(shortBatch);
			expect(next.status).toBe(200);
			expect((await next.json()).t).toHaveLength(11);
		});
	});

	it('keeps the request thread free while four heavy runs go on', async () => {
		let running = 4;
		const runs = Array.from({ length: running }, () =>
			postSimulate(swingingStreams(100)).finally(() => running--)
		);
		const healthMs: number[] = [];
		while (running > 0) {
			const start = performance.now();
			const answer = await callJson(health.GET, 'get', '/api/v1/health', undefined, { user: null });
			healthMs.push(performance.now() - start);
			expect(answer.status).toBe(200);
			await new Promise((done) => setTimeout(done, 5));
		}
		expect((await Promise.all(runs)).map((r) => r.status)).toEqual([200, 200, 200, 200]);
		healthMs.sort((a, b) => a - b);
		// In this thread the four runs (about 1 s each) would hold every check for a whole run.
		expect(healthMs.length).toBeGreaterThan(20);
		expect(percentile(healthMs, 0.99)).toBeLessThan(200);
	}, 60_000);

	it('answers 503 problem+json, not a 500, when every thread and waiting place is taken', async () => {
		await withTimeLimit('0.2', async () => {
			// Heavy runs hold every thread (until the limit stops them); short ones fill the queue.
			const settle = (run: Promise<unknown>) =>
				run.then(
					(value) => ({ value }),
					(cause) => ({ cause })
				);
			const heavy = Array.from({ length: SIMULATION_THREADS }, () =>
				settle(runInPool('simulate', simulateRequest.parse(swingingStreams(400))))
			);
			const waiting = Array.from({ length: MAX_WAITING_RUNS }, () =>
				settle(runInPool('simulate', simulateRequest.parse(shortBatch)))
			);
			const response = await postSimulate(shortBatch);
			expect(response.status).toBe(503);
			expect(response.headers.get('content-type')).toContain('application/problem+json');
			expect((await response.json()).detail).toBe(
				'The server is busy with other calculations; try again in a minute.'
			);
			for (const outcome of await Promise.all(heavy)) {
				expect(outcome).toEqual({ cause: expect.any(RuleError) });
				expect((outcome as { cause: RuleError }).cause.status).toBe(422);
			}
			for (const outcome of await Promise.all(waiting))
				expect(JSON.parse((outcome as { value: string }).value)).toEqual(
					expect.objectContaining({ t: expect.any(Array) })
				);
			expect((await postSimulate(shortBatch)).status).toBe(200);
		});
	}, 60_000);
});
