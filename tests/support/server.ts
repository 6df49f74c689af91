// Starts the BUILT server (.output) on a free port with a fresh SQLite file in
// a temporary folder, the demo school seeded and the mail catcher on. Used by
// the API tests, the end-to-end tests and the benchmarks. With
// CYCLODIAL_TEST_PG_URL set (npm run test:api:pg), a fresh PostgreSQL database
// on that cluster instead (tests/support/pg.ts); pass `databaseUrl` to share one.
import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync, mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { createTestDatabase, testPgUrl, type TestDatabase } from './pg'

export interface RunningServer {
  baseURL: string
  dbPath: string
  /** The PostgreSQL database this server uses (PostgreSQL tier), else null. */
  databaseUrl: string | null
  dir: string
  process: ChildProcess
  output: () => string
  stop: () => Promise<void>
}

/** NUXT_DB_PATH → the PostgreSQL database of a server started in this process (PostgreSQL tier). */
const databaseUrls = new Map<string, string>()
export const databaseUrlFor = (dbPath: string): string | undefined => databaseUrls.get(dbPath)

export const TEST_SESSION_PASSWORD = 'test-only-session-password-0123456789abcdef'

export function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const srv = createServer()
    srv.unref()
    srv.on('error', rej)
    srv.listen(0, '127.0.0.1', () => {
      const address = srv.address()
      const port = typeof address === 'object' && address ? address.port : 0
      srv.close(() => res(port))
    })
  })
}

export interface StartOptions {
  env?: Record<string, string>
  dbPath?: string
  /** Use this PostgreSQL database (kept when the server stops), e.g. for a second instance. */
  databaseUrl?: string
  seed?: boolean
  port?: number
}

export async function startServer(options: StartOptions = {}): Promise<RunningServer> {
  const entry = resolve('.output/server/index.mjs')
  if (!existsSync(entry)) throw new Error('No built server: run `npm run build` first.')
  const dir = mkdtempSync(join(tmpdir(), 'cyclodial-test-'))
  const dbPath = options.dbPath ?? join(dir, 'cyclodial.sqlite')
  const port = options.port ?? await freePort()
  const mailPort = await freePort()
  const pgAdmin = testPgUrl()
  let created: TestDatabase | null = null
  if (!options.databaseUrl && !options.dbPath && pgAdmin) created = await createTestDatabase(pgAdmin)
  const databaseUrl = options.databaseUrl ?? created?.url ?? null
  if (databaseUrl) databaseUrls.set(dbPath, databaseUrl)
  let log = ''
  const env: Record<string, string | undefined> = {
    ...process.env,
    NODE_ENV: 'production',
    HOST: '127.0.0.1',
    PORT: String(port),
    NUXT_DB_PATH: dbPath,
    NUXT_DATABASE_URL: databaseUrl ?? '',
    NUXT_SEED_DEMO: options.seed === false ? '0' : '1',
    // the built server runs as production, which seeds the demo only when asked twice
    NUXT_SEED_DEMO_IN_PRODUCTION: options.seed === false ? '0' : '1',
    NUXT_MAIL_CATCHER: '1',
    NUXT_MAIL_CATCHER_PORT: String(mailPort),
    NUXT_SESSION_PASSWORD: TEST_SESSION_PASSWORD,
    // production refuses to start without it; e-mailed links point here
    NUXT_PUBLIC_SITE_URL: `http://127.0.0.1:${port}`,
    ...options.env,
  }
  const child = spawn(process.execPath, [entry], {
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  child.stdout!.on('data', (d) => {
    log += String(d)
  })
  child.stderr!.on('data', (d) => {
    log += String(d)
  })

  const baseURL = `http://127.0.0.1:${port}`
  const deadline = Date.now() + 30_000
  for (;;) {
    if (child.exitCode !== null) {
      await created?.drop().catch(() => {})
      throw new Error(`server exited (${child.exitCode}):\n${log}`)
    }
    try {
      // Ready once the database is migrated (and seeded), and the mail catcher listens.
      const res = await fetch(`${baseURL}/api/health`)
      const catcherReady = env.NUXT_MAIL_CATCHER !== '1' || /catcher listening/.test(log)
      if (res.ok && catcherReady) break
    }
    catch { /* not listening yet */ }
    if (Date.now() > deadline) {
      child.kill('SIGKILL')
      await created?.drop().catch(() => {})
      throw new Error(`server did not start within 30 s:\n${log}`)
    }
    await new Promise(r => setTimeout(r, 150))
  }

  return {
    baseURL,
    dbPath,
    databaseUrl,
    dir,
    process: child,
    output: () => log,
    stop: async () => {
      if (child.exitCode === null) {
        const exited = new Promise(r => child.once('exit', r))
        child.kill('SIGTERM')
        await Promise.race([exited, new Promise(r => setTimeout(r, 5000))])
        if (child.exitCode === null) child.kill('SIGKILL')
      }
      if (!options.dbPath) rmSync(dir, { recursive: true, force: true })
      await created?.drop().catch(() => {})
    },
  }
}

/**
 * Starts the BUILT server in production with a fresh database and `env`, and waits for
 * it to exit (it is killed after 15 s): for the start-up refusals. Returns the exit code
 * and everything it printed.
 */
export async function startUpExit(env: Record<string, string>): Promise<{ code: number | null, out: string }> {
  const dir = mkdtempSync(join(tmpdir(), 'cyclodial-startup-'))
  const child = spawn(process.execPath, [resolve('.output/server/index.mjs')], {
    env: { ...process.env, NODE_ENV: 'production', HOST: '127.0.0.1', PORT: String(await freePort()), NUXT_DB_PATH: join(dir, 'x.sqlite'), ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  let out = ''
  child.stdout.on('data', (d) => {
    out += String(d)
  })
  child.stderr.on('data', (d) => {
    out += String(d)
  })
  const timer = setTimeout(() => child.kill('SIGKILL'), 15_000)
  const code = await new Promise<number | null>(r => child.once('exit', r))
  clearTimeout(timer)
  rmSync(dir, { recursive: true, force: true })
  return { code, out }
}
