import { defineConfig } from '@playwright/test';

const port = Number(process.env.PORT ?? 3100);

export default defineConfig({
	testDir: 'tests/e2e',
	timeout: 60_000,
	expect: { timeout: 10_000 },
	workers: 1,
	fullyParallel: false,
	retries: 0,
	outputDir: 'test-results/playwright',
	use: {
		baseURL: `http://127.0.0.1:${port}`,
		trace: 'retain-on-failure',
		screenshot: 'only-on-failure',
		launchOptions: {
			executablePath: '/usr/bin/chromium',
			args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic']
		}
	},
	webServer: {
		command: 'node --import tsx scripts/serve.ts',
		url: `http://127.0.0.1:${port}/health`,
		reuseExistingServer: false,
		timeout: 60_000,
		env: { SERVE_QUIET: '1', SMTP_URL: '', TILE_URL: '' }
	}
});
