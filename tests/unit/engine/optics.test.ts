import { describe, expect, it } from 'vitest'
import { fc, test } from '@fast-check/vitest'
import {
  degreesToPrismDioptres,
  effectiveHorizontalAt,
  inView,
  isLevel,
  looksParallel,
  netVerticalPrism,
  perceivedFromHorizontalAt,
  perceivedStreakAngle,
  prismDioptresToDegrees,
  prismDisplacementCm,
  prismImageShift,
  prismInducedExcyclo,
  settingForLevel,
  streakAngle,
  streakOffsets,
  streaksOverlap,
} from '#shared/engine/optics'
import { mirrorReading, torsionToReading } from '#shared/engine/dial'

describe('perceived streak angle (domain.md §3.5)', () => {
  it('a rod axis at 90° gives a horizontal streak', () => {
    // Maddox rod: the streak lies perpendicular to the cylinder axes (any optics text; clinical-facts §2)
    expect(streakAngle(90)).toBe(0)
    expect(Math.abs(streakAngle(0))).toBe(90)
  })

  it('an excyclotorted eye sees a level rod as tilted, and levels it at the §3.4 reading', () => {
    // an excyclotorted eye perceives a horizontal line as incyclotorted (clinical-facts §3.3, R20)
    expect(perceivedStreakAngle('RE', 90, 10)).not.toBe(0)
    // common practice, derived from ISO 8429:1986: RE 100° ↔ 10° excyclo, LE 80° ↔ 10° excyclo
    expect(perceivedStreakAngle('RE', 100, 10)).toBeCloseTo(0)
    expect(perceivedStreakAngle('LE', 80, 10)).toBeCloseTo(0)
  })

  it('the two eyes see opposite tilts for the same excyclotorsion with rods at 90°', () => {
    // the line of an excyclotorted eye slopes down towards the nose (clinical-facts §3.3, derived R1/R20)
    const re = perceivedStreakAngle('RE', 90, 5)
    const le = perceivedStreakAngle('LE', 90, 5)
    expect(re).toBeCloseTo(-le)
    expect(looksParallel(re, le, 1)).toBe(false)
  })

  test.prop([fc.double({ min: -30, max: 30, noNaN: true }), fc.double({ min: 45, max: 135, noNaN: true })])(
    'p = h − a: the angle from the level reading equals the angle from torsion',
    (t, a) => {
      for (const eye of ['RE', 'LE'] as const) {
        expect(perceivedFromHorizontalAt(torsionToReading(eye, t), a)).toBeCloseTo(perceivedStreakAngle(eye, a, t), 9)
      }
    },
  )

  test.prop([fc.double({ min: -30, max: 30, noNaN: true }), fc.double({ min: 45, max: 135, noNaN: true })])(
    'mirror symmetry: the left eye at the mirrored reading sees the mirrored tilt',
    (t, a) => {
      expect(perceivedStreakAngle('LE', mirrorReading(a), t)).toBeCloseTo(-perceivedStreakAngle('RE', a, t), 9)
    },
  )

  it('with the room lights on, the level setting is pulled towards 90°', () => {
    // dimming removes orientation cues (clinical-facts §3.1, R11); the size of the pull is a model choice
    const dim = settingForLevel(100, 'dim')
    const on = settingForLevel(100, 'on')
    expect(dim).toBe(100)
    expect(on).toBeGreaterThan(90)
    expect(on).toBeLessThan(100)
    expect(perceivedFromHorizontalAt(100, on, 'on')).toBeCloseTo(0)
  })

  it('calls a line level below the threshold only', () => {
    expect(isLevel(0.4, 0.5)).toBe(true)
    expect(isLevel(0.6, 0.5)).toBe(false)
  })
})

describe('prism dioptres (clinical-facts §7)', () => {
  it.each([
    // Prentice's definition P = 100·tan(angle); check values computed in clinical-facts §7 (R3)
    [3, 1.718],
    [5, 2.862],
    [10, 5.711],
    [20, 11.31],
    [30, 16.699],
    [100, 45],
  ])('%sΔ = %s°', (p, d) => {
    expect(prismDioptresToDegrees(p)).toBeCloseTo(d, 3)
  })

  it('1° is 1.7455Δ and 10Δ displaces 3.3 cm at 33 cm', () => {
    // clinical-facts §7 / §11 checks 5–6 (R3, computed)
    expect(degreesToPrismDioptres(1)).toBeCloseTo(1.7455, 4)
    expect(prismDisplacementCm(10, 0.33)).toBeCloseTo(3.3, 5)
  })

  it('moves the image toward the apex', () => {
    // the image is displaced toward the apex (clinical-facts §7, R70/R71)
    expect(prismImageShift({ eye: 'RE', power: 4, base: 'down' })).toEqual({ x: 0, y: 4 })
    expect(prismImageShift({ eye: 'LE', power: 4, base: 'up' })).toEqual({ x: 0, y: -4 })
    // base in → apex out → toward that eye's temple (the RE's temple is the patient's right)
    expect(prismImageShift({ eye: 'RE', power: 6, base: 'in' }).x).toBe(6)
    expect(prismImageShift({ eye: 'LE', power: 6, base: 'in' }).x).toBe(-6)
  })
})

