import { defineConfig } from 'vitest/config';

// Three layers, one Vitest project each. `npm run test:unit` runs the unit layer alone: pure code,
// no PostgreSQL, object store or mail server. `npm test` (scripts/test.mjs) starts those services,
// passes their addresses in the environment and runs every project.
export default defineConfig({
  test: {
    environment: 'node',
    // Browser tests drive a real Chromium on a 2-core machine shared with the API tests.
    testTimeout: 60_000,
    hookTimeout: 60_000,
    fileParallelism: true,
    maxWorkers: 2,
    projects: [
      { extends: true, test: { name: 'unit', include: ['tests/unit/**/*.test.ts'] } },
      // The app over HTTP on a database of its own per file, with the object-store and SMTP fakes.
      { extends: true, test: { name: 'api', include: ['tests/api/**/*.test.ts'] } },
      // The built client in Debian's Chromium, against the real app.
      { extends: true, test: { name: 'browser', include: ['tests/e2e/**/*.test.ts'] } },
    ],
  },
});
