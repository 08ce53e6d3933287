import { defineConfig } from '@playwright/test';

const port = Number(process.env.E2E_PORT ?? 4173);
const origin = `http://127.0.0.1:${port}`;

export default defineConfig({
	testDir: 'tests/e2e',
	fullyParallel: true,
	workers: 2,
	retries: 0,
	timeout: 30_000,
	expect: { timeout: 7_000 },
	reporter: [['list']],
	use: {
		baseURL: origin,
		trace: 'retain-on-failure',
		launchOptions: {
			executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
			args: [
				'--no-sandbox',
				'--disable-gpu',
				'--disable-dev-shm-usage',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync',
				'--no-first-run'
			]
		}
	},
	// A recall holds demo lots and stocks the other specs use, so it runs once they are done. The
	// security sweep sends only requests that must be refused, and reads, so it runs alongside.
	projects: [
		{ name: 'main', testIgnore: /recall\.spec\.ts$/ },
		{ name: 'recall', testMatch: /recall\.spec\.ts$/, dependencies: ['main'] },
		{ name: 'security', testDir: 'tests/security', testMatch: /\.spec\.ts$/ }
	],
	webServer: {
		command: 'node src/cli/start.js',
		url: `${origin}/api/v1/health`,
		reuseExistingServer: false,
		timeout: 60_000,
		stdout: 'pipe',
		env: {
			HOST: '127.0.0.1',
			PORT: String(port),
			ORIGIN: origin,
			DATABASE_PATH: 'tests/.tmp/e2e.db',
			UPLOADS_PATH: 'tests/.tmp/e2e-uploads',
			RESET_DATABASE: '1',
			SMTP_PORT: String(port + 1),
			NODE_ENV: 'test'
		}
	}
});
