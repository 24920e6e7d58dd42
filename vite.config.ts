import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { configDefaults, defineConfig } from 'vitest/config';

// Unit, integration and e2e files run two at a time (one per core of the 2-core machine the suite is
// sized for), integration and e2e against the one server and database: every file builds the data it
// changes and counts only its own rows. Then, alone (sequence.groupOrder), the check that they left the
// seeded demo as it was. No project keeps state in modules, so a worker's files share one module graph
// (isolate: false) instead of loading the engine, zod and the db client again for each.
export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	test: {
		// A poll waits on the app's answers, which a busy machine slows well past vitest's 1 s default.
		expect: { requireAssertions: true, poll: { timeout: 15_000 } },
		allowOnly: false,
		maxWorkers: 2,
		projects: [
			{
				extends: './vite.config.ts',
				test: {
					name: 'unit',
					environment: 'node',
					// The chart tests render layerchart's components: bundled once before the files run
					// (5 CPU-s less than compiling its hundred .svelte files module by module), with
					// svelte's entries in the same bundle so that charts and pages share one svelte.
					deps: {
						optimizer: {
							ssr: {
								enabled: true,
								include: [
									'layerchart',
									'svelte',
									'svelte/server',
									'svelte/internal/server',
									'svelte/store',
									'svelte/reactivity'
								]
							}
						}
					},
					include: ['tests/unit/**/*.test.ts'],
					isolate: false,
					sequence: { groupOrder: 0 },
					// The solver and command-line tests wait on other processes (glpsol, tsx), which a busy
					// machine slows well past vitest's default 5 s.
					testTimeout: 30_000
				}
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'integration',
					environment: 'node',
					include: ['tests/integration/**/*.test.ts'],
					exclude: [...configDefaults.exclude, 'tests/integration/after-all/**'],
					globalSetup: ['tests/support/global-setup.ts'],
					isolate: false,
					sequence: { groupOrder: 0 },
					testTimeout: 30_000,
					hookTimeout: 60_000
				}
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'e2e',
					environment: 'node',
					include: ['tests/e2e/**/*.test.ts'],
					globalSetup: ['tests/support/global-setup.ts'],
					isolate: false,
					sequence: { groupOrder: 0 },
					testTimeout: 60_000,
					hookTimeout: 60_000
				}
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'demo-unchanged',
					environment: 'node',
					include: ['tests/integration/after-all/**/*.test.ts'],
					globalSetup: ['tests/support/demo-snapshot-setup.ts'],
					sequence: { groupOrder: 1 }
				}
			}
		]
	}
});
