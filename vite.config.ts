import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';
import { simulationWorker } from './src/vite/simulation-worker-plugin.js';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit(), simulationWorker()],
	test: {
		include: [
			'tests/chemistry/**/*.test.ts',
			'tests/server/**/*.test.ts',
			'tests/security/**/*.test.ts'
		],
		environment: 'node',
		globalSetup: ['tests/global-setup.ts'],
		setupFiles: ['tests/setup.ts'],
		expect: { requireAssertions: true },
		// Generous for a busy 2-core machine: a hook seeding a demo database hashes passwords
		// (argon2id, 19 MiB each) and ran past vitest's 10 s default there.
		testTimeout: 20_000,
		hookTimeout: 60_000
	}
});
