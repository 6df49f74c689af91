import { describe, expect, it } from 'vitest'
import { fc, test } from '@fast-check/vitest'
import { GENERATOR_VERSION, generateCase } from '~~/server/lib/engine/generator'
import { CASE_TEMPLATES } from '~~/server/lib/engine/templates'
import type { Case } from '~~/server/lib/engine/types'
import { FUNDUS_VERSION, fundusForCase } from '~~/server/lib/fundus/generate'
import { discFoveaAngle, distance } from '#shared/engine/fundus/geometry'
import { NORMAL_DISC_FOVEA_ANGLE, NORMAL_DISC_FOVEA_HORIZONTAL, findingForAngle } from '#shared/engine/fundus/normals'
import { gradeFundus } from '~~/server/lib/fundus/grade'
import { fundusScene } from '#shared/engine/fundus/scene'
import { EYES } from '#shared/engine/types'
import type { Eye } from '#shared/engine/types'

const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length
const sd = (xs: number[]) => {
  const m = mean(xs)
  return Math.sqrt(xs.reduce((a, b) => a + (b - m) ** 2, 0) / (xs.length - 1))
}
/** SD of a normal distribution kept within ±2 SD, as a share of the untruncated SD. */
const TRUNCATED_SD_SHARE = (() => {
  const phi2 = Math.exp(-2) / Math.sqrt(2 * Math.PI) // density at 2 SD
  const inside = 0.9544997 // P(|Z| ≤ 2)
  return Math.sqrt(1 - (2 * 2 * phi2) / inside)
})()

const withTorsion = (c: Case, eye: Eye, t: number): Case => ({
  ...c,
  gazes: { ...c.gazes, primary: { ...c.gazes.primary, torsion: { ...c.gazes.primary.torsion, [eye]: t } } },
})

describe('normal eyes follow the published distribution', () => {
  const cases = Array.from({ length: 3000 }, (_, i) => fundusForCase(generateCase('normal-standard', `n-${i}`)))

  for (const eye of EYES) {
    it(`${eye}: normal-eye angle mean and spread match J Korean Ophthalmol Soc 2005 (kept within ±2 SD)`, () => {
      // J Korean Ophthalmol Soc 2005;46(10):1684-9: 6.26 ± 2.98° RE, 6.69 ± 2.84° LE
      const published = eye === 'RE' ? { mean: 6.26, sd: 2.98 } : { mean: 6.69, sd: 2.84 }
      expect(NORMAL_DISC_FOVEA_ANGLE[eye]).toEqual(published)
      const angles = cases.map(f => f.eyes[eye].normalAngle)
      expect(Math.abs(mean(angles) - published.mean)).toBeLessThan(0.2)
      // a normal kept within ±2 SD has 0.88 of the SD (truncated-normal formula)
      expect(Math.abs(sd(angles) - published.sd * TRUNCATED_SD_SHARE)).toBeLessThan(0.15)
      for (const a of angles) expect(Math.abs(a - published.mean)).toBeLessThanOrEqual(2 * published.sd + 0.05)
    })
  }

  it('the fovea lies about 0.3 DD below the disc-centre horizontal at about 2.6 DD', () => {
    // Bixenman & von Noorden, Ophthalmology 1982 (about 0.3 DD below); J Korean Ophthalmol Soc
    // 2005;46(10):1684-9 (2.59 ± 0.26 DD across, 0.29 ± 0.14 DD down)
    expect(NORMAL_DISC_FOVEA_HORIZONTAL).toEqual({ mean: 2.59, sd: 0.26 })
    const across = cases.flatMap(f => EYES.map(e => f.eyes[e].horizontal))
    const down = cases.flatMap(f => EYES.map(e => f.eyes[e].horizontal * Math.tan(f.eyes[e].normalAngle * Math.PI / 180)))
    expect(Math.abs(mean(across) - 2.59)).toBeLessThan(0.03)
    expect(Math.abs(mean(down) - 0.3)).toBeLessThan(0.03)
  })

  it('a normal case\'s pictures show angles within a couple of degrees of the normal-eye angle', () => {
    // the normal template keeps torsion within about ±2° (domain.md §4)
    for (const f of cases.slice(0, 300)) {
      for (const e of EYES) expect(Math.abs(f.eyes[e].angle - f.eyes[e].normalAngle)).toBeLessThanOrEqual(2.1)
    }
  })
})

