import { defineConfig } from '@playwright/test';
import { MAIN_PORT as port, RELAY_PORT, RELAYED_PORT } from './tests/e2e/servers';

const server = (listen: number, env: Record<string, string> = {}) => ({
  command: 'node scripts/e2e-server.mjs',
  url: `http://localhost:${listen}/api/v1/health`,
  env: { PORT: String(listen), ...env },
  reuseExistingServer: false,
  timeout: 60_000,
  stdout: 'ignore' as const,
  stderr: 'pipe' as const,
});

/** End-to-end tests against the built product, in Debian's Chromium (Playwright cannot download one here). */
export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'test-results',
  fullyParallel: false,
  workers: 1,
  retries: 0,
  reporter: process.env.CI ? [['list']] : [['list']],
  timeout: 30_000,
  use: {
    baseURL: `http://localhost:${port}`,
    screenshot: 'only-on-failure',
    trace: 'retain-on-failure',
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run',
      ],
    },
  },
  webServer: [
    server(port),
    server(RELAYED_PORT, { SMTP_HOST: '127.0.0.1', SMTP_PORT: String(RELAY_PORT) }),
  ],
});
