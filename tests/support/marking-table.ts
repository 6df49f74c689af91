// Shared parts of the table-driven marking tests (tests/unit/engine/marking-*.test.ts):
// a row is a record, its truth, the exact slips a fair examiner would name and the
// score it may earn. Slips are compared as sorted `code:eye` strings (`code` alone for
// a slip that concerns no single eye). Scores: 1 = full marks; 'cap' = at most 0.5 (a
// critical slip, domain.md §5.2); 'pass' = above 0.5 but below 1; 'lt1' = below 1.
import { expect } from 'vitest'
import { gradeRecord } from '~~/server/lib/engine/grader'
import type { GradeResult } from '~~/server/lib/engine/grader'
import type { Distance, Eye, Gaze, PerEye } from '#shared/engine/types'

export interface Truth {
  RE: number
  LE: number
  gaze?: Gaze
  distance?: Distance
  tol?: number
  shouldNotTest?: boolean
  /** The learner's own dial readings (rod axis). */
  readings?: Partial<PerEye<number>>
  /** Patient-turns: where the patient left each rod. */
  patientSettings?: PerEye<number>
}

export type ScoreRule = 1 | 'cap' | 'pass' | 'lt1'

export interface Row {
  record: string
  truth: Truth
  slips: string[]
  score: ScoreRule
  /** A direction word is misspelt: it must be read, with a note in the parsed result. */
  misspelt?: string
  /** The parser should decline to guess: a problem is reported. */
  declines?: boolean
  /** The direction mark must be below 1 (torsion claimed on an eye without any). */
  directionLost?: boolean
}

/** Truth: signed torsion per eye (positive = excyclo, domain.md §3.3), primary position unless told. */
export const T = (RE: number, LE: number, more: Omit<Truth, 'RE' | 'LE'> = {}): Truth => ({ RE, LE, gaze: 'primary', ...more })
export const N = { distance: 'near' as const }
export const D = { distance: 'distance' as const }
export const row = (record: string, truth: Truth, slips: string[], score: ScoreRule, extra: Partial<Row> = {}): Row => ({ record, truth, slips, score, ...extra })

// slip shorthands (domain.md §5.3 stable codes)
export const DR = (e: Eye) => `direction-reversed:${e}`
export const EW = (e: Eye) => `eye-wrong:${e}`
export const DV = (e: Eye) => `dial-value-as-amount:${e}`
export const AO = (e: Eye) => `amount-off:${e}`
export const DM = (e: Eye) => `direction-missing:${e}`
export const AM = (e: Eye) => `amount-missing:${e}`
export const EM = (e: Eye) => `eye-missing:${e}`
export const NP = (e: Eye) => `not-parallel:${e}`

export function grade(record: string, t: Truth): GradeResult {
  return gradeRecord({
    record,
    expected: { RE: t.RE, LE: t.LE },
    gaze: t.gaze,
    distance: t.distance,
    shouldNotTest: t.shouldNotTest,
    readings: t.readings,
    patientSettings: t.patientSettings,
    options: t.tol === undefined ? undefined : { tolerance: t.tol },
  })
}

export const slipKeys = (r: GradeResult): string[] => r.slips.map(s => (s.eye ? `${s.code}:${s.eye}` : s.code)).sort()
export const markOf = (r: GradeResult, c: string) => r.marks.find(m => m.criterion === c)

export function checkScore(r: GradeResult, rule: ScoreRule) {
  if (rule === 1) expect(r.score).toBe(1)
  else if (rule === 'cap') expect(r.score).toBeLessThanOrEqual(0.5) // domain.md §5.2 critical slips: at most 50 %
  else if (rule === 'pass') {
    expect(r.score).toBeGreaterThan(0.5)
    expect(r.score).toBeLessThan(1)
  }
  else expect(r.score).toBeLessThan(1)
}
