// npm run db:migrate — brings the database up to the newest migration, printing
// each result: PostgreSQL when NUXT_DATABASE_URL is set (postgres://…), otherwise
// the SQLite file at NUXT_DB_PATH (default .data/cyclodial.sqlite).
import { migrateToLatest, openConfiguredDatabase, withStartupLock } from '../db/open'

const url = process.env.NUXT_DATABASE_URL || ''
const path = process.env.NUXT_DB_PATH || '.data/cyclodial.sqlite'
const where = url ? 'the PostgreSQL database' : path
try {
  const db = openConfiguredDatabase({ databaseUrl: url, dbPath: path })
  try {
    const results = await withStartupLock(db, locked => migrateToLatest(locked, line => console.log(line)))
    console.log(results.length ? `${results.length} migration(s) applied to ${where}` : `${where} is up to date`)
  }
  finally {
    await db.destroy()
  }
}
catch (error) {
  console.error(`migration failed: ${error instanceof Error ? error.message : error}`)
  process.exitCode = 1
}