describe('each torted eye is turned by its objective torsion about the fovea', () => {
  const turnProperty = (version: number, expected: (t: number) => number) =>
    (template: string, seed: string, eye: Eye, t: number) => {
      const base = generateCase(template, seed)
      const t1 = Math.round(t * 10) / 10
      const straight = fundusForCase(withTorsion(base, eye, 0), version).eyes[eye]
      const torted = fundusForCase(withTorsion(base, eye, t1), version).eyes[eye]
      const measure = (e: typeof straight) => discFoveaAngle(eye, e.picture.disc, e.picture.fovea)
      // pictures are stored to 0.001 DD, which moves an angle by at most ~0.05°
      expect(measure(torted) - measure(straight)).toBeCloseTo(expected(t1), 1)
      expect(torted.picture.fovea).toEqual(straight.picture.fovea)
      expect(distance(torted.picture.disc, torted.picture.fovea)).toBeCloseTo(distance(straight.picture.disc, straight.picture.fovea), 2)
      expect(torted.angle).toBeCloseTo(torted.normalAngle + expected(t1), 1)
    }
  const args = [fc.constantFrom(...CASE_TEMPLATES.map(t => t.id)), fc.string({ minLength: 1, maxLength: 12 }), fc.constantFrom<Eye>('RE', 'LE'), fc.double({ min: -25, max: 25, noNaN: true })] as const

  // issue 11 changes the rule for version 2: the normal subjective band (−0.5° to 2°,
  // Flodin et al., Acta Ophthalmol 2020) is not a rotation of the fundus
  test.prop([...args])(
    'version 2: the picture\'s angle moves by exactly the torsion outside the healthy band, not at all inside it',
    turnProperty(2, t => (t >= -0.5 && t <= 2 ? 0 : t)),
  )

  test.prop([...args])(
    'version 1 (stored attempts replay it): the picture\'s angle moves by exactly the torsion (both eyes)',
    turnProperty(1, t => t),
  )

  it('uses primary-position objective torsion, not what the double Maddox rod shows', () => {
    const c = generateCase('long-standing-so-palsy-standard', 'ls-1')
    const f = fundusForCase(c)
    const eye = c.affectedEye!
    const fellow = eye === 'RE' ? 'LE' : 'RE'
    expect(f.eyes[eye].torsion).toBe(c.gazes.primary.torsion[eye])
    expect(f.eyes[eye].healthy).toBe(false)
    // the fellow eye's small subjective excyclo is not drawn (version 2)
    expect(f.eyes[fellow].healthy).toBe(true)
    expect(f.eyes[fellow].torsion).toBe(0)
    expect(fundusForCase(c, 1).eyes[fellow].torsion).toBe(c.gazes.primary.torsion[fellow])
    expect(c.gazes.primary.torsion[eye] - c.gazes.primary.reported[eye]).toBeGreaterThan(2)
  })

  it('long-standing SO palsy: paretic-eye angles near the published 12.19 ± 1.69° against 6.71 ± 1.09° in the fellow eye', () => {
    // Kang et al., PLoS One 2020 (clinical-facts R50): paretic eye 12.19 ± 1.69°, fellow eye 6.71 ± 1.09°
    const fs = Array.from({ length: 400 }, (_, i) => generateCase('long-standing-so-palsy-standard', `k-${i}`))
    const paretic = fs.map(c => fundusForCase(c).eyes[c.affectedEye!].angle)
    const fellow = fs.map(c => fundusForCase(c).eyes[c.affectedEye === 'RE' ? 'LE' : 'RE'].angle)
    expect(Math.abs(mean(paretic) - 12.19)).toBeLessThan(1.69)
    expect(Math.abs(mean(fellow) - 6.71)).toBeLessThan(1.09)
  })
})

