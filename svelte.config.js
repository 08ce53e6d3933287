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
				return tsconfig;
			}
		}
	}
};

export default config;
