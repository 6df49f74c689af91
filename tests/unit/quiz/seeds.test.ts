import { describe, expect, it } from 'vitest'
import { buildItemCase, DEFAULT_QUIZ_WEIGHTS } from '~~/server/lib/quiz/items'
import type { DmrItemConfig } from '~~/server/lib/quiz/items'
import { quizCaseSeed } from '~~/server/lib/quiz/seeds'

const config = (over: Partial<DmrItemConfig> = {}): DmrItemConfig => ({
  kind: 'dmr',
  source: { type: 'engine', templateId: 'io-palsy-left-standard', title: 'x' },
  perStudent: true,
  mode: 'patient-turns',
  readScale: false,
  tolerance: 2,
  weights: DEFAULT_QUIZ_WEIGHTS,
  ...over,
})

describe('per-student quiz cases', () => {
  it('derive the same seed for the same quiz, item and student, and a different one otherwise', () => {
    expect(quizCaseSeed('quiz-1', 4, 7)).toBe(quizCaseSeed('quiz-1', 4, 7))
    const all = new Set([quizCaseSeed('quiz-1', 4, 7), quizCaseSeed('quiz-1', 4, 8), quizCaseSeed('quiz-1', 5, 7), quizCaseSeed('quiz-2', 4, 7), quizCaseSeed('quiz-1', 4, null)])
    expect(all.size).toBe(5)
    expect(quizCaseSeed('quiz-1', 4, 7).length).toBeLessThanOrEqual(64)
  })

  it('give each student a different patient, and the same one every time', () => {
    const a = buildItemCase(config(), 'quiz-seed', 11, 101)
    const b = buildItemCase(config(), 'quiz-seed', 11, 102)
    expect(a.case).toEqual(buildItemCase(config(), 'quiz-seed', 11, 101).case)
    expect(a.case.gazes.primary.torsion).not.toEqual(b.case.gazes.primary.torsion)
  })

  it('give everyone one patient when the item is one case for all', () => {
    const one = config({ perStudent: false })
    expect(buildItemCase(one, 'quiz-seed', 11, 101).case).toEqual(buildItemCase(one, 'quiz-seed', 11, 102).case)
  })

  it('build an exact case from its snapshot, whoever sits it', () => {
    const spec = { condition: 'hand-authored' as const, gazes: { primary: { torsion: { RE: 7, LE: 0 } } }, response: { reliabilitySd: 1, parallelThreshold: 1 } }
    const c = config({ source: { type: 'case', id: 3, spec, title: 'Exact' }, perStudent: false })
    const built = buildItemCase(c, 'quiz-seed', 11, 101)
    expect(built.case.gazes.down.torsion).toEqual({ RE: 7, LE: 0 })
    expect(built.specId).toBe(3)
    expect(built.templateId).toBeNull()
  })
})
