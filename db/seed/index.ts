// Demo data: seeded on an empty database in development, or whenever
// NUXT_SEED_DEMO=1 and the demo school is not there yet. Production never
// seeds unless asked.
import type { Kysely } from 'kysely'
import type { Database } from '../schema'
import { seedHistories } from './history'
import { DEMO_PASSWORD, DEMO_PEOPLE, seedSchool } from './school'
import { seedQuizzes } from './quizzes'

export interface SeedOptions {
  dev: boolean
  flag: string
  hashPassword: (password: string) => Promise<string>
  log?: (line: string) => void
}

export function seedWanted(flag: string, dev: boolean, userCount: number): boolean {
  if (flag === '1' || flag === 'true') return true
  if (flag === '0' || flag === 'false') return false
  return dev && userCount === 0
}

export async function seedDemoIfWanted(db: Kysely<Database>, options: SeedOptions): Promise<boolean> {
  const { count } = await db.selectFrom('users').select(eb => eb.fn.countAll<number>().as('count')).executeTakeFirstOrThrow()
  if (!seedWanted(options.flag, options.dev, Number(count))) return false
  const already = await db.selectFrom('users').select('id').where('email', '=', DEMO_PEOPLE[0]!.email).executeTakeFirst()
  if (already) return false
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
