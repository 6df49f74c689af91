// Fundus items in quizzes, end to end over HTTP: a tutor uploads and marks a
// photograph, builds a quiz with a photograph item and a generated-fundus item,
// assigns it to one cohort; a student of that cohort sits it (autosave, reload,
// submit), the tutor sees and changes marks in the results and the CSV, releases,
// and the student sees the feedback. Students of the other cohort get 404s, and
// nothing graded reaches a student before release.
import Papa from 'papaparse'
import { describe, expect, inject, it } from 'vitest'
import { generateCase } from '~~/server/lib/engine/generator'
import type { Client } from '../support/client'
import { DEMO, signedIn, waitForMail } from '../support/client'
import { SYNTHETIC_PHOTO, syntheticPng } from '../support/fundus'
import { cohortIds, minutesFromNow, publishQuiz } from '../support/quiz'
import { caseSecrets, findCaseSecrets } from '../support/secrecy'

const baseURL = inject('baseURL')
const KESTREL_STUDENT = 'priya.vellacott@cyclodial.test'
const HERON_STUDENT = 'freya.dunmoor@cyclodial.test'
const TEMPLATE = 'so-palsy-right-standard'

// Normal disc–fovea angle, mean ± 2 SD: RE 6.26 ± 2.98°, LE 6.69 ± 2.84°
// (J Korean Ophthalmol Soc 2005;46(10):1684-9).
const NORMAL = { RE: [6.26 - 2 * 2.98, 6.26 + 2 * 2.98], LE: [6.69 - 2 * 2.84, 6.69 + 2 * 2.84] } as const
/** The finding a picture's angle stands for; within 1° of a limit either side is accepted (the grading's documented rule). */
function findingsFor(eye: 'RE' | 'LE', angle: number): string[] {
  const [low, high] = NORMAL[eye]
  const f = (a: number) => (a > high ? 'excyclo' : a < low ? 'incyclo' : 'within-normal')
  return [...new Set([f(angle), f(angle - 1), f(angle + 1)])]
}

async function uploadPhoto(client: Client, fields: Record<string, string> = {}) {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(await syntheticPng())], { type: 'image/png' }), 'fundus.png')
  for (const [k, v] of Object.entries({ title: 'Teaching fundus A', eye: 'RE', consent: 'yes', ...fields })) form.append(k, v)
  const reply = await client.postForm('/api/fundus/photos', form)
  expect(reply.status, JSON.stringify(reply.body)).toBe(201)
  return reply.body as { id: number, imageUrl: string }
}

/** Numbers and words at any path outside the student's own draft. */
function leavesOutsideDraft(body: unknown, path = ''): { path: string, value: unknown }[] {
  if (/(^|\.)(draft|marks)(\.|$)/.test(path)) return []
  if (Array.isArray(body)) return body.flatMap((v, i) => leavesOutsideDraft(v, `${path}.${i}`))
  if (body && typeof body === 'object') return Object.entries(body).flatMap(([k, v]) => [{ path: `${path}.${k}`, value: k }, ...leavesOutsideDraft(v, `${path}.${k}`)])
  return [{ path, value: body }]
}

