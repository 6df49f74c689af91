// The demo scenario: an invented school with invented people. Nothing here is
// a real person or institution. Demo accounts share one password, for local use.
import type { Kysely } from 'kysely'
import type { Role } from '../../shared/auth/roles'
import type { Database } from '../schema'

export const DEMO_PASSWORD = 'cyclodial-demo'
export const DEMO_SCHOOL = 'Northmere School of Orthoptics'

export interface DemoPerson { email: string, name: string, role: Role, cohort?: string, teaches?: string[] }

export const DEMO_COHORTS = ['Kestrel cohort', 'Heron cohort'] as const

export const DEMO_PEOPLE: DemoPerson[] = [
  { email: 'admin@cyclodial.test', name: 'Orla Penhallow', role: 'admin' },
  { email: 'lecturer@cyclodial.test', name: 'Dr Imre Vantongeren', role: 'lecturer' },
  { email: 'tutor@cyclodial.test', name: 'Sunniva Okafor-Reyes', role: 'tutor', teaches: ['Kestrel cohort'] },
  { email: 'tutor2@cyclodial.test', name: 'Beckett Lindqvar', role: 'tutor', teaches: ['Heron cohort'] },
  { email: 'student@cyclodial.test', name: 'Tamsin Arkwell', role: 'student', cohort: 'Kestrel cohort' },
  { email: 'jory.feldane@cyclodial.test', name: 'Jory Feldane', role: 'student', cohort: 'Kestrel cohort' },
  { email: 'priya.vellacott@cyclodial.test', name: 'Priya Vellacott', role: 'student', cohort: 'Kestrel cohort' },
  { email: 'oisin.marrable@cyclodial.test', name: 'Oisín Marrable', role: 'student', cohort: 'Kestrel cohort' },
  { email: 'wen.hallowby@cyclodial.test', name: 'Wen Hallowby', role: 'student', cohort: 'Kestrel cohort' },
  { email: 'adaeze.quillon@cyclodial.test', name: 'Adaeze Quillon', role: 'student', cohort: 'Kestrel cohort' },
  { email: 'milo.strathearn@cyclodial.test', name: 'Milo Strathearn', role: 'student', cohort: 'Heron cohort' },
  { email: 'freya.dunmoor@cyclodial.test', name: 'Freya Dunmoor', role: 'student', cohort: 'Heron cohort' },
  { email: 'kofi.ashgrove@cyclodial.test', name: 'Kofi Ashgrove', role: 'student', cohort: 'Heron cohort' },
  { email: 'ines.calloway@cyclodial.test', name: 'Inès Calloway', role: 'student', cohort: 'Heron cohort' },
  { email: 'rafe.tolliver@cyclodial.test', name: 'Rafe Tolliver', role: 'student', cohort: 'Heron cohort' },
  { email: 'noor.bramblecote@cyclodial.test', name: 'Noor Bramblecote', role: 'student', cohort: 'Heron cohort' },
]

/** Creates the cohorts and people; returns ids by e-mail and cohort name. */
export async function seedSchool(db: Kysely<Database>, passwordHash: string, now: string) {
  const cohortIds = new Map<string, number>()
  for (const name of DEMO_COHORTS) {
    const { id } = await db.insertInto('cohorts').values({ name, created_at: now, updated_at: now })
      .returning('id').executeTakeFirstOrThrow()
    cohortIds.set(name, id)
  }
  const userIds = new Map<string, number>()
  for (const person of DEMO_PEOPLE) {
    const { id } = await db.insertInto('users').values({
      email: person.email,
      name: person.name,
      role: person.role,
      password_hash: passwordHash,
      disabled: 0,
      created_at: now,
      updated_at: now,
      last_login_at: null,
    }).returning('id').executeTakeFirstOrThrow()
    userIds.set(person.email, id)
    const memberships = person.cohort ? [person.cohort] : person.teaches ?? []
    for (const cohort of memberships) {
      await db.insertInto('cohort_members').values({ cohort_id: cohortIds.get(cohort)!, user_id: id, created_at: now }).execute()
    }
  }
  return { cohortIds, userIds }
}
