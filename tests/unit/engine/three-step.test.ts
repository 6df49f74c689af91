import { describe, expect, it } from 'vitest'
import { generateCase } from '~~/server/lib/engine/generator'
import { gradeInterpretation, threeStep, threeStepCandidates, threeStepFromCase } from '~~/server/lib/engine/three-step'
import type { Case } from '~~/server/lib/engine/types'
import type { Eye, Muscle, Side } from '#shared/engine/types'

// Parks, Arch Ophthalmol 1958;60:1027-35 — the table as domain.md §7 prints it
// (row 1 also published in clinical-facts R61/R63/R64; the others derived by the same logic).
const TABLE: ReadonlyArray<readonly [Eye, Side, Side, Muscle, string]> = [
  ['RE', 'left', 'right', 'RSO', 'so-palsy-right'],
  ['RE', 'left', 'left', 'LSR', 'sr-palsy-left'],
  ['RE', 'right', 'left', 'RIR', 'ir-palsy-right'],
  ['RE', 'right', 'right', 'LIO', 'io-palsy-left'],
  ['LE', 'right', 'left', 'LSO', 'so-palsy-left'],
  ['LE', 'right', 'right', 'RSR', 'sr-palsy-right'],
  ['LE', 'left', 'right', 'LIR', 'ir-palsy-left'],
  ['LE', 'left', 'left', 'RIO', 'io-palsy-right'],
]

/** Read the three answers straight off the generated numbers. */
function observed(c: Case): [Eye, Side, Side] {
  const v0 = c.gazes.primary.vertical
  const higher: Eye = v0 > 0 ? 'RE' : 'LE'
  const s = Math.sign(v0)
  const gaze: Side = s * c.gazes.right.vertical > s * c.gazes.left.vertical ? 'right' : 'left'
  const tilt: Side = s * c.headTilt.right > s * c.headTilt.left ? 'right' : 'left'
  return [higher, gaze, tilt]
}

const seeds = Array.from({ length: 60 }, (_, i) => `ts-${i}`)

describe('three-step table against generated cases', () => {
  it.each(TABLE.map(r => [r[3], r] as const))('%s palsy: generated vertical pattern gives its row', (_m, [eye, gaze, tilt, muscle, base]) => {
    for (const difficulty of ['standard', 'challenging']) {
      for (const seed of seeds) {
        const c = generateCase(`${base}-${difficulty}`, seed)
        expect(c.palsiedMuscles).toEqual([muscle])
        expect(observed(c)).toEqual([eye, gaze, tilt])
        // the engine's own lookup agrees with the table
        expect(threeStep({ higherEye: eye, worseGaze: gaze, worseTilt: tilt })).toBe(muscle)
        expect(threeStepFromCase(c)).toEqual({ higherEye: eye, worseGaze: gaze, worseTilt: tilt })
      }
    }
  })

  it('long-standing SO palsy follows the SO rows too', () => {
    for (const difficulty of ['standard', 'challenging']) {
      for (const seed of seeds) {
        const c = generateCase(`long-standing-so-palsy-${difficulty}`, seed)
        const row = TABLE.find(r => r[3] === (c.affectedEye === 'RE' ? 'RSO' : 'LSO'))!
        expect(observed(c)).toEqual([row[0], row[1], row[2]])
      }
    }
  })

  it('narrows 8 → 4 → 2 → 1', () => {
    // clinical-facts §6.2 (R62): step 1 leaves four candidates, step 2 two, step 3 one
    expect(threeStepCandidates({ higherEye: 'RE' }).sort()).toEqual(['LIO', 'LSR', 'RIR', 'RSO'])
    expect(threeStepCandidates({ higherEye: 'RE', worseGaze: 'left' }).sort()).toEqual(['LSR', 'RSO'])
    expect(threeStepCandidates({ higherEye: 'LE', worseGaze: 'left', worseTilt: 'left' })).toEqual(['RIO'])
  })
})

describe('grading the interpretation', () => {
  it('gives full marks for the right steps and muscle, and says the test assumes one palsied muscle', () => {
    const c = generateCase('so-palsy-right', 'interp')
    const r = gradeInterpretation(c, { higherEye: 'RE', worseGaze: 'left', worseTilt: 'right', muscle: 'RSO' })
    expect(r.score).toBe(1)
    expect(r.answer).toBe('RSO')
    expect(r.explanation.join(' ')).toMatch(/single palsied/)
  })

  it('marks a wrong step and gives half for a muscle that follows from it', () => {
    const c = generateCase('so-palsy-right', 'interp')
    const r = gradeInterpretation(c, { higherEye: 'RE', worseGaze: 'left', worseTilt: 'left', muscle: 'LSR' })
    const byCrit = Object.fromEntries(r.marks.map(m => [m.criterion, m.score]))
    expect(byCrit).toEqual({ 'higher-eye': 1, 'worse-gaze': 1, 'worse-tilt': 0, 'muscle': 0.5 })
  })

  it.each(['ted-ir-restriction-standard', 'skew-deviation-standard'])('%s: the three-step test does not apply, and it says so', (id) => {
    const c = generateCase(id, 'na')
    const wrong = gradeInterpretation(c, { muscle: 'RSO' })
    expect(wrong.answer).toBe('not-applicable')
    expect(wrong.marks.find(m => m.criterion === 'muscle')!.score).toBe(0)
    expect(wrong.explanation.join(' ')).toMatch(/does not apply/)
    const right = gradeInterpretation(c, { muscle: 'not-applicable' })
    expect(right.marks.find(m => m.criterion === 'muscle')!.score).toBe(1)
  })

  it('bilateral SO palsy: not a single muscle', () => {
    const r = gradeInterpretation(generateCase('bilateral-so-palsy', 'b'), { muscle: 'not-applicable' })
    expect(r.answer).toBe('not-applicable')
    expect(r.explanation.join(' ')).toMatch(/single palsied muscle/)
  })
})