describe('streak positions (domain.md §3.6)', () => {
  it('a right hypertropia puts the right streak lower; base-down before the RE brings them together', () => {
    // clinical-facts §7: right hyper → base-down before RE (R72/R73); image toward apex
    const apart = streakOffsets({ vertical: 6, horizontal: 0 }, [], 'LE')
    expect(apart.RE.y).toBeLessThan(apart.LE.y)
    const together = streakOffsets({ vertical: 6, horizontal: 0 }, [{ eye: 'RE', power: 6, base: 'down' }], 'LE')
    expect(together.RE.y - together.LE.y).toBeCloseTo(0)
    // base-up before the LE does the same
    const viaLeft = streakOffsets({ vertical: 6, horizontal: 0 }, [{ eye: 'LE', power: 6, base: 'up' }], 'LE')
    expect(viaLeft.RE.y - viaLeft.LE.y).toBeCloseTo(0)
  })

  it('an esotropia gives uncrossed images; base-out before the deviating eye joins them', () => {
    // clinical-facts §7: eso → base-out (R72/R73); uncrossed diplopia in eso (domain.md §3.6)
    const eso = streakOffsets({ vertical: 0, horizontal: 10 }, [], 'LE')
    expect(eso.RE.x).toBeGreaterThan(eso.LE.x)
    const fixed = streakOffsets({ vertical: 0, horizontal: 10 }, [{ eye: 'RE', power: 10, base: 'out' }], 'LE')
    expect(fixed.RE.x - fixed.LE.x).toBeCloseTo(0)
    const exo = streakOffsets({ vertical: 0, horizontal: -10 }, [{ eye: 'RE', power: 10, base: 'in' }], 'LE')
    expect(exo.RE.x - exo.LE.x).toBeCloseTo(0)
  })

  it('keeps the fixing eye\'s streak in the centre', () => {
    const o = streakOffsets({ vertical: 8, horizontal: 4 }, [], 'RE')
    expect(o.RE).toEqual({ x: 0, y: 0 })
  })

  it('overlapping streaks (< 2Δ apart) and streaks outside the field', () => {
    // common practice: lines under about 2Δ apart are hard to compare (domain.md §3.6)
    expect(streaksOverlap(streakOffsets({ vertical: 1, horizontal: 0 }, [], 'RE'))).toBe(true)
    expect(streaksOverlap(streakOffsets({ vertical: 1, horizontal: 0 }, [{ eye: 'RE', power: 6, base: 'down' }], 'RE'))).toBe(false)
    expect(inView({ x: 0, y: 5 })).toBe(true)
    expect(inView({ x: 0, y: 40 })).toBe(false)
  })
})

describe('apparent excyclo from a separating prism', () => {
  it.each([
    // Marsh et al., Am Orthopt J 2014;64:76-80: 0.95, 1.6, 1.9, 2.1, 2.2° at 3, 10, 16, 20, 30Δ
    [3, 0.95],
    [10, 1.6],
    [16, 1.9],
    [20, 2.1],
    [30, 2.2],
  ])('%sΔ adds %s°', (p, d) => {
    expect(prismInducedExcyclo(p)).toBeCloseTo(d, 6)
  })

  it('rises between the published points and never falls', () => {
    // Marsh et al. 2014: "increase roughly logarithmic"
    let last = 0
    for (let p = 0; p <= 40; p += 0.5) {
      const d = prismInducedExcyclo(p)
      expect(d).toBeGreaterThanOrEqual(last)
      last = d
    }
    expect(prismInducedExcyclo(0)).toBe(0)
    const mid = prismInducedExcyclo(6)
    expect(mid).toBeGreaterThan(0.95)
    expect(mid).toBeLessThan(1.6)
  })

  it('shifts each eye\'s level reading by half the artefact, toward excyclo', () => {
    const prisms = [{ eye: 'RE' as const, power: 10, base: 'down' as const }]
    expect(netVerticalPrism(prisms)).toBe(10)
    // Marsh et al. 2014: 1.6° total at 10Δ; Cyclodial splits it between the eyes
    expect(effectiveHorizontalAt('RE', 90, prisms)).toBeCloseTo(90.8)
    expect(effectiveHorizontalAt('LE', 90, prisms)).toBeCloseTo(89.2)
    // a horizontal prism adds nothing
    expect(effectiveHorizontalAt('RE', 90, [{ eye: 'RE', power: 10, base: 'out' }])).toBe(90)
  })
})
