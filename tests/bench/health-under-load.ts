// How quickly the built server answers a health check while four heavy simulations run: they run in
// the worker pool, so the request thread should stay free. Starts `build/` (as `npm start` does) on
// a fresh database, signs in as the demo engineer, samples GET /api/v1/health idle and under load,
// and prints p50 and p99 against the target with the ratio p99/target.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { join, resolve } from 'node:path';

const TARGET_P99_MS = 20;
const CONCURRENT_SIMULATIONS = 4;
const IDLE_SAMPLES = 100;
const SAMPLE_GAP_MS = 5;

// Eight feed streams whose rates oscillate at different frequencies for 400 h: the integrator must
// follow every swing (thousands of steps), while the answer stays small (one point an hour).
const heavyRun = {
	mode: 'fedBatch',
	kinetics: { muMaxPerH: 0.5, ksGPerL: 0.1, yieldXS: 0.5 },
	initial: { biomassGPerL: 0.5, substrateGPerL: 1, volumeL: 1 },
	feeds: Array.from({ length: 8 }, (_, i) => ({
		label: `Stream ${i + 1}`,
		strategy: 'expression',
		substrateGPerL: 200,
		expression: `0.0001 * (1 + sin(${10 * (i + 1)} * t))`
	})),
	maxVolumeL: 1000,
	endH: 400,
	outputEveryH: 1
};

function freePort(): Promise<number> {
	return new Promise((done, fail) => {
		const probe = createServer();
		probe.once('error', fail);
		probe.listen(0, '127.0.0.1', () => {
			const { port } = probe.address() as { port: number };
			probe.close(() => done(port));
		});
	});
}

function percentile(sortedMs: number[], fraction: number): number {
	return sortedMs[Math.min(sortedMs.length - 1, Math.floor(sortedMs.length * fraction))];
}

async function waitForHealth(origin: string, server: ChildProcess): Promise<void> {
	const deadline = Date.now() + 120_000;
	while (Date.now() < deadline) {
		if (server.exitCode !== null) throw new Error(`the server exited (${server.exitCode})`);
		const ok = await fetch(`${origin}/api/v1/health`).then(
			(r) => r.ok,
			() => false
		);
		if (ok) return;
		await new Promise((done) => setTimeout(done, 250));
	}
	throw new Error('the server did not answer /api/v1/health within 120 s');
}

async function signIn(origin: string): Promise<string> {
	const response = await fetch(`${origin}/api/v1/session`, {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify({ email: 'engineer@demo.test', password: 'brothwright-demo' })
	});
	if (!response.ok) throw new Error(`sign-in answered ${response.status}`);
	return response.headers
		.getSetCookie()
		.map((cookie) => cookie.split(';')[0])
		.join('; ');
}

async function timeHealth(origin: string): Promise<number> {
	const start = performance.now();
	const response = await fetch(`${origin}/api/v1/health`);
	await response.arrayBuffer();
	if (!response.ok) throw new Error(`health answered ${response.status}`);
	return performance.now() - start;
}

async function sampleHealth(origin: string, until: () => boolean): Promise<number[]> {
	const samples: number[] = [];
	while (!until()) {
		samples.push(await timeHealth(origin));
		await new Promise((done) => setTimeout(done, SAMPLE_GAP_MS));
	}
	return samples.sort((a, b) => a - b);
}

async function simulate(origin: string, cookie: string) {
	const start = performance.now();
	const response = await fetch(`${origin}/api/v1/simulate`, {
		method: 'POST',
		headers: { 'content-type': 'application/json', cookie },
		body: JSON.stringify(heavyRun)
	});
	await response.arrayBuffer();
	return { status: response.status, ms: performance.now() - start };
}

function report(name: string, sortedMs: number[]): void {
	const p50 = percentile(sortedMs, 0.5);
	const p99 = percentile(sortedMs, 0.99);
	const ratio = p99 / TARGET_P99_MS;
	console.log(
		name.padEnd(58),
		p50.toFixed(2).padStart(10),
		p99.toFixed(2).padStart(10),
		`${TARGET_P99_MS}`.padStart(8),
		`${ratio.toFixed(3)}${ratio <= 1 ? ' ' : '!'}`.padStart(7),
		`${sortedMs.length}`.padStart(8)
	);
}

async function measure(origin: string): Promise<void> {
	const cookie = await signIn(origin);
	await simulate(origin, cookie); // warm-up: the pool's threads load the worker
	const idle: number[] = [];
	for (let i = 0; i < IDLE_SAMPLES; i++) idle.push(await timeHealth(origin));
	let running = CONCURRENT_SIMULATIONS;
	const runs = Array.from({ length: CONCURRENT_SIMULATIONS }, () =>
		simulate(origin, cookie).finally(() => running--)
	);
	const loaded = await sampleHealth(origin, () => running === 0);
	const results = await Promise.all(runs);
	console.log(
		'health check'.padEnd(58),
		'p50 ms'.padStart(10),
		'p99 ms'.padStart(10),
		'target'.padStart(8),
		'ratio'.padStart(7),
		'samples'.padStart(8)
	);
	report(
		'health: idle server',
		idle.sort((a, b) => a - b)
	);
	report(`health: ${CONCURRENT_SIMULATIONS} heavy simulations running`, loaded);
	console.log(
		`simulations: ${results.map((r) => `${r.status} in ${(r.ms / 1000).toFixed(1)} s`).join(', ')}`
	);
	console.log('ratio = p99 / target; a ratio above 1 (marked !) misses its target.');
	if (results.some((r) => r.status !== 200)) {
		console.log('A simulation did not answer 200: the load was not what this measures.');
		process.exitCode = 1;
	}
}

const build = resolve('build/index.js');
if (!existsSync(build) || !existsSync(resolve('build/simulation-worker.js'))) {
	console.log('health under load: no build at build/: run `npm run build` first.');
	process.exitCode = 1;
} else {
	const tmp = resolve('tests/.tmp');
	mkdirSync(tmp, { recursive: true });
	const databasePath = join(tmp, `bench-health-${process.pid}.db`);
	const port = await freePort();
	const origin = `http://127.0.0.1:${port}`;
	const server = spawn(process.execPath, ['src/cli/start.js'], {
		stdio: ['ignore', 'ignore', 'inherit'],
		env: {
			...process.env,
			HOST: '127.0.0.1',
			PORT: String(port),
			ORIGIN: origin,
			DATABASE_PATH: databasePath,
			UPLOADS_PATH: join(tmp, `bench-health-uploads-${process.pid}`),
			SMTP_PORT: String(await freePort()),
			NODE_ENV: 'test'
		}
	});
	try {
		await waitForHealth(origin, server);
		await measure(origin);
	} catch (cause) {
		console.log(`health under load FAILED: ${(cause as Error).message}`);
		process.exitCode = 1;
	} finally {
		if (server.exitCode === null) {
			const exited = new Promise((done) => server.once('exit', done));
			server.kill('SIGTERM');
			await exited;
		}
		for (const suffix of ['', '-wal', '-shm']) rmSync(databasePath + suffix, { force: true });
		rmSync(join(tmp, `bench-health-uploads-${process.pid}`), { recursive: true, force: true });
	}
}
