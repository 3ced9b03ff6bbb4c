import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

/**
 * Builds the client (apps/web) and defines the Vitest projects of the workspace. The dev server
 * proxies /api to the Express server on port 8080.
 */
export default defineConfig({
  root: 'apps/web',
  plugins: [react(), tailwindcss()],
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    sourcemap: true,
    // The budget that matters is the gzip size of the initial JavaScript, which `pnpm bench`
    // checks against its 200 KB ceiling; Vite's raw-size warning is set just above today's bundle.
    chunkSizeWarningLimit: 700,
  },
  server: {
    port: 5173,
    proxy: { '/api': { target: `http://localhost:${process.env.PORT ?? 8080}` } },
  },
  test: {
    root: '.',
    projects: [
      {
        extends: true,
        test: {
          name: 'packages',
          root: '.',
          include: ['packages/*/src/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        extends: true,
        test: {
          // The client's pure logic (state reducers, parsers); the screens are tested in Playwright.
          name: 'web',
          root: '.',
          include: ['apps/web/src/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        extends: true,
        test: {
          name: 'server',
          root: '.',
          include: ['apps/server/src/**/*.test.ts'],
          environment: 'node',
          setupFiles: ['apps/server/test/setup.ts'],
          globalSetup: ['apps/server/test/global-setup.ts'],
          testTimeout: 20_000,
          hookTimeout: 20_000,
        },
      },
      {
        extends: true,
        test: {
          // After the server project: every JSON route's success answer was validated by a test.
          name: 'contract',
          root: '.',
          include: ['apps/server/test/**/*.test.ts'],
          environment: 'node',
          sequence: { groupOrder: 1 },
        },
      },
      {
        extends: true,
        test: {
          // The architecture's boundaries, as the linter enforces them (tests/lint/fixtures).
          name: 'lint',
          root: '.',
          include: ['tests/lint/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          // Timings compared with each other, run last and alone so that the suite does not skew them.
          name: 'timing',
          root: '.',
          include: ['tests/timing/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
          sequence: { groupOrder: 2 },
        },
      },
      {
        extends: true,
        test: {
          name: 'fault',
          root: '.',
          include: ['tests/fault/**/*.test.ts'],
          environment: 'node',
          testTimeout: 240_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'reference',
          root: '.',
          include: ['tests/reference/**/*.test.ts'],
          environment: 'node',
          // date-fns works in local time; the product's dates are UTC.
          env: { TZ: 'UTC' },
        },
      },
    ],
  },
});
