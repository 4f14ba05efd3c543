import { defineConfig } from '@playwright/test';

// Debian's Chromium; the flags keep it from reaching for the network this machine does not have.
export const chromiumArgs = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-dev-shm-usage',
];

export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'test-results/e2e',
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [['list']],
  use: {
    baseURL: process.env.NOOKPASS_BASE_URL ?? 'http://127.0.0.1:3100',
    browserName: 'chromium',
    headless: true,
    launchOptions: { executablePath: process.env.NOOKPASS_CHROMIUM ?? '/usr/bin/chromium', args: chromiumArgs },
    screenshot: 'only-on-failure',
    trace: 'off',
  },
});
