// Opens the SQLite file through Kysely with the pragmas Cyclodial relies on,
// and migrates it. Used by the server (server/utils/db.ts), scripts and tests.
import { mkdirSync } from 'node:fs'
import { dirname } from 'node:path'
import SQLite from 'better-sqlite3'
import { Kysely, Migrator, SqliteDialect } from 'kysely'
import type { Database } from './schema'
import { staticMigrationProvider } from './migrations'

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

export interface MigrationReport { name: string, status: 'Success' | 'Error' | 'NotExecuted' }

/** Runs every pending migration; throws (after logging each result) on failure. */
export async function migrateToLatest(db: Kysely<Database>, log: (line: string) => void = () => {}): Promise<MigrationReport[]> {
  // Migrations run in name order and only in that order: a new one takes the next
  // number after the highest on main when it is merged (renumber a branch's file then).
  const migrator = new Migrator({ db, provider: staticMigrationProvider, allowUnorderedMigrations: false })
  const { error, results = [] } = await migrator.migrateToLatest()
  for (const r of results) log(`migration ${r.migrationName}: ${r.status}`)
  if (error) throw error instanceof Error ? error : new Error(String(error))
  return results.map(r => ({ name: r.migrationName, status: r.status }))
}
