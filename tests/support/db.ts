// Read-only look into the test server's SQLite file, to check what a route stored.
// (WAL mode lets this reader run beside the server.)
import Database from 'better-sqlite3'

export function readDb(path: string) {
  const db = new Database(path, { readonly: true, fileMustExist: true })
  return {
    all: <T = Record<string, any>>(sql: string, ...params: unknown[]): T[] => db.prepare(sql).all(...params) as T[],
    get: <T = Record<string, any>>(sql: string, ...params: unknown[]): T | undefined => db.prepare(sql).get(...params) as T | undefined,
    count: (sql: string, ...params: unknown[]): number => Number((db.prepare(sql).get(...params) as { n: number }).n),
    close: () => db.close(),
  }
}