describe('a separate, versioned derivation', () => {
  test.prop([fc.constantFrom(...CASE_TEMPLATES.map(t => t.id)), fc.string({ minLength: 1, maxLength: 20 })])(
    'the same case always gives the same fundus and the same drawing',
    (template, seed) => {
      const a = fundusForCase(generateCase(template, seed))
      const b = fundusForCase(generateCase(template, seed))
      expect(a).toEqual(b)
      expect(fundusScene(a.eyes.RE.picture)).toEqual(fundusScene(b.eyes.RE.picture))
    },
  )

  it('leaves the generated case itself untouched and refuses versions it cannot make', () => {
    const c = generateCase('so-palsy-right', 'v')
    const before = JSON.stringify(c)
    fundusForCase(c)
    expect(JSON.stringify(c)).toBe(before)
    expect(c.generatorVersion).toBe(GENERATOR_VERSION)
    expect(fundusForCase(c).fundusVersion).toBe(FUNDUS_VERSION)
    expect(FUNDUS_VERSION).toBe(2)
    expect(fundusForCase(c, 1).fundusVersion).toBe(1)
    expect(() => fundusForCase(c, FUNDUS_VERSION + 1)).toThrow(/version/)
    expect(() => fundusForCase(c, 0)).toThrow(/version/)
  })

  it('keeps the disc and fovea inside the camera field, even with large torsion', () => {
    for (const t of CASE_TEMPLATES) {
      for (let i = 0; i < 20; i++) {
        const f = fundusForCase(generateCase(t, `field-${i}`))
        for (const e of EYES) {
          const p = f.eyes[e].picture
          for (const q of [p.disc, p.fovea]) expect(distance(q, p.field) + 0.6).toBeLessThan(p.field.radius)
        }
      }
    }
  })

  it('draws vessels from the disc and keeps them out of the fovea', () => {
    const p = fundusForCase(generateCase('normal', 'draw')).eyes.LE.picture
    const s = fundusScene(p)
    expect(s.vessels.length).toBeGreaterThan(12)
    const trunks = s.vessels.filter(v => v.from === 'disc')
    expect(trunks.length).toBe(12)
    for (const v of trunks) expect(distance(v.points[0]!, p.disc)).toBeLessThan(0.5)
    for (const v of s.vessels) for (const q of v.points) expect(distance(q, p.fovea)).toBeGreaterThan(0.3)
  })
})

describe('healthy eyes teach cleanly (issue 11)', () => {
  /** The eyes a condition leaves healthy: both in a normal case, the fellow eye of a one-sided palsy or restriction. */
  const healthyEyes = (c: Case): Eye[] => {
    if (c.condition === 'normal') return ['RE', 'LE']
    const onesided = ['so-palsy', 'io-palsy', 'sr-palsy', 'ir-palsy', 'long-standing-so-palsy', 'ted-ir-restriction']
    if (onesided.includes(c.condition) && c.affectedEye) return [c.affectedEye === 'RE' ? 'LE' : 'RE']
    return []
  }
  const templates = CASE_TEMPLATES.filter(t => ['normal', 'so-palsy', 'io-palsy', 'sr-palsy', 'ir-palsy', 'long-standing-so-palsy', 'ted-ir-restriction'].includes(t.condition))

  it('1,000 seeded healthy eyes all have a disc–fovea angle inside the normal range, and the grade says so', () => {
    // normal range: mean ± 2 SD of J Korean Ophthalmol Soc 2005;46(10):1684-9 (6.26 ± 2.98° RE, 6.69 ± 2.84° LE)
    let checked = 0
    let outsideInVersion1 = 0
    for (let i = 0; checked < 1000; i++) {
      const c = generateCase(templates[i % templates.length]!, `healthy-${i}`)
      const f = fundusForCase(c)
      for (const e of healthyEyes(c)) {
        const eye = f.eyes[e]
        const range = { low: NORMAL_DISC_FOVEA_ANGLE[e].mean - 2 * NORMAL_DISC_FOVEA_ANGLE[e].sd, high: NORMAL_DISC_FOVEA_ANGLE[e].mean + 2 * NORMAL_DISC_FOVEA_ANGLE[e].sd }
        expect(eye.healthy, `${c.templateId} ${c.seed} ${e}`).toBe(true)
        expect(eye.torsion).toBe(0)
        // measured on the picture itself, as a learner's perfect marks would
        const onPicture = discFoveaAngle(e, eye.picture.disc, eye.picture.fovea)
        expect(onPicture, `${c.templateId} ${c.seed} ${e}`).toBeGreaterThanOrEqual(range.low)
        expect(onPicture, `${c.templateId} ${c.seed} ${e}`).toBeLessThanOrEqual(range.high)
        const graded = gradeFundus({ references: { [e]: { eye: e, disc: eye.picture.disc, fovea: eye.picture.fovea, ddUnit: 1 } }, marks: { [e]: { disc: eye.picture.disc, fovea: eye.picture.fovea, finding: 'within-normal' } } })
        expect(graded.eyes[e]!.expectedFinding).toBe('within-normal')
        expect(graded.score).toBe(1)
        const old = fundusForCase(c, 1).eyes[e]
        if (findingForAngle(e, old.angle) !== 'within-normal') outsideInVersion1++
        checked++
      }
    }
    expect(checked).toBe(1000)
    // the check can fail: version 1, which added the subjective excyclo, let some healthy eyes out of the range
    expect(outsideInVersion1).toBeGreaterThan(0)
  })
})
