import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	test: {
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					include: ['src/**/*.test.ts', 'workers/**/*.test.ts', 'scripts/**/*.test.ts'],
					environment: 'node',
					testTimeout: 60_000
				}
			},
			{
				extends: true,
				test: {
					name: 'integration',
					include: ['tests/integration/**/*.test.ts'],
					environment: 'node',
					globalSetup: ['tests/integration/global-setup.ts'],
					// One MariaDB, one Redis, one server: files share them, so run files one at a time.
					fileParallelism: false,
					testTimeout: 60_000,
					hookTimeout: 120_000
				}
			}
		]
	}
});
