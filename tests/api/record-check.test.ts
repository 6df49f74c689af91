// The record checker over HTTP: worked examples a tutor would mark, in many
// phrasings. Check values: the dial conversions of domain.md §3.4 (common
// practice, derived from ISO 8429:1986 and the perception rule), the record
// abbreviations of §5.1 and the slip codes of §5.3.
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { SLIP_INFO } from '#shared/engine/slips'
import type { SlipCode } from '#shared/engine/slips'
import type { Client } from '../support/client'
import { DEMO, signedIn } from '../support/client'

const baseURL = inject('baseURL')
let tutor: Client
beforeAll(async () => {
  tutor = await signedIn(baseURL, DEMO.tutor)
})

interface Example {
  why: string
  torsion: { RE: number, LE: number }
  record: string
  readings?: { RE?: number, LE?: number }
  gaze?: string | null
  distance?: string | null
  tolerance?: number
  notTestable?: boolean
  /** Exactly these slips ("code" or "code:eye"). */
  slips: string[]
  /** Marks that must have these scores. */
  marks?: Record<string, number>
  full?: boolean
}

// §3.4 (common practice): RE 100° → 10° excyclo; LE 80° → 10° excyclo; RE 85° → 5° incyclo; LE 97° → 7° incyclo.
const RE100 = { torsion: { RE: 10, LE: 0 }, readings: { RE: 100, LE: 90 } }
const LE80 = { torsion: { RE: 0, LE: 10 }, readings: { RE: 90, LE: 80 } }
const RE85 = { torsion: { RE: -5, LE: 0 }, readings: { RE: 85, LE: 90 } }
const LE97 = { torsion: { RE: 0, LE: -7 }, readings: { RE: 90, LE: 97 } }
const RE8 = { torsion: { RE: 8, LE: 0 } }

const CORRECT: Example[] = [
  { why: '§5.1 model form', ...RE100, record: 'DMR, near, primary position: RE 10° excyclotorsion, LE no torsion.', slips: [] },
  { why: 'short form', ...RE100, record: 'DMR N PP: R 10 ex, L nil', slips: [] },
  { why: 'lower case, no punctuation', ...RE100, record: 'dmr near pp re 10 excyclo le 0', slips: [] },
  { why: 'right eye in words, finding first', ...RE100, record: '10° excyclotorsion of the right eye, left eye no torsion — DMR at near, primary position', slips: [] },
  { why: 'LE 80° is excyclo', ...LE80, record: 'DMR near primary: LE 10° extorsion, RE no torsion', slips: [] },
  { why: 'OD/OS, metres', ...RE85, record: 'DMR, 1/3 m, primary position: OD 5 deg intorsion, OS nil', slips: [] },
  { why: 'LE 97° is incyclo', ...LE97, record: 'DMR N PP: LE 7° incyclotorsion; RE no torsion', slips: [] },
  { why: 'sentences', ...LE97, record: 'Double Maddox rod at 33 cm, primary position. Left eye 7 degrees incyclotorted; right eye nil.', slips: [] },
  { why: 'OD deg extorsion', ...RE8, record: 'DMR, near, PP: OD 8 deg extorsion, OS no torsion', slips: [] },
  { why: 'an untorted eye may be left out', torsion: { RE: 0, LE: -5 }, record: 'DMR near primary: LE 5° incyclotorsion', slips: [] },
  { why: 'no torsion either eye', torsion: { RE: 0, LE: 0 }, record: 'DMR near primary position: no torsion either eye', slips: [] },
  { why: 'no torsion in either eye', torsion: { RE: 0, LE: 0 }, record: 'DMR N PP: no torsion detected in either eye', slips: [] },
  { why: 'NIL', torsion: { RE: 0, LE: 0 }, record: 'DMR N PP: NIL', slips: [] },
  { why: 'colon heading', torsion: { RE: 6, LE: 0 }, record: 'DMR N PP: RE 6 ex, LE nil', slips: [] },
  { why: 'each eye', torsion: { RE: 5, LE: 5 }, record: 'DMR near primary: 5° excyclo each eye', slips: [] },
  { why: 'RE and LE', torsion: { RE: 5, LE: 5 }, record: 'DMR near primary: RE and LE 5° excyclo', slips: [] },
  { why: 'eyes and total', torsion: { RE: 9, LE: 7 }, record: 'DMR N PP: RE 9° excyclo, LE 7° excyclo (total 16° excyclo)', slips: [] },
  { why: 'downgaze', ...RE8, gaze: 'down', record: 'DMR, near, downgaze: RE 8° excyclotorsion, LE no torsion', slips: [] },
  { why: 'finding before the test', ...RE8, record: 'Excyclo 8° RE, LE nil. DMR, N, primary.', slips: [] },
  { why: 'number in words', ...RE8, record: 'DMR near PP: RE eight degrees excyclo', slips: [] },
  { why: 'eye headings with colons and no comma', ...RE8, record: 'DMR N PP RE: 8 ex LE: nil', slips: [] },
  { why: 'eye headings with brackets', ...RE8, record: 'DMR near PP: R) 8° ex L) nil', slips: [] },
  { why: 'one line per item', ...RE8, record: 'DMR\nNear\nPrimary position\nRE: 8° excyclotorsion\nLE: no torsion', slips: [] },
  { why: '"1° position" for primary', ...RE8, record: 'DMR 1/3m 1° position: RE 8 ex, LE 0', slips: [] },
  { why: 'rounded within tolerance (default 2°, §5.2)', torsion: { RE: 8.4, LE: 0.6 }, record: 'DMR near PP: RE 8 ex LE nil', slips: [] },
  { why: 'distance fixation', ...RE8, distance: 'distance', record: 'DMR 6 m primary: RE 8 ex, LE 0', slips: [] },
  { why: 'tolerance set by the tutor', ...RE8, tolerance: 3, record: 'DMR N PP: RE 5 ex', slips: [] },
  { why: 'not performed, and why (§3.8)', torsion: { RE: 0, LE: 0 }, notTestable: true, record: 'DMR not performed: patient sees one streak only — suppression', slips: [] },
]

