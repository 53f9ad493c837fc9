import { defineConfig } from 'vitest/config';

// Services (PostgreSQL, object store, SMTP fake) are started by scripts/test.mjs, which passes
// their addresses in the environment; unit tests need none of them.
export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    environment: 'node',
    // Browser tests drive a real Chromium on a 2-core machine shared with the API tests.
    testTimeout: 60_000,
    hookTimeout: 60_000,
    fileParallelism: true,
    maxWorkers: 2,
  },
});
