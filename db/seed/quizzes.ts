// Demo quizzes, so a newcomer sees every state: for each demo cohort a finished quiz
// with released results (every attempt graded and stored by recordAttempt), one open
// now (one student part-way through, work autosaved) and one scheduled. Casebook
// entries for each tutor feed them. Invented demo data only.
import type { Kysely } from 'kysely'
import type { Database, QuizItemRow, QuizRow } from '../schema'
import { recordAttempt } from '~~/server/lib/practice/attempts'
import { recordTurn } from '~~/server/lib/practice/cases'
import { levelReadings } from '~~/server/lib/engine/patient'
import type { DmrItemConfig } from '~~/server/lib/quiz/items'
import { DEFAULT_QUIZ_WEIGHTS, buildItemCase } from '~~/server/lib/quiz/items'
import { ensureQuizCase } from '~~/server/lib/quiz/sitting'
import { sittingDeadline } from '~~/server/lib/quiz/timing'
import { DEMO_PEOPLE } from './school'
import { quizHabitOf } from './history'
import { HABITS, demoReadings, demoRecord, foundFrom } from './quiz-records'
import type { Habit } from './quiz-records'

const HOUR = 3_600_000
const DAY = 24 * HOUR
const iso = (ms: number) => new Date(ms).toISOString()

/** An exact case in each tutor's casebook: right SO palsy, more torsion in downgaze. */
const EXACT_SPEC = {
  label: 'Right superior oblique palsy, 6° in primary position',
  condition: 'so-palsy',
  affectedEye: 'RE',
  palsiedMuscles: ['RSO'],
  fixingEye: 'LE',
  gazes: {
    'primary': { torsion: { RE: 6, LE: 1 }, vertical: 7, horizontal: -2 },
    'down': { torsion: { RE: 8, LE: 1 }, vertical: 9, horizontal: -2 },
    'down-left': { torsion: { RE: 8.5, LE: 1 }, vertical: 12, horizontal: -2 },
    'left': { torsion: { RE: 6.5, LE: 1 }, vertical: 10, horizontal: -2 },
  },
  headTilt: { right: 13, left: 3 },
  supine: 7,
  response: { reliabilitySd: 0.8, parallelThreshold: 1, behaviours: [] },
  opening: 'Since the accident, things look doubled and tilted when I read.',
}

const dmr = (source: DmrItemConfig['source'], over: Partial<DmrItemConfig> = {}): DmrItemConfig => ({
  kind: 'dmr',
  source,
  perStudent: source.type !== 'case',
  mode: 'patient-turns',
  readScale: false,
  tolerance: 2,
  weights: { ...DEFAULT_QUIZ_WEIGHTS },
  ...over,
})

interface CohortPlan { cohortId: number, tutorId: number, studentIds: number[], tag: string }

async function addQuiz(db: Kysely<Database>, plan: CohortPlan, q: { title: string, instructions: string, seed: string, opens: number, closes: number, limit: number | null, interpretation: boolean, released: number | null, now: number }, items: { prompt: string, config: DmrItemConfig }[]) {
  const created = iso(q.opens - 3 * DAY)
  const quiz = await db.insertInto('quizzes').values({
    owner_id: plan.tutorId,
    title: q.title,
    instructions: q.instructions,
    seed: q.seed,
    time_limit_minutes: q.limit,
    opens_at: iso(q.opens),
    closes_at: iso(q.closes),
    attempts_allowed: 1,
    interpretation: q.interpretation ? 1 : 0,
    hold_feedback: 1,
    published_at: created,
    released_at: q.released ? iso(q.released) : null,
    released_by: q.released ? plan.tutorId : null,
    archived_at: null,
    duplicated_from: null,
    created_at: created,
    updated_at: created,
  }).returningAll().executeTakeFirstOrThrow()
  await db.insertInto('quiz_cohorts').values({ quiz_id: quiz.id, cohort_id: plan.cohortId, created_at: created }).execute()
  const rows: QuizItemRow[] = []
  for (const [i, item] of items.entries()) {
    rows.push(await db.insertInto('quiz_items').values({
      quiz_id: quiz.id, position: i + 1, kind: 'dmr', prompt: item.prompt, config_json: JSON.stringify(item.config), created_at: created, updated_at: created,
    }).returningAll().executeTakeFirstOrThrow())
  }
  return { quiz, items: rows }
}