const SLIPS: Example[] = [
  { why: 'RE 100° written as the amount', ...RE100, record: 'DMR N PP: RE 100° excyclo, LE nil', slips: ['dial-value-as-amount:RE'], marks: { amount: 0, direction: 1, measurement: 1 } },
  { why: 'LE 80° written as the amount', ...LE80, record: 'DMR N PP: LE 80 ex', slips: ['dial-value-as-amount:LE'], marks: { amount: 0 } },
  { why: 'dial figure, no direction', ...RE100, record: 'DMR N PP: RE 100°, LE nil', slips: ['dial-value-as-amount:RE', 'direction-missing:RE'] },
  { why: 'image recorded, not the eye (RE)', ...RE100, record: 'DMR N PP: RE 10° incyclo, LE nil', slips: ['direction-reversed:RE'], marks: { direction: 0, amount: 1, eye: 1 } },
  { why: 'right-eye rule on the left eye: LE 80° read as incyclo', ...LE80, record: 'DMR N PP: LE 10° intorsion, RE nil', slips: ['direction-reversed:LE'], marks: { direction: 0, amount: 1 } },
  { why: 'RE 85° called excyclo', ...RE85, record: 'DMR N PP: RE 5 ex, LE nil', slips: ['direction-reversed:RE'] },
  { why: 'LE 97° called excyclo', ...LE97, record: 'DMR N PP: LE 7 excyclo', slips: ['direction-reversed:LE'] },
  { why: 'torsion given to the left eye', ...RE100, record: 'DMR N PP: LE 10 ex, RE 0', slips: ['eye-wrong:RE'], marks: { eye: 0 } },
  { why: 'torsion given to the right eye', torsion: { RE: 0, LE: -5 }, record: 'DMR N PP: RE 5 incyclo', slips: ['eye-wrong:LE'], marks: { eye: 0 } },
  { why: 'both eyes swapped', torsion: { RE: -3, LE: 9 }, record: 'DMR N PP: RE 9 ex, LE 3 in', slips: ['eye-wrong:RE', 'eye-wrong:LE'] },
  { why: 'amount far off', ...RE8, record: 'DMR N PP: RE 3 ex', slips: ['amount-off:RE'], marks: { amount: 0 } },
  { why: 'partial credit within twice the tolerance (§5.2)', ...RE8, record: 'DMR N PP: RE 5 ex', slips: ['amount-off:RE'], marks: { amount: 0.5 } },
  { why: 'test not named', ...RE8, record: 'near primary: RE 8 ex', slips: ['test-unnamed'], marks: { test: 0 } },
  { why: 'the brief "R 10 ex": no test, no gaze', ...RE100, record: 'R 10 ex', slips: ['test-unnamed', 'gaze-missing'], marks: { distance: 0 } },
  { why: '"Maddox rod" without saying double', ...RE8, record: 'Maddox rod, near, primary: RE 8 ex', slips: [], marks: { test: 0.5 } },
  { why: 'position of gaze missing', ...RE8, record: 'DMR N: RE 8 ex', slips: ['gaze-missing'], marks: { gaze: 0 } },
  { why: 'wrong position of gaze', ...RE8, record: 'DMR near downgaze: RE 8 ex', slips: [], marks: { gaze: 0 } },
  { why: 'wrong fixation distance', ...RE8, record: 'DMR 6m PP: RE 8 ex', slips: [], marks: { distance: 0 } },
  // each slip once (domain.md §5.2): an amount with no eye is eye-missing only, and the finding itself is marked
  { why: 'no eye named', ...RE8, record: 'DMR N PP: 8° excyclo', slips: ['eye-missing'], marks: { eye: 0, amount: 1, direction: 1 } },
  { why: '"both eyes" with one amount: each or total?', torsion: { RE: 5, LE: 5 }, record: 'DMR N PP: both eyes 5° excyclotorsion', slips: ['amount-missing', 'eye-missing'] },
  { why: 'total only', torsion: { RE: 5, LE: 5 }, record: 'DMR N PP: total 10° excyclo', slips: ['eye-missing'], marks: { amount: 1, direction: 1, eye: 0 } },
  { why: 'no amount', ...RE8, record: 'DMR N PP: RE excyclo', slips: ['amount-missing:RE'] },
  { why: 'no direction', ...RE8, record: 'DMR N PP: RE 8°', slips: ['direction-missing:RE'], marks: { direction: 0, amount: 1 } },
  { why: 'a sign is not a direction (papers disagree on it)', ...RE8, record: 'DMR N PP: RE -8', slips: ['direction-missing:RE'] },
  { why: 'a range is not one amount', ...RE8, record: 'DMR N PP: RE 7-8° ex', slips: ['amount-missing:RE'] },
  { why: '"in" straight before the other eye is not guessed', ...RE8, record: 'DMR N PP: RE 8 in LE 0', slips: ['direction-missing:RE'] },
  { why: 'a torted eye left out', torsion: { RE: 8, LE: 4 }, record: 'DMR N PP: RE 8 ex', slips: ['eye-missing:LE'] },
  { why: 'dial not where the line looks level', torsion: { RE: 10, LE: 0 }, readings: { RE: 106, LE: 90 }, record: 'DMR N PP: RE 10 ex, LE nil', slips: ['not-parallel:RE'], marks: { measurement: 0, amount: 1 } },
  { why: 'error carried forward: own wrong reading converted correctly (§5.2)', torsion: { RE: 10, LE: 0 }, readings: { RE: 106, LE: 90 }, record: 'DMR N PP: RE 16 ex, LE nil', slips: ['not-parallel:RE'], marks: { measurement: 0, amount: 1, direction: 1 } },
  { why: 'tested a patient who cannot see both streaks', torsion: { RE: 0, LE: 0 }, notTestable: true, record: 'DMR N PP: RE 2 ex', slips: ['should-not-test'], marks: { action: 0 } },
]

