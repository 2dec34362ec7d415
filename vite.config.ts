import { sveltekit } from '@sveltejs/kit/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [sveltekit()],
	test: {
		include: ['tests/unit/**/*.test.ts', 'tests/integration/**/*.test.ts', 'src/**/*.test.ts'],
		globalSetup: ['tests/global-setup.ts'],
		// Integration tests share one database; files run one after another.
		fileParallelism: false,
		testTimeout: 30_000,
		hookTimeout: 60_000
	}
});