/** One student sits a quiz: each item measured and recorded the way their habit goes. */
async function sit(db: Kysely<Database>, quiz: QuizRow, items: QuizItemRow[], studentId: number, habit: Habit, startMs: number, submit: boolean) {
  const started = iso(startMs)
  await db.insertInto('quiz_sittings').values({ quiz_id: quiz.id, student_id: studentId, started_at: started, deadline_at: sittingDeadline(quiz, started), finished_at: null }).execute()
  let clock = startMs
  for (const item of items) {
    // the demo quizzes hold double Maddox rod items only, which always have a case
    const row = (await ensureQuizCase(db, quiz, item, studentId, started))!
    const config = JSON.parse(item.config_json) as DmrItemConfig
    const patient = buildItemCase(config, quiz.seed, item.id, studentId).case
    clock += (6 + ((studentId * 7 + item.position * 3) % 9)) * 60_000
    const gaze = 'primary' as const
    let readings = demoReadings(levelReadings(patient, gaze, []), habit)
    let trial: number | null = null
    if (row.mode === 'patient-turns') {
      const turn = await recordTurn(db, row, { gaze, distance: 'near' }, iso(clock - 60_000))
      readings = demoReadings(turn.readings, habit)
      trial = turn.trial
    }
    const record = demoRecord(foundFrom(readings), gaze, habit)
    const draft = { gaze, distance: 'near' as const, readings, prisms: [], lights: 'dim' as const, record }
    await db.updateTable('cases').set({ draft_json: JSON.stringify({ ...draft, savedAt: iso(clock - 30_000) }) }).where('id', '=', row.id).execute()
    if (!submit) return
    const { interpretation: _i, ...weights } = config.weights
    await recordAttempt(db, {
      caseRow: row,
      learnerId: studentId,
      kind: 'quiz',
      attempt: { gaze, distance: 'near', readings, prisms: [], lights: 'dim', record },
      trial,
      options: { tolerance: config.tolerance, weights },
      quizId: quiz.id,
      quizItemId: item.id,
      startedAt: started,
      submittedAt: iso(clock),
    })
  }
  await db.updateTable('quiz_sittings').set({ finished_at: iso(clock + 60_000) }).where('quiz_id', '=', quiz.id).where('student_id', '=', studentId).execute()
}

