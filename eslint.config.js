import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import { defineConfig } from 'eslint/config';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

export default defineConfig(
	{
		// Generated, installed or written at run time (as in .gitignore).
		ignores: [
			'build/',
			'.svelte-kit/',
			'node_modules/',
			'data/',
			'test-results/',
			'playwright-report/',
			'tests/.tmp/',
			// Written by `npm run api:types`.
			'src/lib/api/schema.d.ts'
		]
	},
	js.configs.recommended,
	ts.configs.recommended,
	svelte.configs.recommended,
	// Last among the shared configs: switches off every rule that Prettier's formatting decides.
	prettier,
	svelte.configs.prettier,
	{
		languageOptions: { globals: { ...globals.browser, ...globals.node } },
		rules: {
			// TypeScript itself reports undefined names, with the project's types and globals.
			'no-undef': 'off',
			// The app is served at the root (no `paths.base`) and its links are plain paths built from ids, so
			// resolve() would add nothing to an <a href>; goto and history calls are still checked.
			'svelte/no-navigation-without-resolve': ['error', { ignoreLinks: true }],
			// A leading underscore marks a value left out on purpose (a destructured field dropped from a copy).
			'@typescript-eslint/no-unused-vars': [
				'error',
				{ argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' }
			]
		}
	},
	{
		files: ['**/*.svelte', '**/*.svelte.ts', '**/*.svelte.js'],
		languageOptions: {
			// TypeScript in Svelte files is parsed without the type checker: no rule here needs types
			// (svelte-check type-checks them), and building the project's types made ESLint 4× slower.
			parserOptions: {
				extraFileExtensions: ['.svelte'],
				parser: ts.parser,
				svelteConfig
			}
		}
	}
);
