import { describe, expect, it } from 'vitest'
import { fc, test } from '@fast-check/vitest'
import { generateCase } from '~~/server/lib/engine/generator'
import { gradeAttempt, gradeKnownFinding, mustNotTest, revealTruth } from '~~/server/lib/engine/attempt'
import { gradeRecord } from '~~/server/lib/engine/grader'
import { NOT_PERFORMED_RECORD, modelRecord } from '~~/server/lib/engine/model-record'
import { levelReadings, patientSetsRods } from '~~/server/lib/engine/patient'
import { CASE_TEMPLATES } from '~~/server/lib/engine/templates'
import { torsionToReading } from '#shared/engine/dial'
import { findRuleSwap } from '#shared/engine/slips'
import { DISTANCES, GAZES } from '#shared/engine/types'
import type { Eye } from '#shared/engine/types'

const TESTABLE = CASE_TEMPLATES.filter(t => t.family !== 'suppression').map(t => t.id)
const arbTemplate = fc.constantFrom(...TESTABLE)
const arbSeed = fc.string({ minLength: 1, maxLength: 12 })
const arbGaze = fc.constantFrom(...GAZES)
const arbDistance = fc.constantFrom(...DISTANCES)
const arbTolerance = fc.double({ min: 0.5, max: 5, noNaN: true })
const slipCodes = (r: { slips: { code: string }[] }) => r.slips.map(s => s.code)
const markOf = (r: { marks: { criterion: string, score: number }[] }, c: string) => r.marks.find(m => m.criterion === c)?.score

