import { defineConfig } from '@playwright/test';

// Driven by scripts/test.ts, which starts the app and its services and sets APP_URL.
export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: `test-results/slot-${process.env.VINEWARD_SLOT ?? 0}`,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  reporter: [['list']],
  use: {
    baseURL: process.env.APP_URL ?? 'http://localhost:3100',
    trace: 'retain-on-failure',
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run',
        '--disable-quic',
      ],
    },
  },
  projects: [{ name: 'phone', use: { viewport: { width: 360, height: 740 }, isMobile: true, hasTouch: true } }],
});