export async function seedQuizzes(db: Kysely<Database>, ids: { cohortIds: Map<string, number>, userIds: Map<string, number> }, nowIso: string): Promise<number> {
  const now = Date.parse(nowIso)
  const plans: CohortPlan[] = [
    { tag: 'kestrel', cohortId: ids.cohortIds.get('Kestrel cohort')!, tutorId: ids.userIds.get('tutor@cyclodial.test')!, studentIds: [] },
    { tag: 'heron', cohortId: ids.cohortIds.get('Heron cohort')!, tutorId: ids.userIds.get('tutor2@cyclodial.test')!, studentIds: [] },
  ]
  for (const p of plans) {
    const cohortName = [...ids.cohortIds].find(([, id]) => id === p.cohortId)![0]
    p.studentIds = DEMO_PEOPLE.filter(x => x.role === 'student' && x.cohort === cohortName).map(x => ids.userIds.get(x.email)!)
  }

  // a learner keeps the habit they show in practice (db/seed/history.ts), so slip patterns stay true
  const emailOf = new Map([...ids.userIds].map(([email, id]) => [id, email]))
  const habitFor = (sid: number, i: number): Habit => quizHabitOf(emailOf.get(sid)) ?? HABITS[i % HABITS.length]!

  let made = 0
  for (const plan of plans) {
    const stamp = iso(now - 20 * DAY)
    const template = await db.insertInto('casebook_templates').values({
      owner_id: plan.tutorId, title: 'Clear right SO palsy (6–8°)', template_id: 'so-palsy-right-standard',
      ranges_json: JSON.stringify({ torsion: [6, 8] }), tolerance: 2, notes: 'Unmistakable torsion for a first graded quiz.', archived_at: null, created_at: stamp, updated_at: stamp,
    }).returningAll().executeTakeFirstOrThrow()
    const exact = await db.insertInto('casebook_cases').values({
      owner_id: plan.tutorId, title: 'Exact: right SO palsy, 6° primary', spec_json: JSON.stringify(EXACT_SPEC), tolerance: 2, archived_at: null, created_at: stamp, updated_at: stamp,
    }).returningAll().executeTakeFirstOrThrow()
    const narrowed = { type: 'template' as const, id: template.id, templateId: template.template_id, ranges: { torsion: [6, 8] as [number, number] }, title: template.title }
    const exactSource = { type: 'case' as const, id: exact.id, spec: EXACT_SPEC as never, title: exact.title }

    // finished and released two weeks ago
    const week3 = await addQuiz(db, plan, {
      title: 'Week 3: writing the record',
      instructions: 'Two patients. Measure in primary position at near and write a complete record for each.',
      seed: `demo-${plan.tag}-week-3`,
      opens: now - 14 * DAY,
      closes: now - 14 * DAY + 3 * HOUR,
      limit: 40,
      interpretation: false,
      released: now - 12 * DAY,
      now,
    }, [
      { prompt: 'Patient 1: measure in primary position at near and record.', config: dmr(narrowed) },
      { prompt: 'Patient 2: measure in primary position at near and record.', config: dmr(exactSource, { mode: 'learner-turns' }) },
    ])
    for (const [i, sid] of plan.studentIds.entries()) {
      await sit(db, week3.quiz, week3.items, sid, habitFor(sid, i), now - 14 * DAY + (10 + i * 7) * 60_000, true)
    }

    // open now: one student part-way through, the work autosaved
    const week6 = await addQuiz(db, plan, {
      title: 'Week 6: patients who look different',
      instructions: 'Measure in primary position at near, record, then work out the muscle with the three-step test.',
      seed: `demo-${plan.tag}-week-6`,
      opens: now - 2 * HOUR,
      closes: now + 6 * DAY,
      limit: 45,
      interpretation: true,
      released: null,
      now,
    }, [
      { prompt: 'Patient 1: measure, record and interpret.', config: dmr({ type: 'engine', templateId: 'io-palsy-left-standard', title: 'Left inferior oblique palsy (standard)' }) },
      { prompt: 'Patient 2: measure, record and interpret.', config: dmr({ type: 'engine', templateId: 'skew-deviation-standard', title: 'Skew deviation — with ocular tilt reaction torsion (standard)' }, { mode: 'learner-turns' }) },
    ])
    const partWay = plan.studentIds[1]
    if (partWay) await sit(db, week6.quiz, week6.items, partWay, habitFor(partWay, 1), now - 20 * 60_000, false)

    // scheduled for the end of term
    await addQuiz(db, plan, {
      title: 'End-of-term assessment',
      instructions: 'Three patients, one hour. Read the scale carefully: the patient turns the rods.',
      seed: `demo-${plan.tag}-end-of-term`,
      opens: now + 14 * DAY,
      closes: now + 14 * DAY + 4 * HOUR,
      limit: 60,
      interpretation: true,
      released: null,
      now,
    }, [
      { prompt: 'Patient 1', config: dmr({ type: 'engine', templateId: 'bilateral-so-palsy-standard', title: 'Bilateral superior oblique palsy (standard)' }, { readScale: true }) },
      { prompt: 'Patient 2', config: dmr({ type: 'engine', templateId: 'long-standing-so-palsy-standard', title: 'Long-standing superior oblique palsy that under-reports (standard)' }) },
      { prompt: 'Patient 3', config: dmr({ type: 'engine', templateId: 'normal-challenging', title: 'No cyclovertical problem (challenging)' }) },
    ])
    made += 3
  }
  return made
}
