// Column types that must be spelt differently on SQLite and PostgreSQL, for the
// migrations. Frozen in time like the migrations themselves: imports no app code,
// and a change here must never alter what an existing migration creates on SQLite.
//
// - An auto-numbered id: SQLite's `integer primary key` is the rowid (numbered by
//   the database); PostgreSQL numbers only a `serial` (or identity) column.
// - A floating-point figure: SQLite's `real` is an 8-byte IEEE double (sqlite.org
//   datatype3.html §2); PostgreSQL's `real` is 4 bytes, so it takes `double precision`
//   (PostgreSQL docs §8.1.3) to give back exactly what was stored.
import type { Kysely } from 'kysely'
import { PostgresAdapter } from 'kysely'

const onPostgres = (db: Kysely<any>): boolean => db.getExecutor().adapter instanceof PostgresAdapter

/** The type of an auto-numbered integer primary key. */
export const idType = (db: Kysely<any>): 'integer' | 'serial' => (onPostgres(db) ? 'serial' : 'integer')

/** The type of a double-precision number. */
export const realType = (db: Kysely<any>): 'real' | 'double precision' => (onPostgres(db) ? 'double precision' : 'real')
