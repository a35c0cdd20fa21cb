import { defineConfig } from '@playwright/test';

const baseURL = process.env.E2E_BASE_URL ?? 'http://127.0.0.1:4320';

/**
 * End-to-end tests in Debian's Chromium (never a downloaded browser) against the production
 * build (`node build`). The test script builds the app and prepares a fresh, seeded e2e database first.
 */
export default defineConfig({
	testDir: 'tests/e2e',
	outputDir: 'tests/artifacts/playwright',
	fullyParallel: false,
	workers: 2,
	retries: 0,
	// Generous for a shared, busy CI machine: a bcrypt sign-in plus a hydration per test.
	timeout: 60_000,
	expect: { timeout: 10_000 },
	forbidOnly: Boolean(process.env.CI),
	reporter: [['list'], ['json', { outputFile: 'tests/artifacts/e2e-results.json' }]],
	use: {
		baseURL,
		headless: true,
		trace: 'retain-on-failure',
		launchOptions: {
			executablePath: '/usr/bin/chromium',
			args: [
				'--no-sandbox',
				'--disable-gpu',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync',
				'--no-first-run',
				'--disable-quic'
			]
		}
	},
	webServer: {
		command: 'node build',
		url: `${baseURL}/signin`,
		reuseExistingServer: !process.env.CI,
		timeout: 60_000,
		env: {
			PORT: '4320',
			HOST: '127.0.0.1',
			ORIGIN: baseURL,
			AUTH_SECRET: process.env.AUTH_SECRET ?? 'e2e-only-secret-not-for-any-real-deployment-0123456789',
			DATABASE_NAME: process.env.E2E_DATABASE_NAME ?? 'stillpoint_e2e',
			NODE_ENV: 'production'
		}
	}
});
