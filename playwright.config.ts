// End-to-end tests: the built app in browser mode, driven in Debian's Chromium (never a downloaded
// browser), offline: every non-loopback request is aborted and reported by the fixture.
import { defineConfig } from '@playwright/test';
import { cpus } from 'node:os';

export const CHROMIUM_PATH = '/usr/bin/chromium';

export default defineConfig({
  testDir: 'test/e2e',
  testMatch: '*.spec.ts',
  outputDir: 'test-results/e2e-output',
  timeout: 60_000,
  expect: { timeout: 10_000 },
  fullyParallel: true,
  workers: Math.max(2, Math.min(4, cpus().length)),
  retries: 0,
  forbidOnly: !!process.env.CI,
  reporter: [['list']],
  use: {
    viewport: { width: 1400, height: 860 },
    screenshot: 'only-on-failure',
    trace: 'off',
    launchOptions: {
      executablePath: CHROMIUM_PATH,
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
    },
  },
});
