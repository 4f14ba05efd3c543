import { defineConfig } from 'vitest/config';
import base from './vitest.config.mts';

// `npm run bench`: the measurements run as one vitest file so ESM-only packages load as in the app.
// Built from the base config by hand: mergeConfig would append to `include` rather than replace it.
export default defineConfig({
  resolve: base.resolve,
  test: { ...base.test, include: ['tests/bench/**/*.run.ts'], testTimeout: 600_000, fileParallelism: false },
});
