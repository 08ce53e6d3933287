import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	// Bundled into the server build: `npm start` runs under tsx, whose tsconfig path mapping would
	// otherwise resolve `odex` to its stand-in declaration and the simulation would not load.
	ssr: { noExternal: ['odex'] },
	test: {
		include: ['tests/chemistry/**/*.test.ts', 'tests/server/**/*.test.ts'],
		environment: 'node',
		setupFiles: ['tests/setup.ts'],
		expect: { requireAssertions: true },
		testTimeout: 20_000
	}
});
