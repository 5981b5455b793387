import { defineConfig } from '@playwright/test';

const port = Number(process.env.E2E_PORT ?? 3199);
const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'test-results',
  forbidOnly: !!process.env.CI,
  retries: process.env.CI ? 1 : 0,
  workers: 1,
  timeout: 90_000,
  // Generous: CI runs on a busy 2-core machine, and a slow answer is not a failure here.
  expect: { timeout: 15_000 },
  reporter: process.env.CI ? [['list']] : [['list'], ['html', { open: 'never' }]],
  use: {
    baseURL: `http://localhost:${port}`,
    screenshot: 'only-on-failure',
    trace: 'retain-on-failure',
    viewport: { width: 1366, height: 860 },
    launchOptions: { executablePath: chromium },
  },
  webServer: {
    // A fresh demo database for every run, on a port of its own.
    command: "node -e \"require('fs').rmSync('.tmp/e2e',{recursive:true,force:true})\" && tsx server/index.ts",
    url: `http://localhost:${port}/api/health`,
    timeout: 180_000,
    reuseExistingServer: false,
    stdout: 'pipe',
    env: {
      PORT: String(port),
      DATABASE_PATH: '.tmp/e2e/cardloop.sqlite',
      APP_URL: `http://localhost:${port}`,
      SEED_DEMO: '1',
      JWT_SECRET: 'e2e-secret-e2e-secret-e2e-secret-e2e-secret',
    },
  },
});
