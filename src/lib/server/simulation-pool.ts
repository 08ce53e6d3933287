// Simulations, fits and study evaluations run here, in worker threads, never on the thread that
// answers requests: one long run would otherwise hold up every other request for its whole length
// (tests/bench/health-under-load.ts measures it). piscina (5.x, for Node ≥ 20) rather than bare
// worker_threads: it keeps the threads, queues what waits and, when a run is aborted, terminates its
// thread and starts another, so a run past the time limit stops burning CPU at once. The threads load
// the bundled worker (simulation-worker-files.js): written by `vite build`, and by `vite dev` and
// vitest when they start.
import { existsSync, statSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { resolve } from 'node:path';
import { MessageChannel } from 'node:worker_threads';
import { error } from '@sveltejs/kit';
import { Piscina } from 'piscina';
import { RuleError } from './rule-error';
import { simulationTimeLimitS } from './simulation-settings';
import {
	errorOf,
	TASK_WORDING,
	type ScienceInput,
	type ScienceOutput,
	type ScienceTaskKind,
	type TaskAnswer
} from './simulation-tasks';
import { BUILT_SIMULATION_WORKER, DEV_SIMULATION_WORKER } from './simulation-worker-files.js';

// Vite's flag rather than $app/environment's: the same under vite dev, the build and vitest, and
// scripts run outside Vite (npm run seed:scale under tsx) can load this module too.
const dev = Boolean(import.meta.env?.DEV);

/** One thread per core but one, which stays free for the requests; at least one. */
export const SIMULATION_THREADS = Math.max(1, availableParallelism() - 1);
/** Runs that may wait for a thread; beyond them a request is told the server is busy (503). */
export const MAX_WAITING_RUNS = 8 * SIMULATION_THREADS;

let pool: Piscina | null = null;
let poolFileChangedAt = 0;
let runsInPool = 0;

function workerFile(): string {
	const file = resolve(dev ? DEV_SIMULATION_WORKER : BUILT_SIMULATION_WORKER);
	if (!existsSync(file))
		throw new Error(
			`The simulation worker is missing at ${file}: ${dev ? 'vite dev and vitest write it when they start (src/vite/simulation-worker-plugin.js)' : 'run `npm run build` from the repository folder'}.`
		);
	return file;
}

function openPool(): Piscina {
	const filename = workerFile();
	// vite dev writes the worker again when the science changes: threads started before run old code.
	if (pool && dev && statSync(filename).mtimeMs !== poolFileChangedAt) {
		void pool.destroy();
		pool = null;
	}
	if (pool) return pool;
	poolFileChangedAt = statSync(filename).mtimeMs;
	pool = new Piscina({
		filename,
		minThreads: SIMULATION_THREADS,
		maxThreads: SIMULATION_THREADS
	});
	const closing = pool;
	process.once('sveltekit:shutdown', () => void closing.destroy());
	return pool;
}

/** Starts the threads now (at server start-up; each loads the science, a second or two); how many. */
export function startSimulationPool(): number {
	return openPool().options.maxThreads;
}

function formatSeconds(s: number): string {
	return `${Number(s.toPrecision(3))} s`;
}

function timeLimitRefusal(kind: ScienceTaskKind, limitS: number): RuleError {
	const { name, advice } = TASK_WORDING[kind];
	return new RuleError(
		`${name} took longer than the time limit of ${formatSeconds(limitS)} and was stopped: ${advice}. An administrator sets the limit under Settings.`,
		{ status: 422 }
	);
}

/**
 * Runs `kind` on `input` in a pool thread. The science's refusals are thrown again here as their
 * own errors (ChemistryInputError with its field, SimulationFailedError ...); a run longer than the
 * site's time limit (`simulation.time_limit_s`) is stopped and answered as a 422 RuleError.
 */
export async function runInPool<K extends ScienceTaskKind>(
	kind: K,
	input: ScienceInput<K>
): Promise<ScienceOutput<K>> {
	if (runsInPool >= SIMULATION_THREADS + MAX_WAITING_RUNS)
		error(503, 'The server is busy with other calculations; try again in a minute.');
	const limitMs = simulationTimeLimitS() * 1000;
	const abort = new AbortController();
	const { port1: started, port2: startedInWorker } = new MessageChannel();
	let timer: ReturnType<typeof setTimeout> | undefined;
	started.once('message', () => {
		timer = setTimeout(() => abort.abort(), limitMs);
	});
	runsInPool++;
	try {
		const answer: TaskAnswer<ScienceOutput<K>> = await openPool().run(
			{ kind, input, started: startedInWorker },
			{ signal: abort.signal, transferList: [startedInWorker] }
		);
		if (!answer.ok) throw errorOf(answer.failure);
		return answer.value;
	} catch (cause) {
		if (abort.signal.aborted) throw timeLimitRefusal(kind, limitMs / 1000);
		throw cause;
	} finally {
		runsInPool--;
		clearTimeout(timer);
		started.close();
	}
}

/** The pool as tests see it: its threads and how many runs it has finished. */
export function simulationPoolState() {
	return {
		threads: pool?.threads ?? [],
		completed: pool?.completed ?? 0,
		workerFile: pool?.options.filename ?? null
	};
}
