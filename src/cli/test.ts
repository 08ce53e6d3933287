// `npm test`: lint (Prettier, ESLint) and the type check side by side, unit and server tests,
// build, then the browser tests in Debian's Chromium. Every phase runs even when one before it failed (only the browser
// tests need the build), and the failures are listed together at the end.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
const failures: string[] = [];

/** Runs one phase; true when it passed. A setup step that must pass exits at once instead. */
function run(
	label: string,
	command: string,
	args: string[],
	env: NodeJS.ProcessEnv = {},
	required = false
): boolean {
	console.log(`\n== ${label}`);
	const started = Date.now();
	const result = spawnSync(command, args, { stdio: 'inherit', env: { ...process.env, ...env } });
	const seconds = ((Date.now() - started) / 1000).toFixed(1);
	if (result.status === 0) {
		console.log(`== ${label}: ok in ${seconds} s`);
		return true;
	}
	const failure = `${label} failed (exit ${result.status ?? result.signal}) after ${seconds} s`;
	console.error(`\n${failure}.`);
	if (required) process.exit(result.status ?? 1);
	failures.push(failure);
	return false;
}

/**
 * Runs phases side by side (each single-threaded: two cores do both in the time of the longer),
 * printing each one's output whole when it ends so the two do not interleave.
 */
async function runTogether(
	phases: { label: string; command: string; args: string[] }[]
): Promise<void> {
	const outcomes = await Promise.all(
		phases.map(
			({ label, command, args }) =>
				new Promise<{ label: string; output: string; status: number | null; seconds: string }>(
					(resolve) => {
						const started = Date.now();
						const child = spawn(command, args, { env: process.env });
						let output = '';
						child.stdout.on('data', (chunk) => (output += chunk));
						child.stderr.on('data', (chunk) => (output += chunk));
						child.on('close', (status) =>
							resolve({
								label,
								output,
								status,
								seconds: ((Date.now() - started) / 1000).toFixed(1)
							})
						);
					}
				)
		)
	);
	for (const { label, output, status, seconds } of outcomes) {
		console.log(`\n== ${label}`);
		process.stdout.write(output);
		if (status === 0) console.log(`== ${label}: ok in ${seconds} s`);
		else {
			const failure = `${label} failed (exit ${status}) after ${seconds} s`;
			console.error(`\n${failure}.`);
			failures.push(failure);
		}
	}
}

const PDF_RENDERER = '/usr/bin/pdftoppm';

const onPath = (command: string) =>
	spawnSync('sh', ['-c', `command -v ${command}`], { stdio: 'ignore' }).status === 0;

/**
 * Debian packages the browser tests need: Chromium, poppler-utils to render printed PDFs, and curl
 * and Python 3 to run the API examples in `examples/` against the test server.
 */
function ensureBrowserTools(): void {
	const missing = [
		...(existsSync(chromium) ? [] : ['chromium']),
		...(existsSync(PDF_RENDERER) ? [] : ['poppler-utils']),
		...(onPath('curl') ? [] : ['curl']),
		...(onPath('python3') ? [] : ['python3'])
	];
	if (!missing.length) return;
	const isRoot = process.getuid?.() === 0;
	const hasApt = onPath('apt-get');
	const chromiumElsewhere = missing.includes('chromium') && process.env.CHROMIUM_PATH;
	if (isRoot && hasApt && !chromiumElsewhere) {
		console.log(`Missing for the browser tests: installing Debian's ${missing.join(' and ')}.`);
		run('apt-get update', 'apt-get', ['update'], {}, true);
		run(
			`apt-get install ${missing.join(' ')}`,
			'apt-get',
			['install', '-y', '--no-install-recommends', ...missing],
			{ DEBIAN_FRONTEND: 'noninteractive' },
			true
		);
		if (existsSync(chromium) && existsSync(PDF_RENDERER) && onPath('curl') && onPath('python3'))
			return;
	}
	console.error(
		`The browser tests need Chromium at ${chromium}, pdftoppm at ${PDF_RENDERER}, curl and python3.\n` +
			"Install Debian's packages (as root: apt-get update && apt-get install -y chromium poppler-utils curl python3),\n" +
			'or set CHROMIUM_PATH to a Chromium or Chrome binary.'
	);
	process.exit(1);
}

// ESLint reads the TypeScript project, which extends the config that `svelte-kit sync` writes.
run('generate types', 'npx', ['svelte-kit', 'sync'], {}, true);
ensureBrowserTools();
await runTogether([
	{ label: 'lint (Prettier, ESLint)', command: 'npm', args: ['run', 'lint'] },
	{
		label: 'type check',
		command: 'npx',
		args: ['svelte-check', '--tsconfig', './tsconfig.json', '--fail-on-warnings']
	}
]);
run('unit and server tests (vitest)', 'npx', ['vitest', 'run']);
if (run('build', 'npx', ['vite', 'build'])) {
	run('browser tests (Playwright, Chromium)', 'npx', ['playwright', 'test'], {
		CHROMIUM_PATH: chromium
	});
} else {
	failures.push('browser tests not run: they need the build');
}
if (failures.length) {
	console.error(
		`\n${failures.length} phase(s) failed:\n${failures.map((f) => `  - ${f}`).join('\n')}`
	);
	process.exit(1);
}
console.log('\nAll tests passed.');