// Critical slips (domain.md §5.2): each caps the record at half its points and leads the feedback.
// Signed findings: the tolerance is for the amount only (common practice).
const CRITICAL: Example[] = [
  { why: 'the finding written against the other eye', ...RE8, record: 'RE no torsion, LE 8 excyclo', slips: ['eye-wrong:RE', 'test-unnamed', 'gaze-missing'], marks: { eye: 0 } },
  { why: 'a reversed direction inside a wide tolerance', torsion: { RE: 5, LE: 0 }, tolerance: 5, record: 'DMR N PP: RE 5 incyclo', slips: ['direction-reversed:RE'], marks: { direction: 0 } },
  { why: 'the dial figure written as the amount', ...RE8, record: 'DMR N PP: RE 98 excyclo', slips: ['dial-value-as-amount:RE'], marks: { amount: 0 } },
  { why: 'the other eye and the image, inside a wide tolerance', torsion: { RE: 5, LE: 0 }, tolerance: 5, record: 'DMR N PP: LE 5° incyclo', slips: ['eye-wrong:RE', 'direction-reversed:RE'] },
  { why: 'the left dial read with the right eye\'s rule, written against the right eye', torsion: { RE: 0, LE: 8 }, readings: { RE: 90, LE: 82 }, record: 'DMR N PP: RE 8 incyclo, LE nil', slips: ['eye-wrong:LE', 'direction-reversed:LE'] },
]

const asCodes = (slips: { code: string, eye?: string }[]) => slips.map(s => (s.eye ? `${s.code}:${s.eye}` : s.code)).sort()

