import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';
import { simulationWorker } from './src/vite/simulation-worker-plugin.js';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit(), simulationWorker()],
	test: {
		environment: 'node',
		expect: { requireAssertions: true },
		// Generous for a busy 2-core machine: a hook seeding a demo database hashes passwords
		// (argon2id, 19 MiB each) and ran past vitest's 10 s default there.
		testTimeout: 20_000,
		hookTimeout: 60_000,
		projects: [
			{
				extends: true,
				test: {
					name: 'science',
					include: ['tests/chemistry/**/*.test.ts'],
					// The science is pure (no database, no globals it changes), so its files share one
					// module cache: importing mathjs and the library once instead of per file halves the phase.
					isolate: false
				}
			},
			{
				extends: true,
				test: {
					name: 'server',
					// Worker threads start faster than forked processes: about 40 s less over the server
					// files on two cores. Each file still gets its own module graph and database.
					pool: 'threads',
					include: ['tests/server/**/*.test.ts', 'tests/security/**/*.test.ts'],
					globalSetup: ['tests/global-setup.ts'],
					setupFiles: ['tests/setup.ts']
				}
			}
		]
	}
});
