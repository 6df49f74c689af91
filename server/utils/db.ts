// The process-wide database handle. Nitro does not await async plugin work
// before serving (stack.md, gotcha 3), so the handle is a memoised promise that
// opens, migrates and (when asked) seeds once; every handler awaits it.
import type { Kysely } from 'kysely'
import { openDatabase, migrateToLatest } from '~~/db/open'
import type { Database } from '~~/db/schema'
import { seedDemoIfWanted } from '~~/db/seed'

let ready: Promise<Kysely<Database>> | undefined

export function useDb(): Promise<Kysely<Database>> {
  ready ??= (async () => {
    const config = useRuntimeConfig()
    const db = openDatabase(config.dbPath)
    await migrateToLatest(db, line => console.info(`[db] ${line}`))
    await seedDemoIfWanted(db, {
      dev: import.meta.dev,
      flag: String(config.seedDemo ?? ''),
      production: !import.meta.dev,
      productionFlag: String(config.seedDemoInProduction ?? ''),
      hashPassword,
      log: line => console.info(`[seed] ${line}`),
    })
    return db
  })().catch((error) => {
    ready = undefined
    throw error
  })
  return ready
}