describe('properties', () => {
  test.prop([arbTemplate, arbSeed, arbGaze, arbDistance, arbTolerance])(
    'a perfect record scores full marks (learner turns)',
    (id, seed, gaze, distance, tolerance) => {
      const c = generateCase(id, seed)
      const readings = levelReadings(c, gaze, [])
      const record = modelRecord({ torsion: c.gazes[gaze].reported, gaze, distance, tolerance })
      const r = gradeAttempt(c, { gaze, distance, readings, record }, { mode: 'learner-turns', options: { tolerance } })
      expect(r.slips).toEqual([])
      expect(r.score).toBe(1)
    },
  )

  test.prop([arbTemplate, arbSeed, arbGaze, fc.integer({ min: 1, max: 50 })])(
    'a perfect record scores full marks (patient turns, reading the rods where the patient left them)',
    (id, seed, gaze, trial) => {
      const c = generateCase(id, seed)
      const readings = patientSetsRods(c, { gaze, distance: 'near', trial }).readings
      const record = modelRecord({ torsion: c.gazes[gaze].reported, gaze, distance: 'near' })
      const r = gradeAttempt(c, { gaze, distance: 'near', readings, record }, { mode: 'patient-turns', trial })
      expect(r.slips).toEqual([])
      expect(r.score).toBe(1)
    },
  )

  test.prop([arbTemplate, arbSeed, arbGaze])('reversing only the direction yields only direction-reversed', (id, seed, gaze) => {
    const c = generateCase(id, seed)
    const t = c.gazes[gaze].reported
    // signed findings (domain.md §5.2): every eye with 1° or more has a direction to reverse
    const torted = (['RE', 'LE'] as Eye[]).filter(e => Math.abs(t[e]) >= 1)
    fc.pre(torted.length > 0)
    const good = modelRecord({ torsion: t, gaze, distance: 'near' })
    const reversed = good.replace(/excyclotorsion|incyclotorsion/g, w => (w === 'excyclotorsion' ? 'incyclotorsion' : 'excyclotorsion'))
    const r = gradeAttempt(c, { gaze, distance: 'near', readings: levelReadings(c, gaze, []), record: reversed }, { mode: 'learner-turns' })
    expect(new Set(slipCodes(r))).toEqual(new Set(['direction-reversed']))
    expect(r.slips.map(s => s.eye).sort()).toEqual(torted.sort())
    for (const m of r.marks) if (m.criterion !== 'direction') expect(m.score).toBe(1)
    expect(markOf(r, 'direction')).toBeLessThan(1)
  })

  test.prop([arbTemplate, arbSeed, arbGaze])('writing the dial reading as the amount yields dial-value-as-amount', (id, seed, gaze) => {
    const c = generateCase(id, seed)
    const t = c.gazes[gaze].reported
    const readings = levelReadings(c, gaze, [])
    const eyeText = (e: Eye) => `${e} ${Math.round(readings[e])}° ${t[e] >= 0 ? 'excyclotorsion' : 'incyclotorsion'}`
    const record = `DMR, near, ${gaze === 'primary' ? 'primary position' : gaze.replace('-', ' and ') + (gaze.includes('-') ? '' : ' gaze')}: ${eyeText('RE')}, ${eyeText('LE')}.`
    const r = gradeAttempt(c, { gaze, distance: 'near', readings, record }, { mode: 'learner-turns' })
    expect(new Set(slipCodes(r))).toEqual(new Set(['dial-value-as-amount']))
    expect(r.slips.map(s => s.eye).sort()).toEqual(['LE', 'RE'])
  })

  test.prop([fc.constantFrom('so-palsy', 'io-palsy', 'sr-palsy', 'ir-palsy'), arbSeed, arbGaze])(
    'mirror symmetry: the mirrored record on the mirrored case scores the same',
    (family, seed, gaze) => {
      const right = generateCase(`${family}-right`, seed)
      const left = generateCase(`${family}-left`, seed)
      const mirrorGaze = gaze.replace(/right|left/, s => (s === 'right' ? 'left' : 'right')) as typeof gaze
      const record = (c: typeof right, g: typeof gaze) => {
        const t = c.gazes[g].reported
        // a deliberately imperfect record: right eye doubled, left eye reversed
        return modelRecord({ torsion: { RE: t.RE * 2, LE: -t.LE }, gaze: g, distance: 'near' })
      }
      const swapEyes = (s: string) => s.replace(/\b(RE|LE)\b/g, e => (e === 'RE' ? 'LE' : 'RE'))
      const rr = gradeAttempt(right, { gaze, distance: 'near', readings: levelReadings(right, gaze, []), record: record(right, gaze) }, { mode: 'learner-turns' })
      const lr = gradeAttempt(
        left,
        { gaze: mirrorGaze, distance: 'near', readings: levelReadings(left, mirrorGaze, []), record: swapEyes(record(right, gaze)).replace(/(right|left)( gaze|$)/, (_m, s: string, rest: string) => `${s === 'right' ? 'left' : 'right'}${rest}`).replace(/and (right|left)/, (_m, s: string) => `and ${s === 'right' ? 'left' : 'right'}`) },
        { mode: 'learner-turns' },
      )
      expect(lr.score).toBeCloseTo(rr.score, 10)
      expect(lr.slips.map(s => `${s.code}:${s.eye === 'RE' ? 'LE' : s.eye === 'LE' ? 'RE' : '-'}`).sort()).toEqual(
        rr.slips.map(s => `${s.code}:${s.eye ?? '-'}`).sort(),
      )
    },
  )
})

describe('error carried forward', () => {
  const finding = { RE: 8, LE: 0 }

  it('a record that converts the learner\'s own wrong reading correctly loses only the measurement mark', () => {
    // reading 85° on the right eye = 5° incyclo by the rule (common practice, derived from ISO 8429:1986)
    const r = gradeRecord({ record: 'DMR N primary: RE 5° incyclo, LE no torsion', expected: finding, gaze: 'primary', distance: 'near', readings: { RE: 85, LE: 90 } })
    expect(slipCodes(r)).toEqual(['not-parallel'])
    expect(r.slips[0]!.eye).toBe('RE')
    expect(markOf(r, 'measurement')).toBeLessThan(1)
    for (const c of ['direction', 'amount', 'eye', 'test', 'gaze', 'distance']) expect(markOf(r, c)).toBe(1)
    expect(r.explanation.join(' ')).toMatch(/carried forward/)
  })

  it('a wrong conversion of the learner\'s own reading is not rescued', () => {
    const readings = { RE: 85, LE: 90 }
    const wrong = gradeRecord({ record: 'DMR N primary: RE 5° excyclo, LE no torsion', expected: finding, gaze: 'primary', distance: 'near', readings })
    const carried = gradeRecord({ record: 'DMR N primary: RE 5° incyclo, LE no torsion', expected: finding, gaze: 'primary', distance: 'near', readings })
    expect(wrong.score).toBeLessThan(carried.score)
    expect(slipCodes(wrong)).toContain('not-parallel')
    expect(slipCodes(wrong).some(c => c === 'amount-off' || c === 'direction-reversed')).toBe(true)
  })

  it('the left-eye rule applied to the right eye reverses the direction', () => {
    // RE at 98°: right-eye rule → 8° excyclo; left-eye rule (90 − 98) → 8° incyclo
    const r = gradeRecord({ record: 'DMR N primary: RE 8° incyclo, LE no torsion', expected: finding, gaze: 'primary', distance: 'near', readings: { RE: 98, LE: 90 } })
    expect(slipCodes(r)).toEqual(['direction-reversed'])
  })
})

