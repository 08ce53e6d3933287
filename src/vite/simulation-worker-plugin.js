// Writes the simulation pool's worker (src/lib/server/simulation-worker.ts with `$chemistry`) as one
// plain ES module that a worker thread can load without Vite: `vite build` writes it beside the
// server adapter-node wrote; `vite dev` and vitest write it when they start, and dev again when a file
// in it changes. The package's runtime dependencies stay imports, as in adapter-node's server bundle.
// Plain JavaScript, like svelte.config.js: the Vite config loads it before anything is compiled.
import { mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { build } from 'vite';
import svelteConfig from '../../svelte.config.js';
import {
	BUILT_SIMULATION_WORKER,
	DEV_SIMULATION_WORKER,
	SIMULATION_WORKER_ENTRY
} from '../lib/server/simulation-worker-files.js';

/** @param {string} root */
function runtimeDependencies(root) {
	const pkg = JSON.parse(readFileSync(resolve(root, 'package.json'), 'utf8'));
	return Object.keys(pkg.dependencies ?? {}).map((name) => new RegExp(`^${name}(/.*)?$`));
}

/**
 * The app's own aliases (`$chemistry`), from the one place they are set.
 * @param {string} root
 * @returns {import('vite').Alias[]}
 */
function kitAliases(root) {
	const aliases = svelteConfig.kit?.alias ?? {};
	return Object.entries(aliases).map(([find, path]) => ({
		find,
		replacement: resolve(root, path)
	}));
}

/**
 * The worker as one module, and every source file in it (to write it again when one changes).
 * @param {string} root
 * @returns {Promise<{ code: string, moduleIds: string[] }>}
 */
async function bundleWorker(root) {
	const output = await build({
		configFile: false,
		root,
		mode: 'production',
		logLevel: 'warn',
		publicDir: false,
		resolve: { alias: kitAliases(root) },
		ssr: { noExternal: true, target: 'node' },
		build: {
			ssr: resolve(root, SIMULATION_WORKER_ENTRY),
			write: false,
			minify: false,
			target: 'node20',
			rolldownOptions: {
				external: runtimeDependencies(root),
				output: { codeSplitting: false }
			}
		}
	});
	const [chunk] = /** @type {import('vite').Rolldown.RolldownOutput} */ (output).output;
	return { code: chunk.code, moduleIds: chunk.moduleIds };
}

/**
 * Writes through a temporary file, so a thread starting meanwhile never reads half a module.
 * @param {string} file
 * @param {string} code
 */
function writeWhole(file, code) {
	mkdirSync(dirname(file), { recursive: true });
	const partial = `${file}.${process.pid}.partial`;
	writeFileSync(partial, code);
	renameSync(partial, file);
}

/** @returns {import('vite').Plugin} */
export function simulationWorker() {
	/** @type {import('vite').ResolvedConfig} */
	let config;
	return {
		name: 'brothwright:simulation-worker',
		configResolved(resolved) {
			config = resolved;
		},
		async configureServer(server) {
			const file = resolve(config.root, DEV_SIMULATION_WORKER);
			let bundled = await bundleWorker(config.root);
			writeWhole(file, bundled.code);
			let writing = Promise.resolve();
			server.watcher.on('change', (changed) => {
				if (!bundled.moduleIds.includes(resolve(changed))) return;
				writing = writing
					.then(async () => {
						bundled = await bundleWorker(config.root);
						writeWhole(file, bundled.code);
					})
					.catch((cause) =>
						config.logger.error(`Simulation worker not rewritten: ${cause.message}`)
					);
			});
		},
		// After SvelteKit's own closeBundle, in which adapter-node empties and writes build/.
		closeBundle: {
			order: 'post',
			sequential: true,
			async handler() {
				if (config.command !== 'build' || !config.build.ssr) return;
				const { code } = await bundleWorker(config.root);
				writeWhole(resolve(config.root, BUILT_SIMULATION_WORKER), code);
			}
		}
	};
}
