// ESLint as the SvelteKit templates set it up (flat config): JavaScript, typescript-eslint and
// eslint-plugin-svelte recommended rules; formatting is Prettier's job (eslint-config-prettier).
import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

export default ts.config(
	{
		ignores: [
			'build/',
			'build-*/',
			'.svelte-kit/',
			'.svelte-kit-*/',
			'.data/',
			'node_modules/',
			'drizzle/',
			'tests/artifacts/',
			'test-results/',
			'playwright-report/'
		]
	},
	js.configs.recommended,
	...ts.configs.recommended,
	...svelte.configs.recommended,
	prettier,
	...svelte.configs.prettier,
	{
		languageOptions: { globals: { ...globals.browser, ...globals.node } },
		rules: {
			// TypeScript (svelte-check) already reports undefined names, with types.
			'no-undef': 'off',
			// A leading underscore marks a value left out on purpose (e.g. `{ inputs: _inputs, ...rest }`).
			'@typescript-eslint/no-unused-vars': [
				'error',
				{ argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' }
			],
			// The app is served at the root (no paths.base), so a link or goto() needs no resolve().
			'svelte/no-navigation-without-resolve': 'off'
		}
	},
	{
		files: ['**/*.svelte', '**/*.svelte.ts', '**/*.svelte.js'],
		languageOptions: { parserOptions: { parser: ts.parser, extraFileExtensions: ['.svelte'], svelteConfig } }
	}
);