describe('slips per field', () => {
  const finding = { RE: 8, LE: 0 }
  const grade = (record: string, extra: object = {}) => gradeRecord({ record, expected: finding, gaze: 'primary', distance: 'near', ...extra })

  it('torsion written against the other eye → eye-wrong, attributed to the torted eye', () => {
    const r = grade('DMR N primary: LE 8° excyclo, RE no torsion')
    expect(r.slips).toEqual([expect.objectContaining({ code: 'eye-wrong', eye: 'RE' })])
    expect(markOf(r, 'eye')).toBe(0)
    expect(markOf(r, 'amount')).toBe(1)
  })

  it('missing test, gaze, direction', () => {
    const r = grade('RE 8, LE 0')
    expect(new Set(slipCodes(r))).toEqual(new Set(['test-unnamed', 'gaze-missing', 'direction-missing']))
    expect(markOf(r, 'distance')).toBe(0)
  })

  it('missing amount and missing eye', () => {
    expect(slipCodes(grade('DMR N primary: RE excyclo, LE nil'))).toEqual(['amount-missing'])
    expect(slipCodes(grade('DMR N primary: 8° excyclo'))).toContain('eye-missing')
    expect(slipCodes(grade('DMR N primary: LE nil'))).toEqual(['eye-missing'])
  })

  it('amount outside tolerance, with partial credit inside twice it', () => {
    // a per-eye criterion takes the worse eye: here RE (partial or none), LE full
    const r = grade('DMR N primary: RE 11° ex, LE nil')
    expect(slipCodes(r)).toEqual(['amount-off'])
    expect(markOf(r, 'amount')).toBe(0.5)
    expect(markOf(grade('DMR N primary: RE 14° ex, LE nil'), 'amount')).toBe(0)
    expect(markOf(grade('DMR N primary: RE 11° ex, LE nil', { options: { tolerance: 3 } }), 'amount')).toBe(1)
  })

  it('weights are configurable', () => {
    const heavy = grade('DMR N primary: RE 14° ex, LE nil', { options: { weights: { amount: 20 } } })
    const light = grade('DMR N primary: RE 14° ex, LE nil')
    expect(heavy.score).toBeLessThan(light.score)
    expect(heavy.points.possible).toBeGreaterThan(light.points.possible)
  })

  it('the wrong position of gaze loses the gaze mark', () => {
    const r = grade('DMR N downgaze: RE 8 ex, LE nil')
    expect(markOf(r, 'gaze')).toBe(0)
    expect(markOf(r, 'amount')).toBe(1)
  })

  it('grades the part of a multi-position record that matches the position tested', () => {
    const r = gradeRecord({ record: 'DMR N primary: RE 3 ex, LE 0; downgaze: RE 8 ex, LE 0', expected: finding, gaze: 'down', distance: 'near' })
    expect(r.slips).toEqual([])
  })

  it('"no torsion" for a torted eye loses direction and amount', () => {
    const r = grade('DMR N primary: RE no torsion, LE no torsion')
    expect(markOf(r, 'direction')).toBe(0)
    expect(slipCodes(r)).toEqual(['amount-off'])
  })

  it('a total-only record is graded on the total and loses the eye mark', () => {
    const r = grade('DMR N primary: total 8° ex')
    expect(markOf(r, 'amount')).toBe(1)
    expect(slipCodes(r)).toEqual(['eye-missing'])
  })
})

