import { sveltekit } from '@sveltejs/kit/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [sveltekit()],
	server: { host: '127.0.0.1', port: 5173 },
	test: {
		// Three kinds of test, runnable one at a time: `npm run test:unit` etc.
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					include: ['tests/unit/**/*.test.ts'],
					setupFiles: ['tests/unit/setup.ts'],
					environment: 'node'
				}
			},
			{
				extends: true,
				test: {
					name: 'integration',
					include: ['tests/integration/**/*.test.ts'],
					setupFiles: ['tests/integration/setup.ts'],
					environment: 'node',
					// Integration tests share one throwaway database: run files one after another.
					fileParallelism: false,
					testTimeout: 60_000,
					hookTimeout: 120_000
				}
			},
			{
				// `npm run bench:pages`: not part of `npm test`.
				extends: true,
				test: {
					name: 'bench-pages',
					include: ['tests/bench/pages.bench.ts'],
					environment: 'node',
					testTimeout: 600_000
				}
			},
			{
				extends: true,
				test: {
					name: 'browser',
					include: ['tests/browser/**/*.test.ts'],
					setupFiles: ['tests/integration/setup.ts'],
					environment: 'node',
					fileParallelism: false,
					testTimeout: 90_000,
					hookTimeout: 120_000
				}
			}
		]
	}
});
