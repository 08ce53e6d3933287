import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: 'build' }),
		alias: {
			$chemistry: 'chemistry'
		},
		typescript: {
			config(tsconfig) {
				tsconfig.include.push('../chemistry/**/*.ts', '../tests/**/*.ts');
				// odex ships raw .ts sources that do not pass our strict checks; a small declaration stands in
				tsconfig.compilerOptions.paths = {
					...tsconfig.compilerOptions.paths,
					odex: ['../chemistry/types/odex.d.ts']
				};
				return tsconfig;
			}
		}
	}
};

export default config;
