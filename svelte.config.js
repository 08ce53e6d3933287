import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: 'build' }),
		// Scripts only from this origin plus the framework's own inline start-up script (nonce or hash).
		// style-src keeps 'unsafe-inline': Svelte writes style attributes (bar widths, colours) and
		// transitions inject <style>; an inline style cannot run code.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self', 'data:'],
				'connect-src': ['self'],
				'media-src': ['self', 'blob:'],
				'worker-src': ['self', 'blob:'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		},
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
