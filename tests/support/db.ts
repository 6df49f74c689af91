// A look into the test server's database, to check what a route stored (and, for
// a few tests, to set a row up). SQLite: the server's file through better-sqlite3
// (WAL mode lets this reader run beside the server). PostgreSQL tier: the same
// calls through `psql`, synchronous like better-sqlite3, rows as JSON so numbers
// stay numbers. Tests write `?` placeholders and portable SQL; `insert … returning id`
// instead of lastInsertRowid.
import { execFileSync } from 'node:child_process'
import Database from 'better-sqlite3'
import { inject } from 'vitest'
import { databaseUrlFor } from './server'

export interface TestDb {
  all: <T = Record<string, any>>(sql: string, ...params: unknown[]) => T[]
  get: <T = Record<string, any>>(sql: string, ...params: unknown[]) => T | undefined
  count: (sql: string, ...params: unknown[]) => number
  /** A statement that returns no rows (update, delete, insert without returning). */
  run: (sql: string, ...params: unknown[]) => void
  close: () => void
}

/** The PostgreSQL database behind a test server's NUXT_DB_PATH, if it runs on one. */
function pgUrlOf(path: string): string | null {
  const started = databaseUrlFor(path)
  if (started) return started
  try {
    return inject('dbPath') === path ? (inject('databaseUrl') || null) : null
  }
  catch {
    return null // outside a vitest project that provides them
  }
}

export function readDb(path: string, options: { write?: boolean } = {}): TestDb {
  const url = pgUrlOf(path)
  if (url) return pgDb(url)
  const db = new Database(path, { readonly: !options.write, fileMustExist: true })
  return {
    all: <T>(sql: string, ...params: unknown[]) => db.prepare(sql).all(...params) as T[],
    get: <T>(sql: string, ...params: unknown[]) => db.prepare(sql).get(...params) as T | undefined,
    count: (sql, ...params) => Number((db.prepare(sql).get(...params) as { n: number }).n),
    run: (sql, ...params) => {
      db.prepare(sql).run(...params)
    },
    close: () => db.close(),
  }
}

/** A value as a PostgreSQL literal (test code only: values come from the tests themselves). */
function literal(value: unknown): string {
  if (value === null || value === undefined) return 'null'
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new Error(`not a finite number: ${value}`)
    return String(value)
  }
  if (typeof value === 'boolean') return value ? '1' : '0'
  return `'${String(value).replace(/'/g, '\'\'')}'`
}

/** Replaces each `?` outside quoted text with the next parameter as a literal. */
function inline(sql: string, params: unknown[]): string {
  let out = ''
  let i = 0
  let quote: string | null = null
  for (const ch of sql) {
    if (quote) {
      if (ch === quote) quote = null
      out += ch
    }
    else if (ch === '\'' || ch === '"') {
      quote = ch
      out += ch
    }
    else if (ch === '?') {
      if (i >= params.length) throw new Error(`too few parameters for: ${sql}`)
      out += literal(params[i++])
    }
    else out += ch
  }
  if (i !== params.length) throw new Error(`too many parameters for: ${sql}`)
  return out
}

function psql(url: string, statement: string): string {
  return execFileSync('psql', ['-X', '-q', '-A', '-t', '-v', 'ON_ERROR_STOP=1', '-d', url, '-c', statement], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] })
}

function pgDb(url: string): TestDb {
  const rows = <T>(sql: string, params: unknown[]): T[] => {
    const text = psql(url, `with q as (${inline(sql, params)}) select coalesce(json_agg(q), '[]'::json) from q`).trim()
    return JSON.parse(text) as T[]
  }
  return {
    all: <T>(sql: string, ...params: unknown[]) => rows<T>(sql, params),
    get: <T>(sql: string, ...params: unknown[]) => rows<T>(sql, params)[0],
    count: (sql, ...params) => Number((rows<{ n: number }>(sql, params)[0])!.n),
    run: (sql, ...params) => {
      psql(url, inline(sql, params))
    },
    close: () => {},
  }
}
