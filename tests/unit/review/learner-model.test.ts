// The simulated learners behind the demo histories: graded by the real grader,
// each planted habit must show as its pattern, and clean learners as none.
import { describe, expect, it } from 'vitest'
import { makeRng } from '#shared/engine/random'
import { countsFromHistory, detectPatterns } from '#shared/review/patterns'
import { PROFILES, SIMULATION_TEMPLATES, simulateAttempt } from '../../../db/seed/learner-model'
import type { Profile } from '../../../db/seed/learner-model'
import { ruleSwapAttemptOf } from '~~/server/lib/practice/attempts'
import { gradeAttempt } from '~~/server/lib/engine/attempt'
import { generateCase } from '~~/server/lib/engine/generator'

function history(profile: Profile, n: number, key: string) {
  const rng = makeRng(key)
  return Array.from({ length: n }, (_, i) => {
    const c = generateCase(SIMULATION_TEMPLATES[(i * 5 + key.length) % SIMULATION_TEMPLATES.length]!, `${key}-${i}`)
    const input = simulateAttempt(c, profile, rng)
    const grade = gradeAttempt(c, input, { mode: 'learner-turns' })
    return { ...ruleSwapAttemptOf(grade, input.gaze), parsed: grade.parsed }
  })
}

const EXPECTED: Record<Profile, string[]> = {
  'clean': [],
  'mostly-clean': [],
  'image': ['image-recorded'],
  'swap-LE': ['left-right-rule-swapped:LE'],
  'swap-RE': ['left-right-rule-swapped:RE'],
  'dial': ['dial-value-as-amount'],
  'unnamed': ['test-unnamed'],
  'measures-badly': ['measures-not-records'],
}

describe('simulated learners', () => {
  for (const profile of PROFILES) {
    it(`${profile}: the grader's slips show the planted habit and nothing else`, () => {
      for (const key of ['a', 'bb', 'ccc']) {
        const graded = history(profile, 16, `${profile}-${key}`)
        const found = detectPatterns(countsFromHistory(graded)).map(p => (p.eye ? `${p.code}:${p.eye}` : p.code))
        expect(found, `${profile} ${key}: ${JSON.stringify(graded.map(g => g.slips))}`).toEqual(EXPECTED[profile])
      }
    })
  }

  it('writes records the parser reads in full for a clean learner', () => {
    for (const g of history('clean', 12, 'parse')) expect(g.parsed.problems).toEqual([])
  })
})
