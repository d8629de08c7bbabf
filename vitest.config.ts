import { defineConfig } from 'vitest/config';

/**
 * One vitest run covers unit, integration and end-to-end tests. Integration and e2e files read the
 * services that scripts/test.mjs started from the environment (DATABASE_URL, APP_URL, …); unit tests
 * need nothing and can be run alone: `node_modules/.bin/vitest run tests/unit`.
 */
export default defineConfig({
  resolve: { alias: { '~': new URL('./src', import.meta.url).pathname } },
  test: {
    include: ['tests/**/*.test.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: 'forks',
  },
});
