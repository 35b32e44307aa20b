// ESLint: JavaScript, TypeScript and Svelte rules, with formatting left to Prettier.
import js from '@eslint/js';
import { defineConfig } from 'eslint/config';
import prettier from 'eslint-config-prettier';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

export default defineConfig(
	{
		ignores: [
			'build*/',
			'.svelte-kit*/',
			'.data/',
			'node_modules/',
			'static/',
			'coverage/',
			'test-results/',
			'bench-results/'
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
			// TypeScript itself reports undefined names, better than this rule can.
			'no-undef': 'off',
			// The app is served at the root (no paths.base), so a plain href is the resolved one.
			'svelte/no-navigation-without-resolve': 'off',
			// The Maps and Sets this rule would flag are indexes kept non-reactive on purpose (the grid redraws
			// from $state.raw values it replaces) or locals of a $derived built afresh each time.
			'svelte/prefer-svelte-reactivity': 'off',
			'@typescript-eslint/no-unused-vars': [
				'error',
				{ argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }
			]
		}
	},
	{
		files: ['**/*.svelte', '**/*.svelte.ts', '**/*.svelte.js'],
		languageOptions: {
			parserOptions: { projectService: true, extraFileExtensions: ['.svelte'], parser: ts.parser, svelteConfig }
		}
	}
);
