import { describe, expect, it } from 'vitest'
import { fc, test } from '@fast-check/vitest'
import {
  dialAngleInPatientView,
  dialDirectionExaminerView,
  mirrorReading,
  normaliseAxis,
  readingToTorsion,
  rodAxisToStreakMark,
  rodTopLeans,
  torsionToReading,
  zeroEndSide,
} from '#shared/engine/dial'
import { totalTorsion } from '#shared/engine/optics'

describe('ISO 8429 dial geometry', () => {
  it('puts 0° at the examiner\'s right and runs counter-clockwise, 90° vertical', () => {
    // ISO 8429:1986 — seen from the front, 0° at the examiner's right, angles increase counter-clockwise
    const zero = dialDirectionExaminerView(0)
    const ninety = dialDirectionExaminerView(90)
    const fortyFive = dialDirectionExaminerView(45)
    expect(zero.x).toBeCloseTo(1)
    expect(zero.y).toBeCloseTo(0)
    expect(ninety.x).toBeCloseTo(0)
    expect(ninety.y).toBeCloseTo(1)
    // counter-clockwise from the right: 45° points up and to the examiner's right
    expect(fortyFive.x).toBeGreaterThan(0)
    expect(fortyFive.y).toBeGreaterThan(0)
  })

  it('uses the same scale for both eyes, so 0° is nasal for the RE and temporal for the LE', () => {
    // ISO 8429:1986 (same scheme both eyes); clinical-facts §1.2 table, derived from it
    expect(zeroEndSide('RE')).toBe('nasal')
    expect(zeroEndSide('LE')).toBe('temporal')
  })

  it('mirrors the dial into the patient\'s own view', () => {
    // the examiner's right is the patient's left (ISO 8429:1986 examiner view)
    expect(dialAngleInPatientView(0)).toBe(0)
    expect(dialAngleInPatientView(30)).toBe(150)
    expect(dialAngleInPatientView(90)).toBe(90)
  })

  it('normalises axes to 0–180', () => {
    // ISO 8429:1986 — axes are written 0–180°
    expect(normaliseAxis(180)).toBe(0)
    expect(normaliseAxis(-10)).toBe(170)
    expect(normaliseAxis(370)).toBe(10)
    expect(normaliseAxis(95)).toBe(95)
  })
})

describe('reading ↔ torsion (domain.md §3.4)', () => {
  it.each([
    // common practice, derived from ISO 8429:1986
    ['RE', 100, 10],
    ['LE', 80, 10],
    ['RE', 85, -5],
    ['LE', 97, -7],
    // clinical-facts §3.4 check table (derived from ISO 8429:1986 and the perception rule)
    ['RE', 95, 5],
    ['LE', 85, 5],
    ['RE', 102, 12],
    ['LE', 78, 12],
    ['LE', 95, -5],
    ['RE', 90, 0],
    ['LE', 90, 0],
  ] as const)('%s at %s° is %s° (positive = excyclo)', (eye, reading, torsion) => {
    expect(readingToTorsion(eye, reading)).toBeCloseTo(torsion, 10)
    expect(torsionToReading(eye, torsion)).toBeCloseTo(reading, 10)
  })

  it.each([
    // clinical-facts §3.4: the streak-direction marking reads 90° further round
    [95, 5],
    [85, 175],
    [102, 12],
    [78, 168],
    [90, 0],
  ])('rod axis %s° is streak mark %s°', (axis, streak) => {
    expect(rodAxisToStreakMark(axis)).toBe(streak)
  })

  it('top of the rod axis toward the ear is excyclo for either eye', () => {
    // common practice rule of thumb (domain.md §3.4), derived from ISO 8429:1986
    expect(rodTopLeans('RE', 100)).toBe('temporal')
    expect(rodTopLeans('LE', 80)).toBe('temporal')
    expect(rodTopLeans('RE', 85)).toBe('nasal')
    expect(rodTopLeans('LE', 97)).toBe('nasal')
    expect(rodTopLeans('LE', 90)).toBe('vertical')
  })

  it('totals the eyes with excyclo positive', () => {
    // clinical-facts §11 check 4: RE 8° ex + LE 2° in = 6° ex (derived)
    expect(totalTorsion({ RE: 8, LE: -2 })).toBe(6)
  })

  test.prop([fc.constantFrom('RE' as const, 'LE' as const), fc.double({ min: -89, max: 89, noNaN: true })])(
    'round trip: torsion → reading → torsion',
    (eye, t) => {
      expect(readingToTorsion(eye, torsionToReading(eye, t))).toBeCloseTo(t, 9)
    },
  )

  test.prop([fc.constantFrom('RE' as const, 'LE' as const), fc.double({ min: 0.5, max: 179.5, noNaN: true })])(
    'round trip: reading → torsion → reading',
    (eye, a) => {
      expect(torsionToReading(eye, readingToTorsion(eye, a))).toBeCloseTo(a, 9)
    },
  )

  // a horizontal rod axis (0/180) is ±90° of torsion either way, so the ends are left out
  test.prop([fc.double({ min: 0.5, max: 179.5, noNaN: true })])(
    'mirror symmetry: a right-eye reading and its mirror on the left eye mean the same torsion',
    (a) => {
      expect(readingToTorsion('LE', mirrorReading(a))).toBeCloseTo(readingToTorsion('RE', a), 9)
      expect(rodTopLeans('LE', mirrorReading(a))).toBe(rodTopLeans('RE', a))
    },
  )
})