describe('when the test should not be done', () => {
  const c = generateCase('suppression-standard', 's')

  it('knows the suppression cases', () => {
    expect(mustNotTest(c)).toBe(true)
    expect(mustNotTest(generateCase('suppression-challenging', 's'))).toBe(true)
    expect(mustNotTest(generateCase('so-palsy-right', 's'))).toBe(false)
  })

  it('a torsion record on a suppressing patient → should-not-test', () => {
    const r = gradeAttempt(c, { gaze: 'primary', distance: 'near', readings: { RE: 90, LE: 90 }, record: 'DMR N primary: RE 1 ex, LE 1 ex' }, { mode: 'learner-turns' })
    expect(slipCodes(r)).toEqual(['should-not-test'])
    expect(r.score).toBeLessThan(0.5)
  })

  it('stopping and saying why scores full marks', () => {
    for (const record of [NOT_PERFORMED_RECORD, 'DMR not performed: sees one streak only — suppression', 'DMR not done, suppresses LE']) {
      const r = gradeAttempt(c, { gaze: 'primary', distance: 'near', readings: { RE: 90, LE: 90 }, record }, { mode: 'learner-turns' })
      expect(r.score).toBe(1)
      expect(r.slips).toEqual([])
    }
  })

  it('stopping without a reason loses the reason mark only', () => {
    const r = gradeAttempt(c, { gaze: 'primary', distance: 'near', readings: { RE: 90, LE: 90 }, record: 'DMR not performed' }, { mode: 'learner-turns' })
    expect(markOf(r, 'action')).toBe(1)
    expect(markOf(r, 'reason')).toBe(0)
  })

  it('"not performed" on a patient who sees both streaks scores nothing for the finding', () => {
    const p = generateCase('so-palsy-right', 's')
    const r = gradeAttempt(p, { gaze: 'primary', distance: 'near', readings: levelReadings(p, 'primary', []), record: 'DMR not performed: suppression' }, { mode: 'learner-turns' })
    expect(markOf(r, 'amount')).toBe(0)
    expect(r.score).toBeLessThan(0.3)
  })
})

describe('patient-turns measurement', () => {
  it('is reading the scale where the patient left the rod', () => {
    const c = generateCase('so-palsy-right', 'pt')
    const set = patientSetsRods(c, { gaze: 'primary', distance: 'near', trial: 3 }).readings
    const record = modelRecord({ torsion: c.gazes.primary.reported, gaze: 'primary', distance: 'near' })
    const misread = gradeAttempt(c, { gaze: 'primary', distance: 'near', readings: { RE: set.RE + 4, LE: set.LE }, record }, { mode: 'patient-turns', trial: 3 })
    expect(slipCodes(misread)).toEqual(['not-parallel'])
    expect(markOf(misread, 'measurement')).toBe(0)
  })
})

describe('record checker', () => {
  it('grades a record against a known finding without a case', () => {
    const r = gradeKnownFinding({ torsion: { RE: 8, LE: 0 }, gaze: 'primary', record: 'DMR N primary: RE 8° ex, LE nil' })
    expect(r.score).toBe(1)
    expect(r.marks.map(m => m.criterion)).not.toContain('distance')
    expect(r.readAs).toContain('RE 8° excyclo')
  })

  it('uses the tutor\'s tolerance', () => {
    const tight = gradeKnownFinding({ torsion: { RE: 8, LE: 0 }, record: 'DMR N primary: RE 10 ex, LE nil', tolerance: 1 })
    const loose = gradeKnownFinding({ torsion: { RE: 8, LE: 0 }, record: 'DMR N primary: RE 10 ex, LE nil', tolerance: 3 })
    expect(markOf(tight, 'amount')).toBe(0.5)
    expect(markOf(loose, 'amount')).toBe(1)
  })

  it('grades the measurement when readings are given', () => {
    // RE 8° excyclo is level at 98° (common practice, derived from ISO 8429:1986)
    const r = gradeKnownFinding({ torsion: { RE: 8, LE: 0 }, readings: { RE: 98 }, record: 'DMR N primary RE 8 ex LE 0' })
    expect(markOf(r, 'measurement')).toBe(1)
  })
})