async function check(ex: Example) {
  const body: Record<string, unknown> = { torsion: ex.torsion, record: ex.record }
  if (ex.gaze !== null) body.gaze = ex.gaze ?? 'primary'
  if (ex.distance !== null) body.distance = ex.distance ?? 'near'
  if (ex.readings) body.readings = ex.readings
  if (ex.tolerance) body.tolerance = ex.tolerance
  if (ex.notTestable) body.notTestable = true
  const r = await tutor.post('/api/record-check', body)
  expect(r.status, JSON.stringify(r.body)).toBe(200)
  expect(asCodes(r.body.slips), `${ex.record} — read as ${r.body.readAs}`).toEqual([...ex.slips].sort())
  for (const [criterion, score] of Object.entries(ex.marks ?? {})) {
    expect(r.body.marks.find((m: { criterion: string }) => m.criterion === criterion)?.score, `${criterion} for ${ex.record}`).toBe(score)
  }
  return r.body
}

describe('record checker: correct records in many phrasings get full marks', () => {
  it.each(CORRECT.map(e => [e.why, e] as const))('%s', async (_why, ex) => {
    const body = await check(ex)
    expect(body.score, `${ex.record} — read as ${body.readAs}`).toBe(1)
    expect(body.points.earned).toBe(body.points.possible)
  })
})

describe('record checker: each recording slip is named', () => {
  it.each(SLIPS.map(e => [e.why, e] as const))('%s', async (_why, ex) => {
    const body = await check(ex)
    expect(body.score).toBeLessThan(1)
    // every slip is explained in plain words
    for (const s of body.slips as { code: SlipCode }[]) expect(body.explanation.join('\n')).toContain(`${SLIP_INFO[s.code].title}: `)
  })
})

describe('record checker: critical slips cap the record at half and say so first', () => {
  it.each(CRITICAL.map(e => [e.why, e] as const))('%s', async (_why, ex) => {
    const body = await check(ex)
    expect(body.score).toBeLessThanOrEqual(0.5)
    expect(body.points.earned).toBeLessThanOrEqual(body.points.possible / 2)
    expect(body.cap?.limit).toBe(0.5)
    expect(body.explanation[0]).toMatch(/^This record would mislead the next clinician: /)
  })

  it('a record without a critical slip carries no cap', async () => {
    const body = await check({ why: '', ...RE8, record: 'DMR N PP: RE 5 ex', slips: ['amount-off:RE'] })
    expect(body.cap).toBeNull()
    expect(body.explanation[0]).not.toMatch(/mislead/)
  })
})

describe('record checker: what comes back', () => {
  it('gives the read-as line, the model record and an explanation with the reading rule', async () => {
    const r = await tutor.post('/api/record-check', { torsion: { RE: 10, LE: 0 }, gaze: 'primary', distance: 'near', readings: { RE: 100, LE: 90 }, record: 'DMR N PP: RE 10 in, LE nil' })
    expect(r.body.readAs).toBe('Test: double Maddox rod · Near · Primary · RE 10° incyclo · LE no torsion')
    expect(r.body.modelRecord).toBe('DMR, near, primary position: RE 10° excyclotorsion, LE no torsion.')
    expect(r.body.explanation.join('\n')).toMatch(/Right eye: torsion = reading − 90\. Left eye: torsion = 90 − reading/)
    expect(r.body.explanation.join('\n')).toMatch(/Direction reversed: /)
    // the model record itself gets full marks
    const again = await tutor.post('/api/record-check', { torsion: { RE: 10, LE: 0 }, gaze: 'primary', distance: 'near', record: r.body.modelRecord })
    expect(again.body.score).toBe(1)
  })

  it('without a gaze, marks only that one is named; without a distance, does not mark it', async () => {
    const r = await check({ why: '', ...RE8, gaze: null, distance: null, record: 'DMR 6m downgaze: RE 8 ex', slips: [], marks: { gaze: 1 } })
    expect(r.marks.some((m: { criterion: string }) => m.criterion === 'distance')).toBe(false)
    expect(r.score).toBe(1)
  })

  it('refuses bad input naming the fields', async () => {
    const r = await tutor.post('/api/record-check', { torsion: { RE: 60 }, gaze: 'north', tolerance: 0, readings: { LE: 400 }, notTestable: 'yes' })
    expect(r.status).toBe(400)
    expect(r.body.data.fields.map((f: { path: string }) => f.path)).toEqual(expect.arrayContaining(['torsion.RE', 'torsion.LE', 'gaze', 'tolerance', 'readings.LE', 'record', 'notTestable']))
  })

  it('is for staff: a student is refused', async () => {
    const student = await signedIn(baseURL, DEMO.student)
    expect((await student.post('/api/record-check', { torsion: { RE: 0, LE: 0 }, record: 'DMR N PP nil' })).status).toBe(403)
  })
})
