// Where the simulation worker comes from and where its bundle is written, read by the Vite plugin
// that writes it (src/vite/simulation-worker-plugin.ts) and by the pool that loads it. Paths are
// relative to the repository folder, from which the server runs (as it does for ./drizzle).

/** The worker's source: the module a pool thread loads, bundled with `$chemistry`. */
export const SIMULATION_WORKER_ENTRY = 'src/lib/server/simulation-worker.ts';
/** Written by `vite build` beside the server that adapter-node writes. */
export const BUILT_SIMULATION_WORKER = 'build/simulation-worker.js';
/** Written when `vite dev` or vitest starts, and again when a file it bundles changes. */
export const DEV_SIMULATION_WORKER = '.svelte-kit/simulation-worker/simulation-worker.js';
