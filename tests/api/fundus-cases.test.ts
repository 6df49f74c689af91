import { describe, expect, inject, it } from 'vitest'
import { discFoveaAngle } from '#shared/engine/fundus/geometry'
import type { FundusPicture } from '#shared/engine/fundus/picture'
import type { CaseFundusAttemptReply, CaseFundusView } from '#shared/types/fundus'
import { generateCase } from '~~/server/lib/engine/generator'
import { DEMO, signedIn } from '../support/client'
import { caseSecrets, expectNoCaseSecrets } from '../support/secrecy'
import { recordDmr, startPracticeCase } from '../support/fundus'

const baseURL = inject('baseURL')

const precise = (p: FundusPicture, finding: string) => ({ disc: { x: p.disc.x, y: p.disc.y }, fovea: { x: p.fovea.x, y: p.fovea.y }, finding })

describe('fundus of a practice case', () => {
  it('gives the owner the dial-free pictures of both eyes, and 404 to anyone else', async () => {
    const student = await signedIn(baseURL, DEMO.student)
    const caseId = await startPracticeCase(student, 'so-palsy-right', 'standard', 'api-fundus-1')
    const reply = await student.get<CaseFundusView>(`/api/fundus/cases/${caseId}`)
    expect(reply.status).toBe(200)
    expect(reply.body.presentation.eyes.RE.eye).toBe('RE')
    expect(reply.body.presentation.eyes.LE.fovea.x).toBeGreaterThan(reply.body.presentation.eyes.LE.disc.x) // LE: fovea right of the disc
    const text = JSON.stringify(reply.body.presentation)
    expect(text).not.toMatch(/torsion|angle|excyclo|incyclo|palsy|oblique|normal|finding/i)
    // the picture's own geometry is the only place case-derived numbers may appear
    expectNoCaseSecrets(reply.body, caseSecrets(generateCase('so-palsy-right-standard', 'api-fundus-1'), { templateHidden: false }), 'GET /api/fundus/cases/:id', {
      allowNumbersAt: [/^presentation\.eyes\.(RE|LE)\.(frame|field|disc|fovea)\./, /(^|\.)(fundusPresentationVersion|fundusVersion)$/],
    })
    expect(reply.body.attempts).toEqual([])
    expect(reply.body.comparison).toBeNull()

    const other = await signedIn(baseURL, 'milo.strathearn@cyclodial.test')
    expect((await other.get(`/api/fundus/cases/${caseId}`)).status).toBe(404)
    const tutor = await signedIn(baseURL, DEMO.tutor)
    expect((await tutor.get(`/api/fundus/cases/${caseId}`)).status).toBe(404)
    expect((await student.get('/api/fundus/cases/999999')).status).toBe(404)
    expect((await student.get('/api/fundus/cases/abc')).status).toBe(400)
  })

  it('grades precise marks at the case angle within a degree, and shows the normal range and sources afterwards', async () => {
    const student = await signedIn(baseURL, DEMO.student)
    const caseId = await startPracticeCase(student, 'bilateral-so-palsy', 'standard', 'api-fundus-2')
    const view = (await student.get<CaseFundusView>(`/api/fundus/cases/${caseId}`)).body
    const { RE, LE } = view.presentation.eyes
    const reply = await student.post<CaseFundusAttemptReply>(`/api/fundus/cases/${caseId}/attempts`, { eyes: { RE: precise(RE, 'excyclo'), LE: precise(LE, 'excyclo') } })
    expect(reply.status).toBe(201)
    const { result } = reply.body
    for (const eye of ['RE', 'LE'] as const) {
      const pic = view.presentation.eyes[eye]
      expect(Math.abs(result.eyes[eye]!.measuredAngle - result.eyes[eye]!.referenceAngle)).toBeLessThanOrEqual(1)
      expect(result.eyes[eye]!.measuredAngle).toBeCloseTo(discFoveaAngle(eye, pic.disc, pic.fovea), 1)
    }
    expect(result.normalRanges.RE.mean).toBe(6.26) // J Korean Ophthalmol Soc 2005;46(10):1684-9
    expect(result.normalRanges.LE.mean).toBe(6.69) // same source
    expect(result.sources.join(' ')).toMatch(/Bixenman/)
    // no double Maddox rod record yet: the comparison (which would give the answer away) waits
    expect(reply.body.comparison).toBeNull()
    const again = (await student.get<CaseFundusView>(`/api/fundus/cases/${caseId}`)).body
    expect(again.attempts).toHaveLength(1)
    expect(again.attempts[0]!.result.score).toBe(result.score)
  })

  it('explains the mismatch on a long-standing palsy once the double Maddox rod is recorded too', async () => {
    const student = await signedIn(baseURL, DEMO.student)
    const caseId = await startPracticeCase(student, 'long-standing-so-palsy', 'standard', 'api-fundus-3')
    const view = (await student.get<CaseFundusView>(`/api/fundus/cases/${caseId}`)).body
    const { RE, LE } = view.presentation.eyes
    await recordDmr(student, caseId)
    const reply = await student.post<CaseFundusAttemptReply>(`/api/fundus/cases/${caseId}/attempts`, { eyes: { RE: precise(RE, 'within-normal'), LE: precise(LE, 'excyclo') } })
    expect(reply.status).toBe(201)
    expect(reply.body.comparison?.underReports).toBe(true)
    expect(reply.body.comparison?.explanation.join(' ')).toMatch(/sensory adaptation/)
    const view2 = (await student.get<CaseFundusView>(`/api/fundus/cases/${caseId}`)).body
    expect(view2.comparison?.underReports).toBe(true)
  })

  it('refuses bad marks with the field named and stores nothing', async () => {
    const student = await signedIn(baseURL, DEMO.student)
    const caseId = await startPracticeCase(student, 'normal', 'standard', 'api-fundus-4')
    const view = (await student.get<CaseFundusView>(`/api/fundus/cases/${caseId}`)).body
    const { RE } = view.presentation.eyes
    const missing = await student.post(`/api/fundus/cases/${caseId}/attempts`, { eyes: { RE: precise(RE, 'within-normal') } })
    expect(missing.status).toBe(400)
    expect(missing.body.data.fields.map((f: { path: string }) => f.path)).toContain('eyes.LE')
    const off = await student.post(`/api/fundus/cases/${caseId}/attempts`, { eyes: { RE: precise(RE, 'within-normal'), LE: { disc: { x: 50, y: 1 }, fovea: { x: 2, y: 2 }, finding: 'within-normal' } } })
    expect(off.status).toBe(400)
    expect(off.body.data.fields[0].path).toBe('eyes.LE.disc.x')
    const badFinding = await student.post(`/api/fundus/cases/${caseId}/attempts`, { eyes: { RE: precise(RE, 'sideways'), LE: precise(RE, 'within-normal') } })
    expect(badFinding.status).toBe(400)
    expect(badFinding.body.data.fields[0].path).toBe('eyes.RE.finding')
    const nothing = (await student.get<CaseFundusView>(`/api/fundus/cases/${caseId}`)).body
    expect(nothing.attempts).toHaveLength(0)
  })
})
