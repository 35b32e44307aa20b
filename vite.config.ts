import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	// Fewer, larger script files: on a slow rural link each file costs a round trip, and a page loaded
	// some thirty small ones. Rollup merges only where no module's side effects would run earlier.
	build: { rollupOptions: { output: { experimentalMinChunkSize: 20_000 } } },
	server: { host: '127.0.0.1', port: 5173 },
	test: {
		// A test that asserts nothing is a defect: make it fail.
		expect: { requireAssertions: true },
		projects: [
			{
				extends: './vite.config.ts',
				test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node' }
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'integration',
					include: ['tests/integration/**/*.test.ts'],
					environment: 'node',
					// One real database: test files take turns so they never trample each other's rows.
					fileParallelism: false,
					testTimeout: 30_000,
					hookTimeout: 60_000
				}
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'browser',
					include: ['tests/browser/**/*.test.ts'],
					environment: 'node',
					fileParallelism: false,
					testTimeout: 60_000,
					hookTimeout: 120_000
				}
			}
		]
	}
});
