import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
  plugins: [tailwindcss(), sveltekit()],
  server: { host: '127.0.0.1', port: 5173, strictPort: false },
  test: {
    expect: { requireAssertions: true },
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          sequence: { groupOrder: 0 },
          environment: 'node',
          include: ['tests/unit/**/*.test.ts']
        }
      },
      {
        extends: true,
        test: {
          name: 'component',
          sequence: { groupOrder: 0 },
          environment: 'jsdom',
          include: ['tests/component/**/*.test.ts']
        },
        resolve: process.env.VITEST ? { conditions: ['browser'] } : undefined
      },
      {
        extends: true,
        test: {
          name: 'integration',
          sequence: { groupOrder: 0 },
          environment: 'node',
          env: { LOFTWISE_ENV: 'test' },
          include: ['tests/integration/**/*.test.ts'],
          // One real MariaDB and Redis shared by every file: run files one after another.
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
          globalSetup: ['tests/integration/global-setup.ts']
        }
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          // After the other projects: the integration suite's workers load both cores, and
          // browser timings should not compete with them.
          sequence: { groupOrder: 1 },
          environment: 'node',
          env: { LOFTWISE_ENV: 'test', DB_NAME: 'loftwise_e2e', QUEUE_PREFIX: 'lw-e2e', SMTP_PORT: '2527' },
          include: ['tests/e2e/**/*.test.ts'],
          fileParallelism: false,
          testTimeout: 120_000,
          hookTimeout: 180_000,
          globalSetup: ['tests/e2e/global-setup.ts']
        }
      }
    ]
  }
});
