import { cpus, loadavg } from 'node:os'
import { defineConfig, devices } from '@playwright/test'

// Several test runs on one small machine make every step slower: the time limits stretch with the
// load (up to 4×), so a busy machine is not mistaken for a broken page.
const busy = Math.min(4, Math.max(1, loadavg()[0]! / cpus().length))

// Debian's chromium, never a downloaded browser; the server is started by scripts/test.sh.
export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'test-results',
  timeout: Math.round(60_000 * busy),
  expect: { timeout: Math.round(10_000 * busy) },
  fullyParallel: false,
  workers: 1,
  retries: process.env.CI ? 1 : 0,
  reporter: [['list']],
  use: {
    baseURL: process.env.WAYSIDE_TEST_URL ?? 'http://127.0.0.1:3100',
    trace: 'retain-on-failure',
    launchOptions: {
      executablePath: process.env.WAYSIDE_CHROMIUM ?? '/usr/bin/chromium',
      args: [
        '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
        '--disable-background-networking', '--disable-component-update', '--disable-sync',
      ],
    },
  },
  projects: [
    { name: 'desktop', use: { ...devices['Desktop Chrome'], viewport: { width: 1280, height: 800 }, channel: undefined } },
  ],
})
