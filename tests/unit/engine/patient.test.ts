import { describe, expect, it } from 'vitest'
import { fc, test } from '@fast-check/vitest'
import { generateCase } from '~~/server/lib/engine/generator'
import { levelReadings, patientSays, patientSetsRods, patientView } from '~~/server/lib/engine/patient'
import { toPresentation } from '~~/server/lib/engine/presentation'
import { tiltAwareness } from '~~/server/lib/engine/opening'
import { CASE_TEMPLATES } from '~~/server/lib/engine/templates'
import { describeView } from '#shared/engine/words'
import { viewFromPresentation } from '#shared/engine/view'
import type { BenchSetting } from '#shared/engine/view'
import { GAZES } from '#shared/engine/types'
import { mirrorReading } from '#shared/engine/dial'

const setting = (over: Partial<BenchSetting> = {}): BenchSetting => ({
  gaze: 'primary',
  distance: 'near',
  readings: { RE: 90, LE: 90 },
  prisms: [],
  lights: 'dim',
  ...over,
})

describe('the bench and the server see the same patient', () => {
  test.prop([fc.constantFrom(...CASE_TEMPLATES.map(t => t.id)), fc.string({ minLength: 1, maxLength: 8 }), fc.constantFrom(...GAZES), fc.integer({ min: 60, max: 120 }), fc.integer({ min: 60, max: 120 })])(
    'words from the presentation equal words from the case (learner turns)',
    (id, seed, gaze, re, le) => {
      const c = generateCase(id, seed)
      const s = setting({ gaze, readings: { RE: re, LE: le }, prisms: [{ eye: 'RE', power: 6, base: 'down' }] })
      expect(describeView(viewFromPresentation(toPresentation(c, 'learner-turns'), s))).toEqual(patientSays(c, s))
    },
  )

  it('patient-turns presentations cannot build the view in the browser', () => {
    const c = generateCase('normal', 'x')
    expect(() => viewFromPresentation(toPresentation(c, 'patient-turns'), setting())).toThrow(/patient-turns/)
  })
})

