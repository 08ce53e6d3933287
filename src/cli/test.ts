// `npm test`: lint (Prettier, ESLint), type check, unit and server tests, build, then the browser tests in Debian's Chromium.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

function run(label: string, command: string, args: string[], env: NodeJS.ProcessEnv = {}): void {
	console.log(`\n== ${label}`);
	const started = Date.now();
	const result = spawnSync(command, args, { stdio: 'inherit', env: { ...process.env, ...env } });
	if (result.status !== 0) {
		console.error(`\n${label} failed (exit ${result.status ?? result.signal}).`);
		process.exit(result.status ?? 1);
	}
	console.log(`== ${label}: ok in ${((Date.now() - started) / 1000).toFixed(1)} s`);
}

function ensureChromium(): void {
	if (existsSync(chromium)) return;
	const isRoot = process.getuid?.() === 0;
	const hasApt = spawnSync('sh', ['-c', 'command -v apt-get'], { stdio: 'ignore' }).status === 0;
	if (isRoot && hasApt && !process.env.CHROMIUM_PATH) {
		console.log("Chromium is missing: installing Debian's chromium package.");
		run('apt-get update', 'apt-get', ['update']);
		run(
			'apt-get install chromium',
			'apt-get',
			['install', '-y', '--no-install-recommends', 'chromium'],
			{
				DEBIAN_FRONTEND: 'noninteractive'
			}
		);
		if (existsSync(chromium)) return;
	}
	console.error(
		`The browser tests need Chromium at ${chromium}.\n` +
			"Install Debian's package (as root: apt-get update && apt-get install -y chromium),\n" +
			'or set CHROMIUM_PATH to a Chromium or Chrome binary.'
	);
	process.exit(1);
}

// ESLint reads the TypeScript project, which extends the config that `svelte-kit sync` writes.
run('generate types', 'npx', ['svelte-kit', 'sync']);
run('lint (Prettier, ESLint)', 'npm', ['run', 'lint']);
ensureChromium();
run('type check', 'npx', ['svelte-check', '--tsconfig', './tsconfig.json', '--fail-on-warnings']);
run('unit and server tests (vitest)', 'npx', ['vitest', 'run']);
run('build', 'npx', ['vite', 'build']);
run('browser tests (Playwright, Chromium)', 'npx', ['playwright', 'test'], {
	CHROMIUM_PATH: chromium
});
console.log('\nAll tests passed.');
