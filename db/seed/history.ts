// Demo histories: each cohort's students get a few weeks of practice attempts,
// written by simulated learners with planted recording habits and graded and
// stored through recordAttempt (the one way attempts are stored), so the
// slip-patterns page has something true to show. Invented behaviour, demo only.
// The demo student (student@) keeps a clean slate for trying practice fresh.
import type { Kysely } from 'kysely'
import { makeRng, pick } from '#shared/engine/random'
import type { Database } from '../schema'
import { recordAttempt } from '~~/server/lib/practice/attempts'
import { insertCase } from '~~/server/lib/practice/cases'
import type { Profile } from './learner-model'
import type { Habit } from './quiz-records'
import { SIMULATION_TEMPLATES, simulateAttempt } from './learner-model'

/** Who has which habit: one-eye and both-eye reversers in each cohort, the rest mostly clean. */
export const DEMO_HABITS: Record<string, Profile> = {
  'jory.feldane@cyclodial.test': 'swap-LE',
  'priya.vellacott@cyclodial.test': 'image',
  'oisin.marrable@cyclodial.test': 'clean',
  'wen.hallowby@cyclodial.test': 'dial',
  'adaeze.quillon@cyclodial.test': 'unnamed',
  'milo.strathearn@cyclodial.test': 'image',
  'freya.dunmoor@cyclodial.test': 'mostly-clean',
  'kofi.ashgrove@cyclodial.test': 'swap-RE',
  'ines.calloway@cyclodial.test': 'mostly-clean',
  'rafe.tolliver@cyclodial.test': 'measures-badly',
  'noor.bramblecote@cyclodial.test': 'clean',
}

/** The same habit in the demo quizzes (db/seed/quiz-records.ts writes those records). */
const QUIZ_HABITS: Record<Profile, Habit> = {
  'clean': 'careful',
  'mostly-clean': 'careful',
  'image': 'image-not-eye',
  'swap-LE': 'careful',
  'swap-RE': 'careful',
  'dial': 'dial-figure',
  'unnamed': 'terse',
  'measures-badly': 'misreads-scale',
}
export const quizHabitOf = (email: string | undefined): Habit | undefined => (email && DEMO_HABITS[email] ? QUIZ_HABITS[DEMO_HABITS[email]] : undefined)

export const ATTEMPTS_PER_LEARNER = 22
const DAY = 86_400_000

/** Seeds the histories; returns how many attempts were stored. Runs inside the seed's transaction. */
export async function seedHistories(db: Kysely<Database>, userIds: Map<string, number>, now: string): Promise<number> {
  const end = Date.parse(now)
  let stored = 0
  for (const [email, profile] of Object.entries(DEMO_HABITS)) {
    const learnerId = userIds.get(email)
    if (!learnerId) continue
    const rng = makeRng(`demo-history/${email}`)
    for (let i = 0; i < ATTEMPTS_PER_LEARNER; i++) {
      // spread over the last eight weeks, oldest first, in the working day
      const day = Math.floor((ATTEMPTS_PER_LEARNER - i) * 56 / ATTEMPTS_PER_LEARNER)
      const at = new Date(end - day * DAY - Math.floor(rng() * 8) * 3_600_000).toISOString()
      const { row, patient } = await insertCase(db, { ownerId: learnerId, purpose: 'practice', mode: 'learner-turns', templateId: pick(rng, SIMULATION_TEMPLATES), seed: `demo-${email}-${i}`, now: at })
      const input = simulateAttempt(patient, profile, rng)
      await recordAttempt(db, { caseRow: row, learnerId, kind: 'practice', attempt: input, startedAt: at, submittedAt: at })
      stored++
    }
  }
  return stored
}
