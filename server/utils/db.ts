// The process-wide database handle. Nitro does not await async plugin work
// before serving (stack.md, gotcha 3), so the handle is a memoised promise that
// opens, migrates and (when asked) seeds once; every handler awaits it.
// NUXT_DATABASE_URL=postgres://… selects PostgreSQL (db/open.ts); otherwise the
// SQLite file at NUXT_DB_PATH.
import type { Kysely } from 'kysely'
import { openConfiguredDatabase, migrateToLatest, withStartupLock } from '~~/db/open'
import type { Database } from '~~/db/schema'
import { seedDemoIfWanted } from '~~/db/seed'

let ready: Promise<Kysely<Database>> | undefined

export function useDb(): Promise<Kysely<Database>> {
  ready ??= (async () => {
    const config = useRuntimeConfig()
    const db = openConfiguredDatabase({
      databaseUrl: String(config.databaseUrl ?? ''),
      dbPath: config.dbPath,
      poolMax: Number(config.databasePoolMax) || undefined,
    })
    try {
      // several instances may start at once: one migrates and seeds, the others wait
      await withStartupLock(db, async (locked) => {
        await migrateToLatest(locked, line => console.info(`[db] ${line}`))
        await seedDemoIfWanted(locked, {
          dev: import.meta.dev,
          flag: String(config.seedDemo ?? ''),
          production: !import.meta.dev,
          productionFlag: String(config.seedDemoInProduction ?? ''),
          hashPassword,
          log: line => console.info(`[seed] ${line}`),
        })
      })
    }
    catch (error) {
      await db.destroy().catch(() => {})
      throw error
    }
    return db
  })().catch((error) => {
    ready = undefined
    throw error
  })
  return ready
}
