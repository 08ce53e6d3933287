import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	test: {
		include: [
			'tests/chemistry/**/*.test.ts',
			'tests/server/**/*.test.ts',
			'tests/security/**/*.test.ts'
		],
		environment: 'node',
		setupFiles: ['tests/setup.ts'],
		expect: { requireAssertions: true },
		testTimeout: 20_000
	}
});
