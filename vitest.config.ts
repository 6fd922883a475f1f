import { defineConfig } from 'vitest/config';

// Three projects: pure unit tests, integration tests against the real database and HTTP server,
// and browser tests in Debian's chromium. scripts/test.mjs starts what the last two need.
export default defineConfig({
	test: {
		execArgv: ['--import', 'tsx'],
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					include: ['tests/unit/**/*.test.ts'],
					environment: 'node',
				},
			},
			{
				extends: true,
				test: {
					name: 'integration',
					include: ['tests/integration/**/*.test.ts'],
					environment: 'node',
					fileParallelism: false,
					testTimeout: 30_000,
					hookTimeout: 60_000,
				},
			},
			{
				extends: true,
				test: {
					name: 'e2e',
					include: ['tests/e2e/**/*.test.ts'],
					environment: 'node',
					fileParallelism: false,
					testTimeout: 60_000,
					hookTimeout: 60_000,
				},
			},
		],
	},
});
