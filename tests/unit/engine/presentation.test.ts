import { describe, expect, it } from 'vitest'
import { generateCase } from '~~/server/lib/engine/generator'
import { toPresentation } from '~~/server/lib/engine/presentation'
import { revealTruth } from '~~/server/lib/engine/attempt'
import { CASE_TEMPLATES } from '~~/server/lib/engine/templates'
import { MODES, GAZES, MUSCLES } from '#shared/engine/types'
import { torsionToReading } from '#shared/engine/dial'

const SEEDS = ['a', 'seed-2', 'quiz-7', '42']
const SIDE_OR_LEVEL = new Set(['right', 'left', 'standard', 'challenging'])

/** Words that would give the condition away: the template id's own words, whole. */
function conditionWords(templateId: string): RegExp[] {
  const words = templateId.split('-').filter(w => !SIDE_OR_LEVEL.has(w))
  return [
    ...words.map(w => new RegExp(`\\b${w}\\b`, 'i')),
    new RegExp(templateId.replace(/-(standard|challenging)$/, ''), 'i'),
    /long[- ]standing/i,
    /palsy|paresis|oblique|rectus|thyroid|skew|suppress|restrict|bilateral|normal/i,
  ]
}

describe('toPresentation never carries the truth', () => {
  for (const t of CASE_TEMPLATES) {
    for (const mode of MODES) {
      it(`${t.id} · ${mode}`, () => {
        for (const seed of SEEDS) {
          const c = generateCase(t, seed)
          const json = JSON.stringify(toPresentation(c, mode))
          for (const re of conditionWords(t.id)) expect(json).not.toMatch(re)
          expect(json).not.toMatch(/torsion/i)
          expect(json).not.toMatch(/excyclo|incyclo|extorsion|intorsion|extort|intort/i)
          expect(json).not.toMatch(/"(condition|templateId|template|palsiedMuscles|affectedEye|reported|label|sources|modelRecord|truth|difficulty|seed)"/)
          for (const m of MUSCLES) expect(json).not.toMatch(new RegExp(`\\b${m}\\b`))
          expect(json).not.toMatch(/DMR|Maddox/i)
          expect(json).not.toContain(revealTruth(c, 'primary', 'near').modelRecord)
          expect(json).not.toContain(c.label)
        }
      })
    }
  }
})

describe('what the presentation does carry', () => {
  it('learner-turns: the level reading per eye and position; patient-turns: none', () => {
    const c = generateCase('so-palsy-right', 'p')
    const lt = toPresentation(c, 'learner-turns')
    const pt = toPresentation(c, 'patient-turns')
    for (const g of GAZES) {
      expect(lt.positions[g].horizontalAt?.RE).toBeCloseTo(torsionToReading('RE', c.gazes[g].reported.RE), 1)
      expect(lt.positions[g].horizontalAt?.LE).toBeCloseTo(torsionToReading('LE', c.gazes[g].reported.LE), 1)
      expect(pt.positions[g].horizontalAt).toBeUndefined()
      expect(lt.positions[g].alignment.vertical).toBe(c.gazes[g].vertical)
    }
  })

  it('gives cover-test measurements for cases with vertical findings only', () => {
    expect(toPresentation(generateCase('so-palsy-right', 'p'), 'learner-turns').coverTest).toBeDefined()
    expect(toPresentation(generateCase('normal-standard', 'p'), 'learner-turns').coverTest).toBeUndefined()
  })

  it('says how the patient answers and which streaks they see', () => {
    const s = toPresentation(generateCase('suppression-standard', 'p'), 'learner-turns')
    expect(s.response.streaksSeen).toBe('one')
    expect(s.response.seenEye).toBeDefined()
    const coarse = toPresentation(generateCase('normal-challenging', 'p'), 'learner-turns')
    expect(coarse.response.reliability).toBe('coarse')
    expect(toPresentation(generateCase('normal-standard', 'p'), 'learner-turns').response.reliability).toBe('fine')
  })

  it('uses red and white streaks that also differ by pattern', () => {
    // red rod before one eye, white before the other (clinical-facts §2, R11–R13)
    const p = toPresentation(generateCase('normal', 'p'), 'learner-turns')
    expect(p.streaks.RE.colour).not.toBe(p.streaks.LE.colour)
    expect(p.streaks.RE.pattern).not.toBe(p.streaks.LE.pattern)
  })
})