describe('fundus items in quizzes', () => {
  it('builds, sits, marks, exports and releases a quiz with a photograph item and a generated fundus item', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const cohorts = await cohortIds(admin)

    // the tutor uploads a photograph and builds with it: refused until it is marked
    const photo = await uploadPhoto(tutor)
    const draftQuiz = (await tutor.post('/api/quizzes', { title: 'Fundus draft', cohortIds: [cohorts['Kestrel cohort']] })).body
    const unmarked = await tutor.post(`/api/quizzes/${draftQuiz.id}/items`, { kind: 'fundus', source: { type: 'photo', id: photo.id } })
    expect(unmarked.status).toBe(400)
    expect(unmarked.body.data.fields[0].path).toBe('source.id')
    expect(unmarked.body.message).toMatch(/no reference marks/)
    const marked = await tutor.put(`/api/fundus/photos/${photo.id}/reference`, { disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea })
    expect(marked.status).toBe(200)
    // RE: fovea 200 px temporal and 25 px below the disc centre: atan(25/200) = 7.1° (arithmetic)
    expect(marked.body.reference.angle).toBe(7.1)

    // a photograph the tutor cannot see, a double Maddox rod weight and a bad kind are refused, nothing added
    const heronPhoto = await uploadPhoto(await signedIn(baseURL, DEMO.tutor2), { title: 'Heron only' })
    await (await signedIn(baseURL, DEMO.tutor2)).put(`/api/fundus/photos/${heronPhoto.id}/reference`, { disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea })
    const notMine = await tutor.post(`/api/quizzes/${draftQuiz.id}/items`, { kind: 'fundus', source: { type: 'photo', id: heronPhoto.id } })
    expect(notMine.status).toBe(400)
    expect(notMine.body.data.fields[0]).toMatchObject({ path: 'source.id', message: expect.stringMatching(/not in your fundus library/) })
    const wrongWeight = await tutor.post(`/api/quizzes/${draftQuiz.id}/items`, { kind: 'fundus', source: { type: 'photo', id: photo.id }, weights: { measurement: 2 } })
    expect(wrongWeight.status).toBe(400)
    expect(wrongWeight.body.data.fields[0].path).toBe('weights.measurement')
    const badKind = await tutor.post(`/api/quizzes/${draftQuiz.id}/items`, { kind: 'retina', source: { type: 'photo', id: photo.id } })
    expect(badKind.status).toBe(400)
    expect(badKind.body.message).toMatch(/"dmr" or "fundus"/)
    const photoOnDmr = await tutor.post(`/api/quizzes/${draftQuiz.id}/items`, { kind: 'dmr', source: { type: 'photo', id: photo.id } })
    expect(photoOnDmr.status).toBe(400)
    expect((await tutor.get(`/api/quizzes/${draftQuiz.id}`)).body.items).toHaveLength(0)

    const quiz = await publishQuiz(tutor, {
      title: 'Fundus measuring check',
      opensAt: minutesFromNow(-2),
      closesAt: minutesFromNow(60),
      attemptsAllowed: 2,
      cohortIds: [cohorts['Kestrel cohort']],
    }, [
      { kind: 'fundus', prompt: 'Measure this photograph.', source: { type: 'photo', id: photo.id }, weights: { fundusAngle: 3, fundusFinding: 1 } },
      { kind: 'fundus', prompt: 'Measure both eyes.', source: { type: 'engine', templateId: TEMPLATE }, perStudent: true },
    ])
    const [photoItem, caseItem] = quiz.items as any[]
    expect(photoItem).toMatchObject({ kind: 'fundus', mode: null, perStudent: false, tolerance: 1, source: { type: 'photo', id: photo.id, eye: 'RE', angle: 7.1 }, weights: { fundusAngle: 3, fundusFinding: 1 } })
    expect(Object.keys(photoItem.weights).sort()).toEqual(['fundusAngle', 'fundusFinding'])
    expect(caseItem).toMatchObject({ kind: 'fundus', perStudent: true, source: { type: 'engine', templateId: TEMPLATE }, weights: { fundusAngle: 2, fundusFinding: 2 } })
    // once a quiz uses it, the photograph cannot be deleted from under it
    const del = await tutor.delete(`/api/fundus/photos/${photo.id}`)
    expect(del.status).toBe(409)
    expect(del.body.message).toMatch(/Fundus measuring check/)

    // a student of the other cohort sees nothing of it
    const heron = await signedIn(baseURL, HERON_STUDENT)
    expect((await heron.get(`/api/quizzes/${quiz.id}`)).status).toBe(404)
    expect((await heron.get(`/api/quizzes/${quiz.id}/items/${photoItem.id}`)).status).toBe(404)
    expect((await heron.put(`/api/quizzes/${quiz.id}/items/${photoItem.id}/draft`, { eyes: {} })).status).toBe(404)
    expect((await heron.bytes(photo.imageUrl)).status).toBe(404)

    // the Kestrel student sits it
    const student = await signedIn(baseURL, KESTREL_STUDENT)
    const me = (await student.get('/api/auth/me')).body.user.id
    const replies: [string, unknown][] = []
    replies.push(['start', (await student.post(`/api/quizzes/${quiz.id}/start`)).body])
    const photoPath = `/api/quizzes/${quiz.id}/items/${photoItem.id}`
    const casePath = `/api/quizzes/${quiz.id}/items/${caseItem.id}`
    const photoView = await student.get(photoPath)
    expect(photoView.status).toBe(200)
    expect(photoView.body).toMatchObject({ kind: 'fundus', eyes: ['RE'], presentation: null, photo: { imageUrl: photo.imageUrl, width: 640, height: 480, eye: 'RE' }, draft: null, attemptsLeft: 2 })
    replies.push(['photo item', photoView.body])
    const image = await student.bytes(photoView.body.photo.imageUrl)
    expect(image.status).toBe(200)
    expect(image.headers.get('content-type')).toBe('image/png')
    const caseView = await student.get(casePath)
    // a generated picture reaches the student as server-rendered pixels, not as its geometry
    expect(caseView.body).toMatchObject({ kind: 'fundus', eyes: ['RE', 'LE'], photo: null, presentation: null, pictures: { RE: { eye: 'RE', width: 8, height: 6 }, LE: { eye: 'LE' } } })
    replies.push(['case item', caseView.body])
    expect((await student.bytes(caseView.body.pictures.RE.imageUrl)).headers.get('content-type')).toBe('image/png')
    // the disc and fovea to mark come from the tutor's view of the same picture
    const pictures = (await tutor.get(`/api/quizzes/${quiz.id}/items/${caseItem.id}/cases/${me}`)).body.presentation.eyes

    // autosave survives a reload; a bad draft is refused naming the field
    const partial = { eyes: { RE: { disc: { x: 428, y: 222 }, fovea: null, finding: null } } }
    const saved = await student.put(`${photoPath}/draft`, partial)
    expect(saved.status).toBe(200)
    replies.push(['photo draft', saved.body])
    const badDraft = await student.put(`${photoPath}/draft`, { eyes: { RE: { disc: { x: 'left', y: 1 } } } })
    expect(badDraft.status).toBe(400)
    expect(badDraft.body.data.fields[0].path).toBe('eyes.RE.disc.x')
    const reloaded = await student.get(photoPath)
    expect(reloaded.body.draft).toMatchObject(partial)
    const caseDraft = { eyes: { RE: { disc: pictures.RE.disc, fovea: pictures.RE.fovea, finding: null } } }
    expect((await student.put(`${casePath}/draft`, caseDraft)).status).toBe(200)
    expect((await student.get(casePath)).body.draft.eyes.RE.disc).toMatchObject({ x: pictures.RE.disc.x, y: pictures.RE.disc.y })

    // the tutor sees the same picture with its reference angles; the stored seed is the student's
    const tutorCase = (await tutor.get(`/api/quizzes/${quiz.id}/items/${caseItem.id}/cases/${me}`)).body
    expect(tutorCase).toMatchObject({ kind: 'fundus', stored: true, presentation: { eyes: pictures } })
    expect(tutorCase.draft.eyes.RE.disc).toMatchObject({ x: pictures.RE.disc.x })
    const angles = tutorCase.angles as { RE: number, LE: number }

    // submit: the photograph needs its one eye, marks on the picture; the case needs both eyes
    const missingEye = await student.post(`${casePath}/attempts`, { eyes: { RE: { disc: pictures.RE.disc, fovea: pictures.RE.fovea, finding: 'within-normal' } } })
    expect(missingEye.status).toBe(400)
    expect(missingEye.body.data.fields.map((f: { path: string }) => f.path)).toEqual(['eyes.LE'])
    const offPicture = await student.post(`${photoPath}/attempts`, { eyes: { RE: { disc: { x: 700, y: 222 }, fovea: { x: 231, y: 246 }, finding: 'within-normal' } } })
    expect(offPicture.status).toBe(400)
    expect(offPicture.body.data.fields[0].path).toBe('eyes.RE.disc')
    const wrongEye = await student.post(`${photoPath}/attempts`, { eyes: { LE: { disc: { x: 428, y: 222 }, fovea: { x: 231, y: 246 }, finding: 'within-normal' } } })
    expect(wrongEye.status).toBe(400)

    // photograph: marks make atan(24/197) = 6.9°, within 1° of 7.1°; 7.1° lies inside the RE normal range above
    const photoSent = await student.post(`${photoPath}/attempts`, { eyes: { RE: { disc: { x: 428, y: 222 }, fovea: { x: 231, y: 246 }, finding: 'within-normal' } } })
    expect(photoSent.status, JSON.stringify(photoSent.body)).toBe(201)
    expect(photoSent.body.message).toMatch(/Marks and feedback come when your tutor releases/)
    replies.push(['photo attempt', photoSent.body])
    const caseBody = { eyes: {
      RE: { disc: pictures.RE.disc, fovea: pictures.RE.fovea, finding: findingsFor('RE', angles.RE)[0] },
      LE: { disc: pictures.LE.disc, fovea: pictures.LE.fovea, finding: findingsFor('LE', angles.LE)[0] },
    } }
    const caseSent = await student.post(`${casePath}/attempts`, caseBody)
    expect(caseSent.status, JSON.stringify(caseSent.body)).toBe(201)
    replies.push(['case attempt', caseSent.body])
    replies.push(['photo attempt view', (await student.get(`/api/quizzes/${quiz.id}/fundus-attempts/${photoSent.body.attemptId}`)).body])
    replies.push(['case attempt view', (await student.get(`/api/quizzes/${quiz.id}/fundus-attempts/${caseSent.body.attemptId}`)).body])
    replies.push(['photo item again', (await student.get(photoPath)).body])
    replies.push(['case item again', (await student.get(casePath)).body])
    replies.push(['detail', (await student.get(`/api/quizzes/${quiz.id}`)).body])
    replies.push(['list', (await student.get('/api/quizzes')).body])
    expect((await student.post(`${casePath}/turns`, { gaze: 'primary', distance: 'near' })).status).toBe(409)

    // nothing graded before release: no case secrets, no reference point or angle of the photograph
    const secrets = caseSecrets(generateCase(TEMPLATE, tutorCase.seed))
    const leaks: string[] = []
    for (const [what, body] of replies) {
      for (const leak of findCaseSecrets(body, secrets, {
        ignore: [/(^|\.)draft(\.|$)/, /(^|\.)attempt\.marks(\.|$)/],
        allowNumbersAt: [/(^|\.)presentation\.eyes\.(RE|LE)\.(frame|field|disc|fovea)\./, /(^|\.)(fundusPresentationVersion|fundusVersion|itemId|quizId|position|attempts|attemptsLeft|attemptsAllowed|itemCount|timeLimitMinutes|width|height)$/],
      })) leaks.push(`${what}: ${leak}`)
      for (const leaf of leavesOutsideDraft(body)) {
        if (typeof leaf.value === 'string' && /^(angle|referenceAngle|measuredAngle|expectedFinding|acceptedFindings|normalRanges|explanation)$|within-normal/.test(leaf.value)) leaks.push(`${what} ${leaf.path}: "${leaf.value}"`)
        if (leaf.value === 7.1 || leaf.value === SYNTHETIC_PHOTO.disc.x || leaf.value === SYNTHETIC_PHOTO.fovea.y) leaks.push(`${what} ${leaf.path}: ${leaf.value} is the photograph's reference`)
      }
    }
    expect(leaks).toEqual([])
    const early = (await student.get(`/api/quizzes/${quiz.id}/fundus-attempts/${caseSent.body.attemptId}`)).body
    expect(early).toMatchObject({ feedbackOpen: false, result: null, reference: null })

    // the other cohort cannot open the attempt; a tutor sees results with one column per criterion
    expect((await heron.get(`/api/quizzes/${quiz.id}/fundus-attempts/${caseSent.body.attemptId}`)).status).toBe(404)
    const results = (await tutor.get(`/api/quizzes/${quiz.id}/results?q=vellacott`)).body
    expect(results.columns.map((c: any) => [c.kind, c.criteria.map((k: any) => k.criterion)])).toEqual([['fundus', ['fundusAngle', 'fundusFinding']], ['fundus', ['fundusAngle', 'fundusFinding']]])
    const row = results.items[0]
    expect(row.items[photoItem.id]).toMatchObject({ attemptId: photoSent.body.attemptId, earned: 4, possible: 4 })
    expect(row.items[caseItem.id]).toMatchObject({ attemptId: caseSent.body.attemptId, earned: 4, possible: 4 })
    expect(row.earned).toBe(8)

    // a tutor's override on a fundus mark, audit-logged, moves the results
    const view = await tutor.get(`/api/quizzes/${quiz.id}/fundus-attempts/${caseSent.body.attemptId}`)
    expect(view.body.result.result.eyes.RE.referenceAngle).toBe(angles.RE)
    const notFundus = await tutor.post(`/api/quizzes/${quiz.id}/fundus-attempts/${caseSent.body.attemptId}/overrides`, { criterion: 'amount', score: 0, reason: 'no such mark' })
    expect(notFundus.status).toBe(400)
    expect(notFundus.body.data.fields[0].path).toBe('criterion')
    const changed = await tutor.post(`/api/quizzes/${quiz.id}/fundus-attempts/${caseSent.body.attemptId}/overrides`, { criterion: 'fundusFinding', score: 0.5, reason: 'Right finding, but say which eye first' })
    expect(changed.status).toBe(201)
    expect(changed.body.result.marks.find((m: any) => m.criterion === 'fundusFinding')).toMatchObject({ score: 0.5, overridden: true })
    // the tutor's view lists the change with its reason once, beside the marks, not inside the mark's own reason
    expect(changed.body.result.marks.find((m: any) => m.criterion === 'fundusFinding').reason).not.toMatch(/Changed by your tutor/)
    expect(changed.body.overrides).toEqual([expect.objectContaining({ criterion: 'fundusFinding', previousScore: 1, score: 0.5, reason: 'Right finding, but say which eye first' })])
    const audit = (await admin.get('/api/admin/audit?pageSize=100')).body.items
    expect(audit.find((e: any) => e.action === 'quiz.mark-overridden' && e.detail?.criterion === 'fundusFinding')?.detail).toMatchObject({ from: 1, to: 0.5 })
    const after = (await tutor.get(`/api/quizzes/${quiz.id}/results?q=vellacott`)).body.items[0]
    expect(after.items[caseItem.id].earned).toBe(3) // 2 × 1 + 2 × 0.5

    // CSV: one column per item and criterion, agreeing with the table
    const csv = await tutor.request('GET', `/api/quizzes/${quiz.id}/results.csv`, undefined, { headers: { accept: 'text/csv' } })
    const rows = Papa.parse<string[]>(String(csv.body).replace(/^\uFEFF/, '').trim()).data
    const header = rows[0]!
    expect(header).toEqual(expect.arrayContaining(['Item 1 total', 'Item 1 disc–fovea angle', 'Item 1 objective finding', 'Item 2 total', 'Item 2 disc–fovea angle', 'Item 2 objective finding']))
    const mine = rows.find(r => r[1] === KESTREL_STUDENT)!
    expect(Number(mine[header.indexOf('Item 1 disc–fovea angle')])).toBe(3)
    expect(Number(mine[header.indexOf('Item 2 objective finding')])).toBe(1)
    expect(Number(mine[header.indexOf('Total points')])).toBe(7)

    // after the close: late marks are refused and kept as they were
    const closed = await tutor.patch(`/api/quizzes/${quiz.id}`, { closesAt: minutesFromNow(-0.01) })
    expect(closed.body.phase).toBe('closed')
    const late = await student.post(`${photoPath}/attempts`, { eyes: { RE: { disc: { x: 430, y: 220 }, fovea: { x: 230, y: 245 }, finding: 'within-normal' } } })
    expect(late.status).toBe(409)
    expect(late.body.message).toMatch(/Time is up/)
    const lateSave = await student.put(`${photoPath}/draft`, { eyes: { RE: { disc: null, fovea: null, finding: null } } })
    expect(lateSave.status).toBe(409)
    expect((await student.get(photoPath)).body.draft).toMatchObject(partial)

    // release: e-mail names the fundus items; feedback opens with the grading and the comparison
    const released = await tutor.post(`/api/quizzes/${quiz.id}/release`)
    expect(released.status).toBe(200)
    const mail = await waitForMail(admin, KESTREL_STUDENT, /Results released: Fundus measuring check/)
    expect(mail.text).toMatch(/Fundus items 1, 2: your disc–fovea angle/)
    const detail = (await student.get(`/api/quizzes/${quiz.id}`)).body
    const [fbPhoto, fbCase] = detail.items.map((i: any) => i.fundusFeedback)
    expect(fbPhoto.result.eyes.RE).toMatchObject({ measuredAngle: 6.9, referenceAngle: 7.1, expectedFinding: 'within-normal' })
    expect(fbPhoto.points).toEqual({ earned: 4, possible: 4 })
    expect(fbCase.marks.find((m: any) => m.criterion === 'fundusFinding').reason).toMatch(/Changed by your tutor: Right finding, but say which eye first/)
    expect(fbCase.comparison.explanation.join(' ')).toMatch(/double Maddox rod/)
    expect(detail.total).toEqual({ earned: 7, possible: 8, score: 7 / 8 })
    const reviewed = (await student.get(`/api/quizzes/${quiz.id}/fundus-attempts/${photoSent.body.attemptId}`)).body
    expect(reviewed.reference.RE).toEqual({ disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea })
    expect((await heron.bytes(photo.imageUrl)).status).toBe(404)
  })

  it('serves a photograph that is shared with no cohort to the quiz\'s students only, and only its pixels', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const lecturer = await signedIn(baseURL, DEMO.lecturer)
    const cohorts = await cohortIds(admin)
    const photo = await uploadPhoto(lecturer, { title: 'Lecturer reserve' })
    expect((await lecturer.put(`/api/fundus/photos/${photo.id}/reference`, { disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea })).status).toBe(200)
    const kestrel = await signedIn(baseURL, 'wen.hallowby@cyclodial.test')
    expect((await kestrel.bytes(photo.imageUrl)).status).toBe(404)

    const created = (await lecturer.post('/api/quizzes', { title: 'Reserve photograph', opensAt: minutesFromNow(-1), closesAt: minutesFromNow(30), cohortIds: [cohorts['Kestrel cohort']] })).body
    expect((await lecturer.post(`/api/quizzes/${created.id}/items`, { kind: 'fundus', source: { type: 'photo', id: photo.id } })).status).toBe(201)
    // a draft quiz gives students nothing
    expect((await kestrel.bytes(photo.imageUrl)).status).toBe(404)
    expect((await lecturer.patch(`/api/quizzes/${created.id}`, { published: true })).status).toBe(200)
    expect((await kestrel.bytes(photo.imageUrl)).status).toBe(200)
    // the Kestrel tutor, who manages the quiz through the cohort, may see the pixels to review it
    expect((await (await signedIn(baseURL, DEMO.tutor)).bytes(photo.imageUrl)).status).toBe(200)
    // but not the library page (its title) nor practice grading against the reference marks
    expect((await kestrel.get(`/api/fundus/photos/${photo.id}`)).status).toBe(404)
    expect((await kestrel.post(`/api/fundus/photos/${photo.id}/attempts`, { disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea, finding: 'within-normal' })).status).toBe(404)
    expect((await kestrel.get('/api/fundus/photos')).body.items.map((p: { id: number }) => p.id)).not.toContain(photo.id)
    // the other cohort and the other tutor: 404
    expect((await (await signedIn(baseURL, 'noor.bramblecote@cyclodial.test')).bytes(photo.imageUrl)).status).toBe(404)
    expect((await (await signedIn(baseURL, DEMO.tutor2)).bytes(photo.imageUrl)).status).toBe(404)
    // archived: its students lose the pixels again
    expect((await lecturer.patch(`/api/quizzes/${created.id}`, { archived: true })).status).toBe(200)
    expect((await kestrel.bytes(photo.imageUrl)).status).toBe(404)
  })
})
