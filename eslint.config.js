import tseslint from 'typescript-eslint';

export default tseslint.config(
	{
		ignores: [
			'dist/',
			'.astro/',
			'.data/',
			'node_modules/',
			'uploads/',
			'test-results/',
			'**/*.astro',
			'**/*-tmp.*',
			'**/*-tmp/',
		],
	},
	...tseslint.configs.recommended,
	{
		rules: {
			'@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
			'@typescript-eslint/consistent-type-imports': 'error',
			'@typescript-eslint/no-explicit-any': 'error',
		},
	},
);
