import { defineConfig } from '@playwright/test';

const baseURL = process.env.E2E_BASE_URL ?? 'http://127.0.0.1:4320';

/** Settings shared by every process of the e2e app, kept apart from the demo's. */
export const E2E_ENV = {
	NODE_ENV: 'production',
	AUTH_SECRET: process.env.AUTH_SECRET ?? 'e2e-only-secret-not-for-any-real-deployment-0123456789',
	DATABASE_NAME: process.env.E2E_DATABASE_NAME ?? 'stillpoint_e2e',
	// Overridable so two e2e runs on one machine (separate databases) never share a queue or files.
	QUEUE_PREFIX: process.env.E2E_QUEUE_PREFIX ?? 'stillpoint_e2e',
	STORAGE_DIR: process.env.E2E_STORAGE_DIR ?? '.data/e2e-storage',
	DEV_MAILBOX_DIR: '.data/e2e-mailbox',
	SMTP_PORT: '2527',
	ORIGIN: baseURL
};

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
	// The app as it runs for real: the web server, a worker on the queue and the fake SMTP server,
	// all on the e2e database, queue prefix, storage and mailbox.
	webServer: [
		{
			name: 'web',
			command: 'node build',
			url: `${baseURL}/signin`,
			reuseExistingServer: !process.env.CI,
			timeout: 60_000,
			env: { ...E2E_ENV, PORT: '4320', HOST: '127.0.0.1', ORIGIN: baseURL, BODY_SIZE_LIMIT: '210M' }
		},
		{
			name: 'worker',
			command: 'npx tsx workers/index.ts',
			wait: { stdout: /ready on queue/ },
			stdout: 'pipe',
			reuseExistingServer: !process.env.CI,
			timeout: 60_000,
			env: E2E_ENV
		},
		{
			name: 'smtp',
			command: 'npx tsx scripts/fake-smtp.ts',
			port: Number(E2E_ENV.SMTP_PORT),
			reuseExistingServer: !process.env.CI,
			timeout: 60_000,
			env: E2E_ENV
		}
	]
});
