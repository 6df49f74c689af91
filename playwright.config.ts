// End-to-end tests: Debian's Chromium (no browser download) against the BUILT
// server, started on its own port with a fresh SQLite file and the demo school.
import { mkdtempSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { defineConfig } from '@playwright/test'

const port = Number(process.env.E2E_PORT ?? 3217)
const baseURL = `http://127.0.0.1:${port}`
// Only the main process starts the server; workers re-read this file, so the
// folder is created lazily and only when a server will be launched.
const dbPath = process.env.E2E_DB_PATH ?? join(mkdtempSync(join(tmpdir(), 'cyclodial-e2e-')), 'cyclodial.sqlite')
process.env.E2E_DB_PATH = dbPath

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
    baseURL,
    viewport: { width: 1280, height: 720 },
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    },
  },
  webServer: {
    command: 'node .output/server/index.mjs',
    url: `${baseURL}/login`,
    reuseExistingServer: false,
    timeout: 60_000,
    stdout: 'ignore',
    stderr: 'pipe',
    env: {
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      NUXT_DB_PATH: dbPath,
      NUXT_SEED_DEMO: '1',
      NUXT_SEED_DEMO_IN_PRODUCTION: '1',
      NUXT_MAIL_CATCHER: '1',
      NUXT_MAIL_CATCHER_PORT: '0',
      NUXT_SESSION_PASSWORD: 'e2e-only-session-password-0123456789abcdef',
      NUXT_PUBLIC_SITE_URL: baseURL,
    },
  },
})
