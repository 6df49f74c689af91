// npm run db:migrate — brings the SQLite file (NUXT_DB_PATH, default
// .data/cyclodial.sqlite) up to the newest migration, printing each result.
import { migrateToLatest, openDatabase } from '../db/open'

const path = process.env.NUXT_DB_PATH || '.data/cyclodial.sqlite'
const db = openDatabase(path)
try {
  const results = await migrateToLatest(db, line => console.log(line))
  console.log(results.length ? `${results.length} migration(s) applied to ${path}` : `${path} is up to date`)
}
catch (error) {
  console.error(`migration failed: ${error instanceof Error ? error.message : error}`)
  process.exitCode = 1
}
finally {
  await db.destroy()
}
