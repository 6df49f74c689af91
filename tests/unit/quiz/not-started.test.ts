// Not started is not zero: a student who never started has no score in the CSV or
// the summary, and the mean counts only those who finished.
import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { resultsCsv } from '~~/server/lib/quiz/csv'
import { DEFAULT_QUIZ_WEIGHTS } from '~~/server/lib/quiz/items'
import { meanOfFinished, resultsPage } from '~~/server/lib/quiz/results-page'
import type { StudentResult } from '#shared/types/quiz'
import type { ItemColumn } from '~~/server/lib/quiz/results'
import { formatDuration } from '~~/utils/quiz-time'

const config = { kind: 'dmr' as const, source: { type: 'engine' as const, templateId: 'normal-standard', title: 'N' }, perStudent: true, mode: 'patient-turns' as const, readScale: false, tolerance: 2, weights: DEFAULT_QUIZ_WEIGHTS }
const columns: ItemColumn[] = [{ id: 9, position: 1, config, criteria: ['amount'], possible: 2 }]
const empty = { attemptId: null, attempts: 0, submittedAt: null, earned: null, possible: null, marks: [], slips: [], cap: null, overridden: false, draftOnly: false }

function row(id: number, status: StudentResult['status'], earned: number): StudentResult {
  const sat = status !== 'not-started'
  return {
    studentId: id, name: `S${id}`, email: `s${id}@cyclodial.test`, cohortId: 1, cohortName: 'Kestrel cohort', status,
    startedAt: sat ? '2026-01-01T10:00:00.000Z' : null, finishedAt: null, timeTakenMs: sat ? 725_000 : null,
    items: { 9: sat
      ? { attemptId: id, attempts: 1, submittedAt: null, earned, possible: 2, marks: [{ criterion: 'amount', score: earned / 2, weight: 2, reason: '' }], slips: [], cap: null, overridden: false, draftOnly: false }
      : empty },
    earned, possible: 2, score: earned / 2, slips: 0,
  }
}

describe('not started is not zero', () => {
  const rows = [row(1, 'finished', 2), row(2, 'finished', 1), row(3, 'not-started', 0), row(4, 'in-progress', 0)]

  it('leaves the score cells of a student who never started empty in the CSV', () => {
    const parsed = Papa.parse<string[]>(resultsCsv(columns, rows).slice(1).trim()).data
    const header = parsed[0]!
    const never = parsed.find(r => r[0] === 'S3')!
    for (const col of ['Item 1 total', 'Item 1 amount', 'Slips', 'Total points', 'Total %', 'Time taken (min)']) {
      expect(never[header.indexOf(col)], col).toBe('')
    }
    expect(never[header.indexOf('Status')]).toBe('not started')
    // one who sat and scored nothing still has a 0
    const zero = parsed.find(r => r[0] === 'S4')!
    expect(zero[header.indexOf('Total %')]).toBe('0')
  })

  it('takes the mean over those who finished only', () => {
    expect(meanOfFinished(rows)).toBeCloseTo(0.75, 10)
    expect(meanOfFinished([row(3, 'not-started', 0), row(4, 'in-progress', 0)])).toBeNull()
    const page = resultsPage(columns, rows, { sort: 'name', dir: 'asc', page: 1, pageSize: 25 })
    expect(page.summary).toEqual({ students: 4, started: 3, finished: 2, meanScore: 0.75 })
  })

  it('sorts a student who never started below a score of 0', () => {
    const asc = resultsPage(columns, rows, { sort: 'total', dir: 'asc', page: 1, pageSize: 25 }).items.map(r => r.name)
    expect(asc).toEqual(['S3', 'S4', 'S2', 'S1'])
    const desc = resultsPage(columns, rows, { sort: 'total', dir: 'desc', page: 1, pageSize: 25 }).items.map(r => r.name)
    expect(desc.at(-1)).toBe('S3')
  })

  it('shows time taken in minutes and seconds', () => {
    expect(formatDuration(725_000)).toBe('12 min 05 s')
    expect(formatDuration(4_500_000)).toBe('75 min 00 s')
    expect(formatDuration(42_000)).toBe('42 s')
    expect(formatDuration(null)).toBe('—')
  })
})
