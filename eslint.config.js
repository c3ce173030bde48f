// ESLint flat config. The rule set is kept small and pragmatic (see DEVELOPERS.md, "Lint and format"):
// the recommended sets of ESLint, typescript-eslint and eslint-plugin-svelte; no import cycles; lib/
// stays platform-free (no node:*, svelte, uplot or src/ imports, no DOM or Node globals); src/ reaches
// lib/ through each area's index.ts (type-only imports of an area's types are fine). Formatting is
// Prettier's job (.prettierrc), not ESLint's.
import js from '@eslint/js';
import { createNodeResolver, importX } from 'eslint-plugin-import-x';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const LIB_PLATFORM_FREE = [
	{ group: ['**/src/**'], message: 'lib must not depend on UI or CLI code' },
	{
		group: ['svelte', 'svelte/*', 'uplot', 'node:*', 'fs', 'path', 'os', 'worker_threads', 'child_process'],
		message: 'lib stays platform-free: no Node, Svelte or uPlot',
	},
];

// lib/ areas with an index.ts: src/ imports them through it; top-level lib/*.ts files are public as they are.
const LIB_INTERNALS = [
	{
		group: ['**/lib/*/**', '!**/lib/*/index.js'],
		message: "import from the lib area's index.js (its public API), not from a file inside it",
		allowTypeImports: true,
	},
];

export default tseslint.config(
	{
		ignores: [
			'dist/**',
			'dist-ui/**',
			'test-artifacts/**',
			'coverage/**',
			'node_modules/**',
			'.vite/**',
			'sample-waves/**/*.{csv,cfg,dat,cff,wav,json}',
		],
	},
	js.configs.recommended,
	...tseslint.configs.recommended,
	...svelte.configs['flat/recommended'],
	{
		languageOptions: { ecmaVersion: 2022, sourceType: 'module', globals: { ...globals.node, ...globals.browser } },
		plugins: { 'import-x': importX },
		// imports name the emitted .js file; the resolver maps it back to the .ts source
		settings: {
			'import-x/resolver-next': [
				createNodeResolver({ extensions: ['.ts', '.js', '.svelte'], extensionAlias: { '.js': ['.ts', '.js'] } }),
			],
			'import-x/extensions': ['.ts', '.js'],
			'import-x/parsers': { '@typescript-eslint/parser': ['.ts'] },
		},
		rules: {
			'import-x/no-cycle': ['error', { ignoreExternal: true }],
			'@typescript-eslint/no-unused-vars': [
				'error',
				{
					argsIgnorePattern: '^_',
					varsIgnorePattern: '^_',
					caughtErrors: 'none',
					destructuredArrayIgnorePattern: '^_',
				},
			],
			// `x === x` is the NaN test in hot loops (faster than Number.isNaN there); kept deliberately
			'no-self-compare': 'off',
			// {' '}, {'\t'}, {'\n'} in markup are deliberate whitespace
			'svelte/no-useless-mustaches': 'off',
		},
	},
	{
		files: ['**/*.svelte', '**/*.svelte.ts'],
		languageOptions: { parserOptions: { parser: tseslint.parser, extraFileExtensions: ['.svelte'] } },
	},
	{
		// tests look for control characters in output on purpose
		files: ['tests/**/*.ts'],
		rules: { 'no-control-regex': 'off' },
	},
	{
		files: ['lib/**/*.ts'],
		languageOptions: { globals: { ...globals.es2021 } },
		rules: {
			'no-restricted-imports': 'off',
			'@typescript-eslint/no-restricted-imports': ['error', { patterns: LIB_PLATFORM_FREE }],
			// A function a reader can hold in view: longer ones are split into named parts, or carry an
			// eslint-disable comment with the reason beside them.
			'max-lines-per-function': ['error', { max: 80, skipBlankLines: true, skipComments: true }],
			'no-restricted-globals': [
				'error',
				'window',
				'document',
				'navigator',
				'localStorage',
				'process',
				'Buffer',
				'require',
				'__dirname',
				'self',
			],
		},
	},
	{
		files: ['src/**/*.ts', 'src/**/*.svelte'],
		rules: {
			'no-restricted-imports': 'off',
			'@typescript-eslint/no-restricted-imports': ['error', { patterns: LIB_INTERNALS }],
		},
	},
);
