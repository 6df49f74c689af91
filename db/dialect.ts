// The one place where Cyclodial's SQL differs between SQLite (the default, one
// file) and PostgreSQL (NUXT_DATABASE_URL=postgres://…, several instances).
//
// What is the same on both, by design of the schema, so nothing here is needed:
// - times are ISO-8601 UTC text (`nowIso()`), compared as text;
// - JSON is text (`JSON.stringify` in, `JSON.parse` out), never a json/jsonb column;
// - booleans are `integer` 0/1 columns on both (never PostgreSQL `boolean`), so
//   `where('disabled', '=', 0)` reads the same everywhere;
// - upserts are Kysely's `onConflict(…)` (SQLite 3.24+ and PostgreSQL 9.5+ share
//   the `on conflict … do update/do nothing` syntax) and `returning` works on both;
// - counts: the PostgreSQL pool parses bigint (count(*)) and numeric (avg of
//   integers) to numbers (see db/open.ts), as SQLite gives them.
// What differs is below: ask `dialectOf(db)` or use a helper, never test for a
// dialect inside a handler.
import type { Kysely, RawBuilder, Transaction } from 'kysely'
import { PostgresAdapter, sql } from 'kysely'

export type DialectName = 'sqlite' | 'postgres'

type AnyDb = Kysely<any> | Transaction<any>

/** Which database a Kysely handle (or transaction) talks to. */
export function dialectOf(db: AnyDb): DialectName {
  return db.getExecutor().adapter instanceof PostgresAdapter ? 'postgres' : 'sqlite'
}

/** A URL names PostgreSQL when it starts postgres:// or postgresql://. */
export function isPostgresUrl(url: string | undefined | null): boolean {
  return /^postgres(?:ql)?:\/\//i.test(String(url ?? '').trim())
}

/**
 * A unique or primary-key violation (a duplicate insert lost a race): SQLite's
 * SQLITE_CONSTRAINT_UNIQUE / _PRIMARYKEY (sqlite.org/rescode.html), PostgreSQL's
 * SQLSTATE 23505 unique_violation (PostgreSQL docs, Appendix A).
 */
export function isUniqueViolation(error: unknown): boolean {
  const code = (error as { code?: unknown } | null)?.code
  return code === 'SQLITE_CONSTRAINT_UNIQUE' || code === 'SQLITE_CONSTRAINT_PRIMARYKEY' || code === '23505'
}

/** A foreign-key violation: SQLITE_CONSTRAINT_FOREIGNKEY, or SQLSTATE 23503 (same sources). */
export function isForeignKeyViolation(error: unknown): boolean {
  const code = (error as { code?: unknown } | null)?.code
  return code === 'SQLITE_CONSTRAINT_FOREIGNKEY' || code === '23503'
}

/** '$.source.id' → ['source', 'id']: the simple JSON paths Cyclodial uses (keys and array indexes). */
function jsonPathKeys(path: string): string[] {
  if (!/^\$(?:\.[A-Za-z_]\w*|\[\d+\])+$/.test(path)) throw new Error(`Unsupported JSON path: ${path}`)
  return [...path.matchAll(/\.([A-Za-z_]\w*)|\[(\d+)\]/g)].map(m => m[1] ?? m[2]!)
}

/**
 * A text value inside a JSON text column: SQLite's json_extract(col, '$.a.b'),
 * PostgreSQL's (col::jsonb #>> '{a,b}'). Null when absent.
 */
export function jsonText(db: AnyDb, column: string, path: string): RawBuilder<string | null> {
  const keys = jsonPathKeys(path)
  return dialectOf(db) === 'postgres'
    ? sql<string | null>`(${sql.ref(column)}::jsonb #>> ${`{${keys.join(',')}}`})`
    : sql<string | null>`json_extract(${sql.ref(column)}, ${path})`
}

/** A number inside a JSON text column, read as a number on both (see jsonText). */
export function jsonNumber(db: AnyDb, column: string, path: string): RawBuilder<number | null> {
  const keys = jsonPathKeys(path)
  return dialectOf(db) === 'postgres'
    ? sql<number | null>`((${sql.ref(column)}::jsonb #>> ${`{${keys.join(',')}}`})::numeric)`
    : sql<number | null>`json_extract(${sql.ref(column)}, ${path})`
}

/**
 * Case-insensitive substring match: SQLite's LIKE ignores ASCII case already,
 * PostgreSQL's does not (ILIKE does). `pattern` is the full LIKE pattern.
 */
export function likeIgnoringCase(db: AnyDb, column: string, pattern: string): RawBuilder<boolean> {
  return dialectOf(db) === 'postgres'
    ? sql<boolean>`${sql.ref(column)} ilike ${pattern}`
    : sql<boolean>`${sql.ref(column)} like ${pattern}`
}

/** Joins text values of a group with `separator`: group_concat (SQLite) or string_agg (PostgreSQL). */
export function groupConcat(db: AnyDb, column: string, separator = ','): RawBuilder<string | null> {
  return dialectOf(db) === 'postgres'
    ? sql<string | null>`string_agg(${sql.ref(column)}::text, ${separator})`
    : sql<string | null>`group_concat(${sql.ref(column)}, ${separator})`
}

/** The larger of two values in one row: SQLite's scalar max(a, b), PostgreSQL's greatest(a, b). */
export function greatestOf(db: AnyDb, a: RawBuilder<unknown> | string, b: RawBuilder<unknown> | string): RawBuilder<number> {
  const ra = typeof a === 'string' ? sql.ref(a) : a
  const rb = typeof b === 'string' ? sql.ref(b) : b
  return dialectOf(db) === 'postgres' ? sql<number>`greatest(${ra}, ${rb})` : sql<number>`max(${ra}, ${rb})`
}

/**
 * Serialises transactions that share `key` until they commit: PostgreSQL's
 * pg_advisory_xact_lock on a 32-bit hash of the key (PostgreSQL docs §9.27.10,
 * Advisory Lock Functions), so instances counting or claiming the same thing wait
 * for each other; nothing on SQLite, where a write transaction already runs alone.
 * Call first inside the transaction.
 */
export async function lockForTransaction(trx: Transaction<any>, key: string): Promise<void> {
  if (dialectOf(trx) !== 'postgres') return
  await sql`select pg_advisory_xact_lock(hashtext(${key}))`.execute(trx)
}

/**
 * How many statements one request may send at once to walk a large scope in parts:
 * PostgreSQL runs each on its own pooled connection (and server process), so a view
 * over every cohort uses several cores; SQLite answers one statement at a time in this
 * process, where parts would only add statements. Three parts measured best on the
 * 2-core development machine (docs/performance.md); more cores gain from more.
 */
export function statementsAtOnce(db: AnyDb): number {
  return dialectOf(db) === 'postgres' ? 3 : 1
}
