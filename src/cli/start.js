// `npm start`: builds the app only when the build is missing or older than its sources, then runs
// the built server in this same process with defaults for a local run. Its `init` hook
// (src/hooks.server.ts) migrates, seeds the demo and starts the mail stand-in before it listens.
// `node src/cli/start.js` without `--build-if-stale` (Playwright's web server) never builds.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

process.env.HOST ??= '127.0.0.1';
process.env.PORT ??= '3000';
process.env.ORIGIN ??= `http://${process.env.HOST}:${process.env.PORT}`;
// Certificates may be up to 10 MB each, several per upload; adapter-node refuses larger bodies.
process.env.BODY_SIZE_LIMIT ??= '45M';
// Node closes an idle kept-alive connection after 5 s; a client that sends on it just then gets the
// connection reset. Holding it longer than clients and proxies do (60 s is common practice) avoids that.
process.env.KEEP_ALIVE_TIMEOUT ??= '75';
process.env.HEADERS_TIMEOUT ??= '80';

const server = resolve('build/index.js');
const BUILD_INPUTS = [
	'src',
	'chemistry',
	'static',
	'svelte.config.js',
	'vite.config.ts',
	'tailwind.config.ts',
	'package-lock.json'
];

/**
 * The newest modification time under a file or folder, in ms.
 * @param {string} path
 * @returns {number}
 */
function newestChange(path) {
	if (!existsSync(path)) return 0;
	const stats = statSync(path);
	if (!stats.isDirectory()) return stats.mtimeMs;
	let newest = stats.mtimeMs;
	for (const entry of readdirSync(path)) newest = Math.max(newest, newestChange(join(path, entry)));
	return newest;
}

function buildIsStale() {
	if (!existsSync(server)) return 'there is no build yet';
	const builtAt = statSync(server).mtimeMs;
	const changed = BUILD_INPUTS.find((input) => newestChange(resolve(input)) > builtAt);
	return changed ? `${changed} changed since the last build` : null;
}

if (process.argv.includes('--build-if-stale')) {
	const reason = buildIsStale();
	if (reason) {
		console.log(`Building the app (${reason}); this takes a minute or two.`);
		// The build runs in a child that exits before the server starts: the server stays one process
		// without the build tool's memory.
		const vite = resolve('node_modules/vite/bin/vite.js');
		const built = spawnSync(process.execPath, [vite, 'build', '--logLevel', 'warn'], {
			stdio: 'inherit'
		});
		if (built.status !== 0) process.exit(built.status ?? 1);
	} else {
		console.log('The build is up to date with the sources; starting it.');
	}
}

if (!existsSync(server)) {
	console.error(
		'No build found at build/index.js: run `npm start` (it builds) or `npm run build`.'
	);
	process.exit(1);
}
await import(pathToFileURL(server).href);
