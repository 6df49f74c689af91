import { describe, expect, it } from 'vitest'
import { attemptSubmitSchema, practiceCreateSchema, recordCheckSchema } from '#shared/engine/schemas'

const messages = (r: { success: boolean, error?: { issues: { path: PropertyKey[], message: string }[] } }) =>
  (r.error?.issues ?? []).map(i => `${i.path.join('.')}: ${i.message}`)

describe('practice create', () => {
  it('accepts an empty body and the three optional fields', () => {
    expect(practiceCreateSchema.safeParse({}).success).toBe(true)
    expect(practiceCreateSchema.safeParse({ template: 'so-palsy-right', seed: 'abc', mode: 'patient-turns' }).success).toBe(true)
  })
  it('explains a bad mode and a bad template id', () => {
    const r = practiceCreateSchema.safeParse({ mode: 'examiner', template: 'SO PALSY' })
    expect(messages(r).join('\n')).toMatch(/mode: Mode must be "learner-turns" or "patient-turns"/)
    expect(messages(r).join('\n')).toMatch(/template: .*lower-case/)
  })
})

describe('attempt submit', () => {
  const ok = { gaze: 'down', distance: 'near', readings: { RE: 98, LE: 90 }, record: 'DMR N downgaze RE 8 ex LE 0' }
  it('accepts a full attempt', () => {
    expect(attemptSubmitSchema.safeParse({ ...ok, prisms: [{ eye: 'RE', power: 4, base: 'down' }], interpretation: { higherEye: 'RE', muscle: 'RSO' } }).success).toBe(true)
  })
  it('refuses readings off the dial and an unknown position of gaze, with the field paths', () => {
    const r = attemptSubmitSchema.safeParse({ ...ok, gaze: 'sideways', readings: { RE: 200, LE: 90 } })
    const m = messages(r).join('\n')
    expect(m).toMatch(/gaze: Position of gaze must be one of: primary/)
    expect(m).toMatch(/readings.RE: A dial reading runs from 0° to 180°/)
  })
  it('refuses a zero-power prism and an unknown muscle', () => {
    const r = attemptSubmitSchema.safeParse({ ...ok, prisms: [{ eye: 'RE', power: 0, base: 'down' }], interpretation: { muscle: 'RXX' } })
    const m = messages(r).join('\n')
    expect(m).toMatch(/prisms.0.power: Prism power must be above 0 Δ/)
    expect(m).toMatch(/interpretation.muscle: Muscle must be one of/)
  })
})

describe('record check', () => {
  it('takes signed torsion and an optional tolerance', () => {
    expect(recordCheckSchema.safeParse({ torsion: { RE: 8, LE: -2 }, record: 'x', tolerance: 1 }).success).toBe(true)
  })
  it('explains the sign convention when torsion is missing', () => {
    const m = messages(recordCheckSchema.safeParse({ record: 'x' })).join('\n')
    expect(m).toMatch(/positive = excyclo/)
  })
  it('refuses implausible torsion and tolerance', () => {
    const m = messages(recordCheckSchema.safeParse({ torsion: { RE: 80, LE: 0 }, record: 'x', tolerance: 0 })).join('\n')
    expect(m).toMatch(/torsion.RE: Torsion beyond 45°/)
    expect(m).toMatch(/tolerance: Tolerance must be at least 0.5°/)
  })
})
