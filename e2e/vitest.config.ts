// Browser tests: the real server in-process (fresh SQLite file per test file) serving the built client,
// driven by Debian's Chromium through playwright-core. `npm run test:e2e` builds the client first.
import { defineConfig } from 'vitest/config';

export default defineConfig({
  root: '.',
  test: {
    include: ['e2e/**/*.e2e.ts'],
    environment: 'node',
    pool: 'forks',
    maxWorkers: 1,
    fileParallelism: false,
    testTimeout: 120_000,
    hookTimeout: 120_000,
    env: { TZ: 'UTC', LOG_LEVEL: 'silent' },
  },
});