describe('truth and explanation', () => {
  it('reveals the finding, the model record and the rule after an attempt', () => {
    const c = generateCase('so-palsy-right', 't')
    const truth = revealTruth(c, 'down', 'near')
    expect(truth.torsion).toEqual(c.gazes.down.reported)
    expect(truth.directions.RE).toBe('excyclo')
    expect(truth.levelAt.RE).toBeCloseTo(torsionToReading('RE', c.gazes.down.reported.RE), 1)
    const r = gradeAttempt(c, { gaze: 'down', distance: 'near', readings: levelReadings(c, 'down', []), record: truth.modelRecord }, { mode: 'learner-turns' })
    expect(r.score).toBe(1)
    expect(r.explanation.join(' ')).toMatch(/reading − 90/)
  })

  it('explains the under-reporting patient and the prism artefact', () => {
    const c = generateCase('long-standing-so-palsy', 't')
    const prisms = [{ eye: 'RE' as const, power: 10, base: 'down' as const }]
    const r = gradeAttempt(c, { gaze: 'primary', distance: 'near', readings: levelReadings(c, 'primary', prisms), prisms, record: 'DMR N primary RE nil LE nil' }, { mode: 'learner-turns' })
    const text = r.explanation.join(' ')
    expect(text).toMatch(/fundus/)
    // Marsh et al., Am Orthopt J 2014;64:76-80: 1.6° at 10Δ
    expect(text).toMatch(/1\.6° of apparent excyclotorsion/)
  })

  it('grades the interpretation alongside when given', () => {
    const c = generateCase('so-palsy-left', 'i')
    const r = gradeAttempt(
      c,
      { gaze: 'primary', distance: 'near', readings: levelReadings(c, 'primary', []), record: 'x', interpretation: { higherEye: 'LE', worseGaze: 'right', worseTilt: 'left', muscle: 'LSO' } },
      { mode: 'learner-turns' },
    )
    expect(r.interpretation?.score).toBe(1)
  })
})

describe('left-right-rule-swapped across attempts', () => {
  it('flags direction reversed for one eye only, repeatedly, where the other eye\'s torsion was recorded the right way', () => {
    // issue 11: only attempts whose other eye was torted (1° or more) and recorded rightly tell a swap from recording the image
    const reversedLE = { slips: [{ code: 'direction-reversed' as const, eye: 'LE' as const }], torsion: { RE: 5, LE: 4 }, recorded: { RE: 'excyclo', LE: 'incyclo' } }
    const clean = { slips: [] }
    const imageOnLeftOnly = { slips: [{ code: 'direction-reversed' as const, eye: 'LE' as const }], torsion: { RE: 0.5, LE: 4 }, recorded: { RE: 'none', LE: 'incyclo' } }
    expect(findRuleSwap([imageOnLeftOnly, clean, imageOnLeftOnly])).toBeNull()
    expect(findRuleSwap([reversedLE, clean, reversedLE])).toEqual(expect.objectContaining({ code: 'left-right-rule-swapped', eye: 'LE' }))
    expect(findRuleSwap([reversedLE, clean])).toBeNull()
    const both = { slips: [{ code: 'direction-reversed' as const, eye: 'LE' as const }, { code: 'direction-reversed' as const, eye: 'RE' as const }] }
    // reversing both eyes is recording the image, not swapping the rule
    expect(findRuleSwap([both, both, both])).toBeNull()
    const reversedRE = { slips: [{ code: 'direction-reversed' as const, eye: 'RE' as const }] }
    expect(findRuleSwap([reversedLE, reversedLE, reversedRE])).toBeNull()
    expect(findRuleSwap([reversedLE, reversedLE, imageOnLeftOnly])).toEqual(expect.objectContaining({ eye: 'LE' }))
  })
})
