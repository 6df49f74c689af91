// Opens Cyclodial's database through Kysely and migrates it. Used by the server
// (server/utils/db.ts), scripts and tests. SQLite (one file, the pragmas below) is
// the default; NUXT_DATABASE_URL=postgres://… opens PostgreSQL through a `pg` pool
// instead. What differs between the two in SQL lives in db/dialect.ts.
import { mkdirSync } from 'node:fs'
import { dirname } from 'node:path'
import SQLite from 'better-sqlite3'
import pg from 'pg'
import { Kysely, Migrator, PostgresDialect, SqliteDialect, sql } from 'kysely'
import type { Database } from './schema'
import { staticMigrationProvider } from './migrations'
import { dialectOf, isPostgresUrl } from './dialect'

/**
 * The better-sqlite3 handle under each Kysely instance, for the few hot paths that
 * run one fixed query on every request (the session check) as a prepared statement.
 */
export const sqliteHandles = new WeakMap<Kysely<Database>, SQLite.Database>()

export function openDatabase(path: string): Kysely<Database> {
  if (path !== ':memory:') mkdirSync(dirname(path), { recursive: true })
  const sqlite = new SQLite(path)
  sqlite.pragma('journal_mode = WAL')
  sqlite.pragma('foreign_keys = ON')
  sqlite.pragma('busy_timeout = 5000')
  sqlite.pragma('synchronous = NORMAL')
  // Aggregates (slip patterns) walk large covering indexes: map the file and keep
  // more pages in memory instead of a read() per 4 KB page (SQLite's default cache is 2 MB).
  if (path !== ':memory:') sqlite.pragma('mmap_size = 1073741824')
  sqlite.pragma('cache_size = -65536')
  const db = new Kysely<Database>({ dialect: new SqliteDialect({ database: sqlite }) })
  sqliteHandles.set(db, sqlite)
  return db
}

/**
 * PostgreSQL type parsers, so rows read the same as from SQLite: bigint (OID 20,
 * what count(*) returns) and numeric (OID 1700, what avg/sum of integers return)
 * as JS numbers rather than strings (OIDs from PostgreSQL's pg_type catalogue;
 * the `types` option is node-postgres' own, node-postgres.com/features/types).
 * Cyclodial's counts and averages are far below 2^53.
 */
const PG_NUMBER_OIDS = new Set([20, 1700])
const pgTypes = {
  getTypeParser: ((oid: number, format?: 'text' | 'binary') =>
    PG_NUMBER_OIDS.has(oid) && format !== 'binary'
      ? (value: string) => (value === null ? null : Number(value))
      : pg.types.getTypeParser(oid, format as 'text')) as typeof pg.types.getTypeParser,
}

export interface PostgresOptions {
  /** Connections per instance (NUXT_DATABASE_POOL_MAX, default 10). */
  poolMax?: number
}

/** A Kysely handle on PostgreSQL through a `pg` pool. */
export function openPostgres(url: string, options: PostgresOptions = {}): Kysely<Database> {
  const pool = new pg.Pool({
    connectionString: url,
    max: options.poolMax && options.poolMax > 0 ? options.poolMax : 10,
    idleTimeoutMillis: 30_000,
    connectionTimeoutMillis: 10_000,
    types: pgTypes,
  })
  // an idle client losing its connection must not crash the process
  pool.on('error', error => console.error(`[db] idle PostgreSQL client: ${error.message}`))
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) })
}

export interface DatabaseSettings {
  /** NUXT_DATABASE_URL: postgres://… selects PostgreSQL; empty = SQLite. */
  databaseUrl?: string | null
  /** NUXT_DB_PATH: the SQLite file when there is no database URL. */
  dbPath: string
  poolMax?: number
}

/** PostgreSQL when the URL names it, else the SQLite file; refuses any other URL. */
export function openConfiguredDatabase(settings: DatabaseSettings): Kysely<Database> {
  const url = String(settings.databaseUrl ?? '').trim()
  if (!url) return openDatabase(settings.dbPath)
  if (!isPostgresUrl(url)) throw new Error('NUXT_DATABASE_URL must start with postgres:// or postgresql:// (leave it empty for SQLite at NUXT_DB_PATH).')
  return openPostgres(url, { poolMax: settings.poolMax })
}

/**
 * Runs `work` while holding a database-wide lock, so several instances starting
 * at once seed the demo only once: a PostgreSQL advisory lock (released at the
 * end of the transaction); on SQLite a plain call (one process owns the file).
 */
export async function withStartupLock<T>(db: Kysely<Database>, work: (db: Kysely<Database>) => Promise<T>): Promise<T> {
  if (dialectOf(db) !== 'postgres') return work(db)
  return db.connection().execute(async (conn) => {
    // 0x6379636c = 'cycl': an arbitrary key of this application's own
    await sql`select pg_advisory_lock(${0x6379636C})`.execute(conn)
    try {
      return await work(conn)
    }
    finally {
      await sql`select pg_advisory_unlock(${0x6379636C})`.execute(conn)
    }
  })
}

export interface MigrationReport { name: string, status: 'Success' | 'Error' | 'NotExecuted' }

/** Runs every pending migration; throws (after logging each result) on failure. */
export async function migrateToLatest(db: Kysely<Database>, log: (line: string) => void = () => {}): Promise<MigrationReport[]> {
  // Migration numbers are handed out to parallel branches, so one may land before a
  // lower number: run whichever are missing rather than refuse.
  const migrator = new Migrator({ db, provider: staticMigrationProvider, allowUnorderedMigrations: true })
  const { error, results = [] } = await migrator.migrateToLatest()
  for (const r of results) log(`migration ${r.migrationName}: ${r.status}`)
  if (error) throw error instanceof Error ? error : new Error(String(error))
  return results.map(r => ({ name: r.migrationName, status: r.status }))
}
