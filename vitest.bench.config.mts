import { defineConfig, mergeConfig } from 'vitest/config';
import base from './vitest.config.mts';

// `npm run bench`: the measurements run as one vitest file so ESM-only packages load as in the app.
export default mergeConfig(base, defineConfig({ test: { include: ['tests/bench/**/*.run.ts'], testTimeout: 600_000, fileParallelism: false } }));
