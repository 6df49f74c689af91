// One way to show marks (issue 13, point 4): MarksSheet is the marks of every screen —
// practice feedback, the record checker, the student's released quiz, the tutor's
// attempt view (with overrides), the staff replay and fundus results. Each use gets a
// test here that the sheet is there, with the engine's own marks, in plain words.
import { describe, expect, it } from 'vitest'
import type { VueWrapper } from '@vue/test-utils'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import MarksSheet from '~/components/marks/MarksSheet.vue'
import SimFeedback from '~/components/sim/SimFeedback.vue'
import SimBench from '~/components/sim/SimBench.vue'
import RecordCheckResult from '~/components/record/RecordCheckResult.vue'
import QuizMarksPanel from '~/components/quiz/QuizMarksPanel.vue'
import QuizItemFeedback from '~/components/quiz/QuizItemFeedback.vue'
import FundusResult from '~/components/fundus/FundusResult.vue'
import { gradeAttempt } from '~~/server/lib/engine/attempt'
import { gradeRecord } from '~~/server/lib/engine/grader'
import { gradeFundus } from '~~/server/lib/fundus/grade'
import { SLIP_CODES, SLIP_INFO } from '#shared/engine/slips'
import type { CRITERION_LABELS } from '#shared/schemas/quiz'
import type { BenchResult } from '#shared/bench/contract'
import type { RecordCheckResult as CheckResult } from '#shared/types/practice'
import type { StudentItemFeedback } from '#shared/types/quiz'
import { engineCase } from '~~/tests/support/presentation'
import { fakeLayout } from '~~/tests/support/bench-host'

// a reversed right eye: 10° excyclo recorded as incyclo — a critical slip, so the cap applies
// (clinical-facts.md: RE torsion = reading − 90, so a reading of 100 is 10° excyclo)
const checked = gradeRecord({ record: 'DMR near primary position: RE 10 incyclo, LE no torsion', expected: { RE: 10, LE: 0 }, gaze: 'primary', distance: 'near', readings: { RE: 100, LE: 90 } })
const checkResult: CheckResult = { readAs: checked.readAs, parsed: checked.parsed, marks: checked.marks, score: checked.score, points: checked.points, cap: checked.cap, slips: checked.slips, modelRecord: checked.modelRecord, explanation: checked.explanation }

const CODE = new RegExp(`\\b(${SLIP_CODES.join('|')})\\b`)

/** The sheets a wrapper renders, and the checks every sheet must pass. */
function sheets(wrapper: VueWrapper) {
  return wrapper.findAllComponents(MarksSheet)
}
function expectPlainWords(text: string) {
  expect(text).not.toMatch(CODE)
}

describe('MarksSheet itself', () => {
  it('gives points of possible, the cap, each criterion in words and each slip with its eye', async () => {
    expect(checked.cap).not.toBeNull()
    const reversed = checked.slips.find(s => s.code === 'direction-reversed')!
    expect(reversed.eye).toBe('RE')
    const wrapper = await mountSuspended(MarksSheet, { props: { marks: checked.marks, slips: checked.slips, points: checked.points, cap: checked.cap } })
    const text = wrapper.text()
    expect(wrapper.get('[data-testid="marks-total"]').text()).toBe(`${Math.round(checked.points.earned * 100) / 100} of ${checked.points.possible}`)
    expect(wrapper.get('[data-testid="marks-cap"]').text()).toContain('Capped at 50 %')
    expect(text).toContain('capped at half')
    expect(text).toContain(`${SLIP_INFO['direction-reversed'].title} — right eye`)
    for (const m of checked.marks) expect(wrapper.get(`tr[data-criterion="${m.criterion}"] th`).text()).not.toBe(m.criterion === 'eye' ? 'eye' : m.criterion)
    expect(wrapper.get('tr[data-criterion="direction"] th').text()).toBe('Direction')
    expectPlainWords(text)
  })

  it('works the points and the cap out from the marks when the page gives none', async () => {
    const marks = [{ criterion: 'direction', score: 0, weight: 2, reason: 'r' }, { criterion: 'amount', score: 1, weight: 2, reason: 'r' }]
    const wrapper = await mountSuspended(MarksSheet, { props: { marks, slips: [{ code: 'direction-reversed', eye: 'LE' as const }] } })
    // 2 of 4 before the cap; the cap holds a record with a critical slip to half (domain.md §5.2)
    expect(wrapper.get('[data-testid="marks-total"]').text()).toBe('2 of 4')
    expect(wrapper.text()).toContain('Direction reversed — left eye')
  })

  it('says nothing about slips where the work has none (fundus), and names an unknown criterion in words', async () => {
    const wrapper = await mountSuspended(MarksSheet, { props: { marks: [{ criterion: 'something-new', score: 1, weight: 1, reason: 'fine' }], slips: null } })
    expect(wrapper.text()).not.toContain('Slips')
    expect(wrapper.text()).toContain('Another criterion')
    expect(wrapper.text()).not.toContain('something-new')
  })
})

