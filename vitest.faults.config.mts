import { defineConfig } from 'vitest/config';
import base from './vitest.config.mts';

// Fault tests stop PostgreSQL and the fake services the app uses, so they run alone, one file at a time,
// after the integration tests and before the end-to-end tests (scripts/test.sh).
export default defineConfig({
  resolve: base.resolve,
  test: { ...base.test, include: ['tests/faults/**/*.test.ts'], testTimeout: 180_000, fileParallelism: false },
});