describe('what the patient says', () => {
  it('an excyclotorted right eye sees its line slope down towards the nose; level at the §3.4 reading', () => {
    const c = generateCase('so-palsy-right', 'w')
    const s = setting({ prisms: [] })
    // clinical-facts §3.3: the excyclotorted eye's line slopes down toward the nose (derived R1, R20; 1921 text R13)
    const before = patientSays(c, s)
    expect(before.observations).toContainEqual(expect.objectContaining({ kind: 'slopes', eye: 'RE', towards: 'nose', lowEnd: 'left' }))
    expect(before.text).toMatch(/red line slopes .*down to my left, towards my nose/)
    const level = levelReadings(c, 'primary', [])
    const after = patientSays(c, { ...s, readings: level })
    expect(after.observations).toContainEqual({ kind: 'level', eye: 'RE' })
    expect(after.observations).toContainEqual({ kind: 'parallel', level: true })
  })

  it('says it cannot see a line pushed out of the field, and a prism brings it back', () => {
    const c = generateCase('long-standing-so-palsy-challenging', 'big')
    const g = GAZES.find(x => Math.abs(c.gazes[x].vertical) > 22)!
    expect(g).toBeDefined()
    const hidden = patientSays(c, setting({ gaze: g }))
    expect(hidden.observations.some(o => o.kind === 'out-of-view')).toBe(true)
    expect(hidden.text).toMatch(/can't see the (red|white) line/)
    const v = c.gazes[g].vertical
    const prism = { eye: 'RE' as const, power: Math.round(Math.abs(v) - 8), base: v > 0 ? ('down' as const) : ('up' as const) }
    const back = patientSays(c, setting({ gaze: g, prisms: [prism] }))
    expect(back.observations.some(o => o.kind === 'out-of-view')).toBe(false)
  })

  it('says the lines are on top of each other with no vertical separation', () => {
    const c = generateCase('normal-standard', 'n')
    expect(patientSays(c, setting()).observations).toContainEqual(expect.objectContaining({ kind: 'overlap' }))
    const separated = patientSays(c, setting({ prisms: [{ eye: 'RE', power: 6, base: 'down' }] }))
    expect(separated.observations.some(o => o.kind === 'overlap')).toBe(false)
  })

  it('a suppressing patient sees one line only', () => {
    const c = generateCase('suppression-standard', 'sup')
    const w = patientSays(c, setting())
    expect(w.observations).toContainEqual({ kind: 'one-line', seen: c.response.seenEye })
    expect(w.text).toMatch(/only see one line/)
  })

  it('an intermittently suppressing patient sometimes sees both lines, the same way for the same setting', () => {
    const c = generateCase('suppression-challenging', 'sup')
    const seen = new Set<boolean>()
    for (let a = 80; a <= 100; a++) {
      const s = setting({ readings: { RE: a, LE: 90 }, prisms: [{ eye: 'RE', power: 6, base: 'down' }] })
      const one = patientView(c, s).streaks[c.response.seenEye === 'RE' ? 'LE' : 'RE'].suppressed
      seen.add(one)
      expect(patientView(c, s).streaks).toEqual(patientView(c, s).streaks)
    }
    expect(seen.size).toBe(2)
  })

  it('a coarse patient words things less precisely than a fine one', () => {
    const fine = generateCase('normal-standard', 'c')
    const coarse = generateCase('normal-challenging', 'c')
    const words = (c: typeof fine) =>
      Array.from({ length: 30 }, (_, i) => patientSays(c, setting({ readings: { RE: 80 + i, LE: 100 - i }, prisms: [{ eye: 'RE', power: 6, base: 'down' }] })).text)
    const precise = (ts: string[]) => ts.filter(t => /towards my (nose|ear)/.test(t)).length
    expect(precise(words(coarse))).toBeLessThan(precise(words(fine)))
  })

  it('the words are deterministic', () => {
    const c = generateCase('normal-challenging', 'd')
    const s = setting({ readings: { RE: 93, LE: 88 }, prisms: [{ eye: 'LE', power: 4, base: 'up' }] })
    expect(patientSays(c, s)).toEqual(patientSays(c, s))
  })

  it('mirror symmetry: the mirrored patient with mirrored dials says the mirrored words', () => {
    const r = generateCase('so-palsy-right', 'm')
    const l = generateCase('so-palsy-left', 'm')
    const prisms = [{ eye: 'RE' as const, power: 4, base: 'down' as const }]
    const mirrored = [{ eye: 'LE' as const, power: 4, base: 'down' as const }]
    for (const [re, le] of [[90, 90], [95, 88], [100, 84]] as const) {
      const a = patientView(r, setting({ readings: { RE: re, LE: le }, prisms }))
      const b = patientView(l, setting({ readings: { RE: mirrorReading(le), LE: mirrorReading(re) }, prisms: mirrored }))
      expect(b.streaks.LE.perceivedAngle).toBeCloseTo(-a.streaks.RE.perceivedAngle, 9)
      expect(b.streaks.RE.perceivedAngle).toBeCloseTo(-a.streaks.LE.perceivedAngle, 9)
      expect(b.overlap).toBe(a.overlap)
    }
  })
})

describe('patient turns the rods', () => {
  it('is reproducible per trial and varies between trials', () => {
    const c = generateCase('so-palsy-right-challenging', 'turn')
    const a = patientSetsRods(c, { gaze: 'primary', distance: 'near', trial: 1 })
    expect(patientSetsRods(c, { gaze: 'primary', distance: 'near', trial: 1 })).toEqual(a)
    expect(patientSetsRods(c, { gaze: 'primary', distance: 'near', trial: 2 }).readings).not.toEqual(a.readings)
  })

  it('scatters around the level reading with the patient\'s SD', () => {
    const c = generateCase('so-palsy-right-challenging', 'sd')
    const centre = levelReadings(c, 'primary', [])
    const xs = Array.from({ length: 1500 }, (_, i) => patientSetsRods(c, { gaze: 'primary', distance: 'near', trial: i + 1 }).readings.RE)
    const m = xs.reduce((a, b) => a + b, 0) / xs.length
    const sd = Math.sqrt(xs.reduce((a, b) => a + (b - m) ** 2, 0) / (xs.length - 1))
    expect(m).toBeCloseTo(centre.RE, 0)
    expect(sd).toBeGreaterThan(c.response.reliabilitySd * 0.9)
    expect(sd).toBeLessThan(c.response.reliabilitySd * 1.1)
  })

  it('repeat settings spread like published test–retest data', () => {
    // Liebermann et al., J AAPOS 2018;22:146: 95% limits of agreement ±4.7° between sessions
    const diffs: number[] = []
    for (const t of CASE_TEMPLATES.filter(x => x.family !== 'suppression')) {
      for (let s = 0; s < 40; s++) {
        const c = generateCase(t, `rt-${s}`)
        const a = patientSetsRods(c, { gaze: 'primary', distance: 'near', prisms: [{ eye: 'RE', power: 6, base: 'down' }], trial: 1 })
        const b = patientSetsRods(c, { gaze: 'primary', distance: 'near', prisms: [{ eye: 'RE', power: 6, base: 'down' }], trial: 2 })
        diffs.push(a.readings.RE - b.readings.RE)
      }
    }
    const sd = Math.sqrt(diffs.reduce((a, d) => a + d * d, 0) / diffs.length)
    const halfWidth = 1.96 * sd
    expect(halfWidth).toBeGreaterThan(4.7 - 1.5)
    expect(halfWidth).toBeLessThan(4.7 + 1.5)
  })

  it('describes the rods as level where they left them, whatever their scatter', () => {
    // The patient stops where the lines look level to them (their misjudgement is
    // invisible to them), so their words never contradict their own setting.
    let checked = 0
    for (let s = 0; s < 60; s++) {
      const c = generateCase('so-palsy-right-challenging', `words-${s}`)
      const prisms = [{ eye: 'RE' as const, power: 6, base: 'down' as const }]
      const turned = patientSetsRods(c, { gaze: 'primary', distance: 'near', prisms, trial: 1 })
      const kinds = turned.words.observations.map(o => o.kind)
      expect(kinds).not.toContain('slopes')
      expect(kinds).not.toContain('not-parallel')
      checked++
    }
    expect(checked).toBe(60)
  })

  it('leaves a rod it cannot see at 90°', () => {
    const c = generateCase('suppression-standard', 'turn')
    const hidden = c.response.seenEye === 'RE' ? 'LE' : 'RE'
    expect(patientSetsRods(c, { gaze: 'primary', distance: 'near', trial: 1 }).readings[hidden]).toBe(90)
  })

  it('turns the rod the same way as the eye is torted', () => {
    // domain.md §3.3: the patient turns the rod in the same direction as the eye's torsion
    const c = generateCase('so-palsy-right', 'dir')
    const xs = Array.from({ length: 20 }, (_, i) => patientSetsRods(c, { gaze: 'down', distance: 'near', trial: i + 1 }).readings.RE)
    // RE excyclo → reading above 90 (common practice, derived from ISO 8429:1986)
    expect(xs.filter(x => x > 90).length).toBeGreaterThan(15)
  })
})

describe('opening words', () => {
  it('follow the published awareness of tilt', () => {
    // Arch Ophthalmol 1984;102:717-20: 55% at 5°, 86% at 10°, all at 15°
    expect(tiltAwareness(5)).toBeCloseTo(0.55)
    expect(tiltAwareness(10)).toBeCloseTo(0.86)
    expect(tiltAwareness(15)).toBe(1)
    expect(tiltAwareness(20)).toBe(1)
    expect(tiltAwareness(0)).toBe(0)
  })

  it('an under-reporting patient never complains of tilt', () => {
    for (let s = 0; s < 40; s++) expect(generateCase('long-standing-so-palsy', `o${s}`).opening).not.toMatch(/tilted|slanted/)
  })
})
