// Demo data: seeded on an empty database in development, or whenever
// NUXT_SEED_DEMO=1 and the demo school is not there yet. Production (the built
// server) never seeds unless asked twice: NUXT_SEED_DEMO=1 and
// NUXT_SEED_DEMO_IN_PRODUCTION=1, and then says so loudly in the log, because the
// demo accounts share one published password.
import type { Kysely } from 'kysely'
import type { Database } from '../schema'
import { seedHistories } from './history'
import { DEMO_PASSWORD, DEMO_PEOPLE, seedSchool } from './school'
import { seedQuizzes } from './quizzes'

export interface SeedOptions {
  dev: boolean
  flag: string
  /** The built server: seeding also needs `productionFlag`. */
  production?: boolean
  /** NUXT_SEED_DEMO_IN_PRODUCTION */
  productionFlag?: string
  /** Where the refusal or the loud warning goes (default console.warn). */
  warn?: (line: string) => void
  hashPassword: (password: string) => Promise<string>
  log?: (line: string) => void
}

export function seedWanted(flag: string, dev: boolean, userCount: number): boolean {
  if (flag === '1' || flag === 'true') return true
  if (flag === '0' || flag === 'false') return false
  return dev && userCount === 0
}

function isOn(flag: string | undefined): boolean {
  return flag === '1' || flag === 'true'
}

export async function seedDemoIfWanted(db: Kysely<Database>, options: SeedOptions): Promise<boolean> {
  const { count } = await db.selectFrom('users').select(eb => eb.fn.countAll<number>().as('count')).executeTakeFirstOrThrow()
  if (!seedWanted(options.flag, options.dev, Number(count))) return false
  const already = await db.selectFrom('users').select('id').where('email', '=', DEMO_PEOPLE[0]!.email).executeTakeFirst()
  if (already) return false
  const warn = options.warn ?? ((line: string) => console.warn(line))
  if (options.production) {
    if (!isOn(options.productionFlag)) {
      warn('[seed] NUXT_SEED_DEMO is set, but this is a production server: the demo school is NOT seeded. Set NUXT_SEED_DEMO_IN_PRODUCTION=1 as well only for a throw-away demonstration.')
      return false
    }
    warn(`[seed] ${'!'.repeat(72)}`)
    warn('[seed] WARNING: seeding the DEMO SCHOOL on a PRODUCTION server (NUXT_SEED_DEMO_IN_PRODUCTION=1).')
    warn(`[seed] Its ${DEMO_PEOPLE.length} accounts, an administrator among them, share the published demo password.`)
    warn('[seed] Use this only for a throw-away demonstration, never with real people or marks.')
    warn(`[seed] ${'!'.repeat(72)}`)
  }
  const hash = await options.hashPassword(DEMO_PASSWORD)
  const now = new Date().toISOString()
  const { quizzes, attempts } = await db.transaction().execute(async (trx) => {
    const ids = await seedSchool(trx, hash, now)
    const quizzes = await seedQuizzes(trx, ids, now)
    const attempts = await seedHistories(trx, ids.userIds, now)
    return { quizzes, attempts }
  })
  options.log?.(`demo school seeded: ${DEMO_PEOPLE.length} people, ${quizzes} quizzes, ${attempts} practice attempts`)
  return true
}