describe('each screen that shows marks uses MarksSheet', () => {
  const { case: c, presentation } = engineCase('so-palsy-right', 'marks-sheet-1')
  const level = presentation.positions.primary.horizontalAt!
  const body = { gaze: 'primary' as const, distance: 'near' as const, readings: { RE: level.RE, LE: level.LE }, prisms: [], lights: 'dim' as const, record: 'right eye 100' }
  const graded = gradeAttempt(c, body, { mode: 'learner-turns' })
  const result: BenchResult = { attemptId: 1, ...graded, truth: { ...graded.truth } }

  it('practice feedback', async () => {
    const wrapper = await mountSuspended(SimFeedback, { props: { result } })
    expect(sheets(wrapper)).toHaveLength(1)
    const sheet = sheets(wrapper)[0]!
    expect(sheet.get('[data-testid="score"]').text()).toBe(`${Math.round((graded.points.earned / graded.points.possible) * 100)}%`)
    expect(graded.slips.length).toBeGreaterThan(0)
    for (const s of graded.slips) expect(sheet.text()).toContain(SLIP_INFO[s.code].title)
    expectPlainWords(wrapper.text())
  })

  it('practice feedback says when the interpretation offered was skipped', async () => {
    const skipped = await mountSuspended(SimFeedback, { props: { result, interpretationOffered: true } })
    expect(skipped.get('[data-testid="interpretation-skipped"]').text()).toContain('You skipped the interpretation')
    const notOffered = await mountSuspended(SimFeedback, { props: { result } })
    expect(notOffered.find('[data-testid="interpretation-skipped"]').exists()).toBe(false)
  })

  it('the record checker', async () => {
    const wrapper = await mountSuspended(RecordCheckResult, { props: { result: checkResult } })
    expect(sheets(wrapper)).toHaveLength(1)
    expect(wrapper.get('[data-testid="marks-cap"]').text()).toContain('This record would mislead the next clinician')
    expect(wrapper.get('[data-testid="slips"]').text()).toContain('Direction reversed — right eye')
    expectPlainWords(wrapper.text())
  })

  it('the tutor\'s attempt view, with a Change button per criterion', async () => {
    const marks = checked.marks.map(m => ({ ...m, criterion: m.criterion as keyof typeof CRITERION_LABELS, overridden: m.criterion === 'amount' }))
    const wrapper = await mountSuspended(QuizMarksPanel, { props: { marks, slips: checked.slips, canOverride: true } })
    expect(sheets(wrapper)).toHaveLength(1)
    expect(wrapper.findAll('button').filter(b => b.text() === 'Change')).toHaveLength(marks.length)
    expect(wrapper.text()).toContain('changed by a tutor')
    expect(wrapper.text()).toContain('Direction reversed — right eye')
    await wrapper.get('button[aria-label="Change the Direction mark"]').trigger('click')
    expect(wrapper.find('#override-score-direction').exists()).toBe(true)
  })

  it('the student\'s released quiz shows the slips with their eye', async () => {
    const feedback: StudentItemFeedback = {
      ...result,
      attemptId: 7,
      truth: graded.truth,
      marks: graded.marks.map(m => ({ ...m, criterion: m.criterion as keyof typeof CRITERION_LABELS, overridden: false })),
    } as StudentItemFeedback
    const wrapper = await mountSuspended(QuizItemFeedback, { props: { quizId: 3, position: 1, feedback } })
    expect(sheets(wrapper)).toHaveLength(1)
    const slips = wrapper.get('[data-testid="slips"]').text()
    for (const s of graded.slips) expect(slips).toContain(`${SLIP_INFO[s.code].title}${s.eye ? ` — ${s.eye === 'RE' ? 'right' : 'left'} eye` : ''}`)
    expectPlainWords(wrapper.text())
  })

  it('the staff replay: the read-only bench shows the marks once', async () => {
    fakeLayout(640)
    const wrapper = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns', initialDraft: body, result, readonly: true } })
    expect(sheets(wrapper)).toHaveLength(1)
    expect(wrapper.findAll('[data-testid="marks-total"]')).toHaveLength(1)
    // a replay is not live
    expect(wrapper.text()).not.toContain('live')
  })

  it('fundus results: each eye\'s marks in words, and no slips section', async () => {
    // fovea 2.5 disc diameters temporal of the disc and 0.3 below it: atan2(0.3, 2.5) ≈ 6.8°, inside both eyes' normal ranges (shared/engine/fundus/normals.ts)
    const references = {
      RE: { eye: 'RE' as const, disc: { x: 0, y: 0 }, fovea: { x: -2.5, y: 0.3 }, ddUnit: 1 },
      LE: { eye: 'LE' as const, disc: { x: 0, y: 0 }, fovea: { x: 2.5, y: 0.3 }, ddUnit: 1 },
    }
    const graded = gradeFundus({ references, marks: { RE: { ...references.RE, finding: 'within-normal' }, LE: { ...references.LE, finding: 'within-normal' } } })
    const wrapper = await mountSuspended(FundusResult, { props: { result: graded } })
    expect(sheets(wrapper)).toHaveLength(1)
    const sheet = sheets(wrapper)[0]!.text()
    expect(sheet).toContain('Right eye: disc–fovea angle')
    expect(sheet).toContain('Left eye: objective finding')
    expect(sheet).not.toContain('Slips')
    expect(wrapper.get('[data-testid="marks-total"]').text()).toBe(`${graded.points.earned} of ${graded.points.possible}`)
  })
})
