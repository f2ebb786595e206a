import { defineConfig } from '@playwright/test';

// Debian's Chromium: the test tool's own browser download does not work on these machines.
const CHROMIUM = process.env.INKROUTE_CHROMIUM ?? '/usr/bin/chromium';
// Speed figures live in e2e/bench and run with npm run bench:e2e, not with npm test.
const BENCH = process.env.INKROUTE_E2E_BENCH === '1';
// INKROUTE_E2E_PORT and INKROUTE_OUT_DIR let two runs share a machine (defaults 4173, dist).
const PORT = Number(process.env.INKROUTE_E2E_PORT ?? 4173);
const OUT_DIR = process.env.INKROUTE_OUT_DIR ?? 'dist';
const RUN = PORT === 4173 ? '' : `-${PORT}`;

export default defineConfig({
  testDir: 'e2e',
  testIgnore: BENCH ? [] : ['**/bench/**'],
  testMatch: BENCH ? ['bench/**/*.spec.ts'] : ['**/*.spec.ts'],
  // A folder of its own: Playwright empties its output folder, and the unit report sits beside it.
  outputDir: `test-results/e2e${RUN}`,
  fullyParallel: true,
  forbidOnly: Boolean(process.env.CI),
  retries: 0,
  workers: process.env.CI ? 1 : undefined,
  timeout: 30_000,
  reporter: [['list'], ['json', { outputFile: `test-results/e2e${RUN}.json` }]],
  use: {
    baseURL: `http://127.0.0.1:${PORT}`,
    viewport: { width: 1280, height: 800 },
    trace: 'retain-on-failure',
  },
  projects: [
    {
      name: 'chromium',
      use: {
        browserName: 'chromium',
        launchOptions: {
          executablePath: CHROMIUM,
          // Without the networking flags Chromium keeps reaching out to the network.
          args: [
            '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
            '--disable-background-networking', '--disable-component-update', '--disable-sync',
          ],
        },
      },
    },
  ],
  webServer: {
    command: `npx vite preview --host 127.0.0.1 --port ${PORT} --strictPort --outDir ${OUT_DIR}`,
    url: `http://127.0.0.1:${PORT}`,
    reuseExistingServer: !process.env.CI,
    timeout: 60_000,
  },
});
