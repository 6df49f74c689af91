import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { resultsCsv } from '~~/server/lib/quiz/csv'
import { DEFAULT_QUIZ_WEIGHTS } from '~~/server/lib/quiz/items'
import type { StudentResult } from '#shared/types/quiz'
import type { ItemColumn } from '~~/server/lib/quiz/results'
import { effectiveMarks, pointsOf } from '~~/server/lib/quiz/marks'

const config = { kind: 'dmr' as const, source: { type: 'engine' as const, templateId: 'normal-standard', title: 'N' }, perStudent: true, mode: 'patient-turns' as const, readScale: false, tolerance: 2, weights: DEFAULT_QUIZ_WEIGHTS }

describe('results arithmetic and CSV', () => {
  it('applies the latest override per criterion and adds the interpretation with its weight', () => {
    const attempt = {
      marks_json: JSON.stringify([{ criterion: 'amount', score: 1, weight: 2, reason: 'ok' }, { criterion: 'test', score: 0, weight: 1, reason: 'unnamed' }]),
      interpretation_json: JSON.stringify({ given: {}, result: { score: 0.5 } }),
    }
    const overrides = [
      { attempt_id: 1, criterion: 'test', previous_score: 0, score: 0.5, reason: 'first', created_at: '2026-01-01T00:00:00Z', actorName: 'T' },
      { attempt_id: 1, criterion: 'test', previous_score: 0.5, score: 1, reason: 'second', created_at: '2026-01-02T00:00:00Z', actorName: 'T' },
    ]
    const marks = effectiveMarks(attempt, config, true, overrides)
    expect(marks.find(m => m.criterion === 'test')).toMatchObject({ score: 1, override: { previousScore: 0, reason: 'second' } })
    expect(marks.find(m => m.criterion === 'interpretation')).toMatchObject({ score: 0.5, weight: DEFAULT_QUIZ_WEIGHTS.interpretation })
    expect(pointsOf(marks)).toEqual({ earned: 2 + 1 + 0.5 * DEFAULT_QUIZ_WEIGHTS.interpretation, possible: 3 + DEFAULT_QUIZ_WEIGHTS.interpretation })
    // a patient with nothing to interpret (no interpretation stored) is not marked on it
    expect(effectiveMarks({ ...attempt, interpretation_json: null }, config, true, []).map(m => m.criterion)).toEqual(['amount', 'test'])
  })

  it('writes one row per student, a column per item and criterion, and escapes formulae', () => {
    const columns: ItemColumn[] = [{ id: 9, position: 1, config, criteria: ['amount', 'test'], possible: 3 }]
    const row = (name: string, earned: number | null): StudentResult => ({
      studentId: 1, name, email: 'x@cyclodial.test', cohortId: 1, cohortName: 'Kestrel cohort', status: earned === null ? 'not-started' : 'finished',
      startedAt: null, finishedAt: null, timeTakenMs: earned === null ? null : 90_000,
      items: { 9: earned === null
        ? { attemptId: null, attempts: 0, submittedAt: null, earned: null, possible: null, marks: [], slips: [], cap: null, overridden: false, draftOnly: false }
        : { attemptId: 5, attempts: 1, submittedAt: null, earned, possible: 3, marks: [{ criterion: 'amount', score: 1, weight: 2, reason: '' }, { criterion: 'test', score: 0, weight: 1, reason: '' }], slips: ['test-unnamed'], cap: null, overridden: false, draftOnly: false } },
      earned: earned ?? 0, possible: 3, score: (earned ?? 0) / 3, slips: earned === null ? 0 : 1,
    })
    const csv = resultsCsv(columns, [row('Inès Calloway', 2), row('=HYPERLINK("x")', null)])
    expect(csv.startsWith('\uFEFF')).toBe(true)
    expect(csv).toContain('\r\n')
    const parsed = Papa.parse<string[]>(csv.slice(1).trim()).data
    expect(parsed[0]).toEqual(['Student', 'E-mail', 'Cohort', 'Status', 'Started (UTC)', 'Finished (UTC)', 'Time taken (min)', 'Item 1 total', 'Item 1 amount', 'Item 1 test named', 'Slips', 'Total points', 'Points possible', 'Total %'])
    expect(parsed[1]).toEqual(['Inès Calloway', 'x@cyclodial.test', 'Kestrel cohort', 'finished', '', '', '1.5', '2', '2', '0', '1', '2', '3', '66.67'])
    // a name that looks like a formula is written as text (common practice against CSV injection)
    expect(parsed[2]![0]!.startsWith('\'=')).toBe(true)
    expect(parsed).toHaveLength(3)
  })
})
