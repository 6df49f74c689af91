// Issue 12, points 4, 5, 7 and 8, against the built server (a server of its own,
// so the quizzes and photographs made here never reach another test file):
// - 4: quiz secrecy during a sitting (the library holds back a quiz's photograph;
//   a generated fundus item's picture arrives as pixels, not coordinates);
// - 5: a hidden case cannot be identified by replaying its seed with named templates;
// - 7: on a quiz shared across cohorts a tutor reaches only their own cohorts' students,
//   and quiz-wide settings are the owner's, lecturers' and admins';
// - 8: released means final.
import Papa from 'papaparse'
import sharp from 'sharp'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Client } from '../support/client'
import { DEMO, signedIn } from '../support/client'
import { readDb } from '../support/db'
import { SYNTHETIC_PHOTO, syntheticPng } from '../support/fundus'
import { cohortIds, minutesFromNow, publishQuiz } from '../support/quiz'
import type { RunningServer } from '../support/server'
import { startServer } from '../support/server'

let server: RunningServer
let baseURL: string
beforeAll(async () => {
  server = await startServer()
  baseURL = server.baseURL
})
afterAll(async () => {
  await server?.stop()
})

const KESTREL_STUDENT = 'oisin.marrable@cyclodial.test'
const HERON_STUDENT = 'kofi.ashgrove@cyclodial.test'
const dmrItem = { kind: 'dmr', source: { type: 'engine', templateId: 'so-palsy-right-standard' }, mode: 'learner-turns' }
const nilRecord = { gaze: 'primary', distance: 'near', readings: { RE: 90, LE: 90 }, record: 'DMR, near, primary position: no torsion either eye.' }

async function uploadMarkedPhoto(tutor: Client, title: string): Promise<{ id: number, imageUrl: string }> {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(await syntheticPng())], { type: 'image/png' }), 'fundus.png')
  for (const [k, v] of Object.entries({ title, eye: 'RE', consent: 'yes' })) form.append(k, v)
  const reply = await tutor.postForm('/api/fundus/photos', form)
  expect(reply.status, JSON.stringify(reply.body)).toBe(201)
  expect((await tutor.put(`/api/fundus/photos/${reply.body.id}/reference`, { disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea })).status).toBe(200)
  return reply.body
}

describe('point 8: released means final', () => {
  it('refuses a later close time after release, and any new sitting or submission', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const cohorts = await cohortIds(admin)
    const quiz = await publishQuiz(tutor, { title: 'Final once released', opensAt: minutesFromNow(-5), closesAt: minutesFromNow(30), attemptsAllowed: 3, cohortIds: [cohorts['Kestrel cohort']] }, [dmrItem])
    const item = quiz.items[0]!
    const student = await signedIn(baseURL, KESTREL_STUDENT)
    expect((await student.post(`/api/quizzes/${quiz.id}/start`)).status).toBe(200)
    const first = await student.post(`/api/quizzes/${quiz.id}/items/${item.id}/attempts`, nilRecord)
    expect(first.status, JSON.stringify(first.body)).toBe(201)

    const closeAt = minutesFromNow(-1)
    expect((await tutor.patch(`/api/quizzes/${quiz.id}`, { closesAt: closeAt })).body.phase).toBe('closed')
    expect((await tutor.post(`/api/quizzes/${quiz.id}/release`)).status).toBe(200)

    // moving the close time later (or removing it) would reopen the quiz with the answers out
    for (const closesAt of [minutesFromNow(60), null]) {
      const later = await tutor.patch(`/api/quizzes/${quiz.id}`, { closesAt })
      expect(later.status, JSON.stringify(later.body)).toBe(409)
      expect(later.body.message).toMatch(/released/)
      expect(later.body.data.fields[0].path).toBe('closesAt')
    }
    const lecturer = await signedIn(baseURL, DEMO.lecturer)
    expect((await lecturer.patch(`/api/quizzes/${quiz.id}`, { closesAt: minutesFromNow(60) })).status).toBe(409)
    const stored = (await tutor.get(`/api/quizzes/${quiz.id}`)).body
    expect(stored.phase).toBe('closed')
    expect(Date.parse(stored.closesAt)).toBe(Date.parse(closeAt))
    // bringing it forward stays allowed
    expect((await tutor.patch(`/api/quizzes/${quiz.id}`, { closesAt: minutesFromNow(-2) })).status).toBe(200)

    // nothing new is accepted: a resubmission, an autosave, a new sitting
    const again = await student.post(`/api/quizzes/${quiz.id}/items/${item.id}/attempts`, nilRecord)
    expect(again.status).toBe(409)
    expect((await student.put(`/api/quizzes/${quiz.id}/items/${item.id}/draft`, { ...nilRecord, prisms: [], lights: 'dim' })).status).toBe(409)
    const other = await signedIn(baseURL, 'wen.hallowby@cyclodial.test')
    const start = await other.post(`/api/quizzes/${quiz.id}/start`)
    expect(start.status).toBe(409)
    expect(start.body.message).toMatch(/released|closed/)
    const db = readDb(server.dbPath)
    expect(db.count('SELECT count(*) AS n FROM attempts WHERE quiz_id = ?', quiz.id)).toBe(1)
    db.close()
  })
})

describe('point 7: a tutor\'s reach is their cohorts', () => {
  it('shows and changes only the tutor\'s own cohorts\' students on a shared quiz; settings stay with the owner', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const lecturer = await signedIn(baseURL, DEMO.lecturer)
    const owner = await signedIn(baseURL, DEMO.tutor) // teaches Kestrel
    const other = await signedIn(baseURL, DEMO.tutor2) // teaches Heron
    const cohorts = await cohortIds(admin)
    const quiz = await publishQuiz(owner, { title: 'Shared across cohorts', opensAt: minutesFromNow(-5), closesAt: minutesFromNow(60), cohortIds: [cohorts['Kestrel cohort']] }, [dmrItem])
    // a lecturer shares it with Heron too
    expect((await lecturer.patch(`/api/quizzes/${quiz.id}`, { cohortIds: [cohorts['Kestrel cohort'], cohorts['Heron cohort']] })).status).toBe(200)
    const item = quiz.items[0]!

    const kestrel = await signedIn(baseURL, KESTREL_STUDENT)
    const heron = await signedIn(baseURL, HERON_STUDENT)
    const ids: Record<string, number> = {}
    const attempts: Record<string, number> = {}
    for (const [name, s] of [['kestrel', kestrel], ['heron', heron]] as const) {
      ids[name] = (await s.get('/api/auth/me')).body.user.id
      expect((await s.post(`/api/quizzes/${quiz.id}/start`)).status).toBe(200)
      const sent = await s.post(`/api/quizzes/${quiz.id}/items/${item.id}/attempts`, nilRecord)
      expect(sent.status).toBe(201)
      attempts[name] = sent.body.attemptId
    }

    // results and CSV: the Heron tutor sees Heron students only; the owner Kestrel only; the lecturer both
    const emails = async (c: Client) => ((await c.get(`/api/quizzes/${quiz.id}/results?pageSize=100`)).body.items as { email: string }[]).map(r => r.email)
    expect(await emails(other)).toContain(HERON_STUDENT)
    expect(await emails(other)).not.toContain(KESTREL_STUDENT)
    expect(await emails(owner)).toContain(KESTREL_STUDENT)
    expect(await emails(owner)).not.toContain(HERON_STUDENT)
    expect(await emails(lecturer)).toEqual(expect.arrayContaining([KESTREL_STUDENT, HERON_STUDENT]))
    const csv = await other.request('GET', `/api/quizzes/${quiz.id}/results.csv`, undefined, { headers: { accept: 'text/csv' } })
    expect(csv.status).toBe(200)
    const csvText = String(csv.body)
    expect(csvText).toContain(HERON_STUDENT)
    expect(csvText).not.toContain(KESTREL_STUDENT)
    expect(Papa.parse<string[]>(csvText.replace(/^\uFEFF/, '').trim()).data.slice(1).every(r => !r.includes(KESTREL_STUDENT))).toBe(true)
    // counts in the quiz summary are of the tutor's own students
    const summary = (await other.get(`/api/quizzes/${quiz.id}`)).body
    expect(summary).toMatchObject({ canManage: false, started: 1 })
    expect((await owner.get(`/api/quizzes/${quiz.id}`)).body.canManage).toBe(true)

    // another cohort's student: attempt, override and per-student patient are 404
    expect((await other.get(`/api/quizzes/${quiz.id}/attempts/${attempts.kestrel}`)).status).toBe(404)
    expect((await other.post(`/api/quizzes/${quiz.id}/attempts/${attempts.kestrel}/overrides`, { criterion: 'amount', score: 1, reason: 'Reaching across cohorts' })).status).toBe(404)
    expect((await other.get(`/api/quizzes/${quiz.id}/items/${item.id}/cases/${ids.kestrel}`)).status).toBe(404)
    expect((await owner.get(`/api/quizzes/${quiz.id}/attempts/${attempts.heron}`)).status).toBe(404)
    const db = readDb(server.dbPath)
    expect(db.count('SELECT count(*) AS n FROM quiz_mark_overrides WHERE attempt_id = ?', attempts.kestrel)).toBe(0)
    // their own student: allowed
    expect((await other.get(`/api/quizzes/${quiz.id}/attempts/${attempts.heron}`)).status).toBe(200)
    expect((await other.get(`/api/quizzes/${quiz.id}/items/${item.id}/cases/${ids.heron}`)).status).toBe(200)
    expect((await other.post(`/api/quizzes/${quiz.id}/attempts/${attempts.heron}/overrides`, { criterion: 'amount', score: 1, reason: 'Own cohort' })).status).toBe(201)
    expect((await lecturer.get(`/api/quizzes/${quiz.id}/attempts/${attempts.kestrel}`)).status).toBe(200)

    // quiz-wide settings: a non-owner tutor gets 403 with a message, nothing changes
    const refusals = [
      await other.patch(`/api/quizzes/${quiz.id}`, { closesAt: minutesFromNow(600) }),
      await other.patch(`/api/quizzes/${quiz.id}`, { title: 'Taken over' }),
      await other.patch(`/api/quizzes/${quiz.id}`, { published: false }),
      await other.post(`/api/quizzes/${quiz.id}/items`, dmrItem),
      await other.patch(`/api/quizzes/${quiz.id}/items/${item.id}`, { prompt: 'Changed' }),
      await other.delete(`/api/quizzes/${quiz.id}/items/${item.id}`),
      await other.post(`/api/quizzes/${quiz.id}/release`),
    ]
    for (const r of refusals) {
      expect(r.status).toBe(403)
      expect(r.body.message).toMatch(/owner/)
    }
    const row = db.get<{ title: string, closes_at: string, released_at: string | null }>('SELECT title, closes_at, released_at FROM quizzes WHERE id = ?', quiz.id)!
    expect(row).toMatchObject({ title: 'Shared across cohorts', released_at: null })
    expect(Date.parse(row.closes_at)).toBe(Date.parse(quiz.closesAt))
    db.close()
    // the owner still manages it
    expect((await owner.patch(`/api/quizzes/${quiz.id}`, { title: 'Shared across cohorts (v2)' })).status).toBe(200)
    expect((await owner.patch(`/api/quizzes/${quiz.id}`, { archived: true })).status).toBe(200)
  })
})

describe('point 4: quiz secrecy during a sitting', () => {
  it('holds a quiz\'s photograph back from its students\' library until feedback opens', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const cohorts = await cohortIds(admin)
    // shared with the tutor's cohorts (Kestrel) by default: students practise on it
    const photo = await uploadMarkedPhoto(tutor, 'Library and quiz')
    const student = await signedIn(baseURL, KESTREL_STUDENT)
    const listed = async () => ((await student.get('/api/fundus/photos')).body.items as { id: number }[]).map(p => p.id)
    const measure = { disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea, finding: 'within-normal' }
    expect(await listed()).toContain(photo.id)
    expect((await student.post(`/api/fundus/photos/${photo.id}/attempts`, measure)).status).toBe(201)

    const quiz = await publishQuiz(tutor, { title: 'Photograph in a sitting', opensAt: minutesFromNow(-5), closesAt: minutesFromNow(60), cohortIds: [cohorts['Kestrel cohort']] }, [
      { kind: 'fundus', source: { type: 'photo', id: photo.id } },
    ])
    // during the sitting: not listed, no page, and above all no graded attempt (its reference angle is the answer)
    expect(await listed()).not.toContain(photo.id)
    expect((await student.get(`/api/fundus/photos/${photo.id}`)).status).toBe(404)
    const attempt = await student.post(`/api/fundus/photos/${photo.id}/attempts`, measure)
    expect(attempt.status).toBe(404)
    expect(JSON.stringify(attempt.body)).not.toMatch(/referenceAngle|7\.1/)
    // the quiz still shows its pixels
    expect((await student.post(`/api/quizzes/${quiz.id}/start`)).status).toBe(200)
    expect((await student.bytes(photo.imageUrl)).status).toBe(200)
    // the other cohort's students and the tutor are unaffected
    expect(((await tutor.get('/api/fundus/photos')).body.items as { id: number }[]).map(p => p.id)).toContain(photo.id)

    // feedback opens at release: the photograph returns to the library
    expect((await tutor.patch(`/api/quizzes/${quiz.id}`, { closesAt: minutesFromNow(-1) })).status).toBe(200)
    expect(await listed()).not.toContain(photo.id) // closed, feedback held until release
    expect((await tutor.post(`/api/quizzes/${quiz.id}/release`)).status).toBe(200)
    expect(await listed()).toContain(photo.id)
    expect((await student.post(`/api/fundus/photos/${photo.id}/attempts`, measure)).status).toBe(201)
  })

  it('sends a generated fundus item\'s picture as server-rendered pixels, never the disc and fovea coordinates', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const cohorts = await cohortIds(admin)
    const quiz = await publishQuiz(tutor, { title: 'Drawn fundus in a sitting', opensAt: minutesFromNow(-5), closesAt: minutesFromNow(60), cohortIds: [cohorts['Kestrel cohort']] }, [
      { kind: 'fundus', source: { type: 'engine', templateId: 'so-palsy-right-standard' }, perStudent: true },
    ])
    const item = quiz.items[0]!
    const student = await signedIn(baseURL, KESTREL_STUDENT)
    const me = (await student.get('/api/auth/me')).body.user.id
    expect((await student.post(`/api/quizzes/${quiz.id}/start`)).status).toBe(200)
    const page = await student.get(`/api/quizzes/${quiz.id}/items/${item.id}`)
    expect(page.status).toBe(200)
    // the tutor's view has the geometry; none of its disc or fovea numbers reach the student
    const truth = (await tutor.get(`/api/quizzes/${quiz.id}/items/${item.id}/cases/${me}`)).body
    const secretNumbers = (['RE', 'LE'] as const).flatMap(e => [truth.presentation.eyes[e].disc.x, truth.presentation.eyes[e].disc.y, truth.presentation.eyes[e].fovea.x, truth.presentation.eyes[e].fovea.y])
    const numbers: number[] = []
    const keys: string[] = []
    const walk = (v: unknown) => {
      if (typeof v === 'number') numbers.push(v)
      else if (Array.isArray(v)) v.forEach(walk)
      else if (v && typeof v === 'object') {
        for (const [k, x] of Object.entries(v)) {
          keys.push(k)
          walk(x)
        }
      }
    }
    walk(page.body)
    expect(page.body.presentation).toBeNull()
    expect(keys).not.toContain('disc')
    expect(keys).not.toContain('fovea')
    expect(keys).not.toContain('lookKey')
    expect(numbers.filter(n => secretNumbers.includes(n))).toEqual([])

    // each eye is a PNG rendered on the server, the size the marks are measured in
    expect(Object.keys(page.body.pictures).sort()).toEqual(['LE', 'RE'])
    for (const eye of ['RE', 'LE'] as const) {
      const pic = page.body.pictures[eye]
      expect(pic).toMatchObject({ eye, width: truth.presentation.eyes[eye].frame.width, height: truth.presentation.eyes[eye].frame.height })
      const image = await student.bytes(pic.imageUrl)
      expect(image.status).toBe(200)
      expect(image.headers.get('content-type')).toBe('image/png')
      expect(image.headers.get('cache-control')).toMatch(/no-store/)
      const meta = await sharp(image.body).metadata()
      expect(meta.format).toBe('png')
      expect(meta.width! / meta.height!).toBeCloseTo(pic.width / pic.height, 2)
      // the optic disc is the brightest patch: it lies where the tutor's geometry puts it
      const { data, info } = await sharp(image.body).removeAlpha().raw().toBuffer({ resolveWithObject: true })
      let best = { x: 0, y: 0, v: -1 }
      for (let y = 0; y < info.height; y += 2) {
        for (let x = 0; x < info.width; x += 2) {
          const i = (y * info.width + x) * 3
          const v = data[i]! + data[i + 1]! + data[i + 2]!
          if (v > best.v) best = { x, y, v }
        }
      }
      const perUnit = info.width / pic.width
      const disc = truth.presentation.eyes[eye].disc
      expect(Math.hypot(best.x / perUnit - disc.x, best.y / perUnit - disc.y)).toBeLessThan(disc.width)
    }
    // each student's URL draws their own case: one who has not started gets 409, another cohort 404
    expect((await (await signedIn(baseURL, 'wen.hallowby@cyclodial.test')).bytes(page.body.pictures.RE.imageUrl)).status).toBe(409)
    expect((await (await signedIn(baseURL, HERON_STUDENT)).bytes(page.body.pictures.RE.imageUrl)).status).toBe(404)

    // marks in picture units are still graded against the same picture
    const eyes = Object.fromEntries((['RE', 'LE'] as const).map(e => [e, { disc: truth.presentation.eyes[e].disc, fovea: truth.presentation.eyes[e].fovea, finding: 'within-normal' }]))
    const sent = await student.post(`/api/quizzes/${quiz.id}/items/${item.id}/attempts`, { eyes })
    expect(sent.status, JSON.stringify(sent.body)).toBe(201)
    const view = (await tutor.get(`/api/quizzes/${quiz.id}/fundus-attempts/${sent.body.attemptId}`)).body
    expect(view.result.result.eyes.RE.measuredAngle).toBe(view.result.result.eyes.RE.referenceAngle)
    // the student's own review of it, before feedback, has no coordinates either
    const early = (await student.get(`/api/quizzes/${quiz.id}/fundus-attempts/${sent.body.attemptId}`)).body
    expect(early.presentation).toBeNull()
    expect(early.pictures.RE.imageUrl).toBe(page.body.pictures.RE.imageUrl)
    expect((await tutor.patch(`/api/quizzes/${quiz.id}`, { archived: true })).status).toBe(200)
  })
})

describe('point 5: hidden cases stay hidden', () => {
  /** FNV-1a of a string, as the engine's specKey hashes the JSON of its input. */
  const fnv = (s: string) => {
    let h = 0x811C9DC5
    for (const ch of JSON.stringify(s)) {
      h ^= ch.codePointAt(0)!
      h = Math.imul(h, 0x01000193) >>> 0
    }
    return h.toString(16).padStart(8, '0')
  }

  it('a seed sent with "any" cannot be replayed with a named template to find the hidden one', async () => {
    const student = await signedIn(baseURL, DEMO.student)
    const templates = (await student.get('/api/practice/templates')).body.items as { id: string, difficulties: string[] }[]
    expect(templates.length).toBeGreaterThan(5)
    const seed = 'replay-me'
    const db = readDb(server.dbPath)
    for (const mode of ['learner-turns', 'patient-turns'] as const) {
      const hidden = await student.post('/api/practice', { template: 'any', seed, mode, difficulty: 'standard' })
      expect(hidden.status).toBe(201)
      expect(hidden.body.template).toBeNull()
      // the browser gets no seed while the template is hidden
      expect(hidden.body.seed).toBeNull()
      expect((await student.get(`/api/practice/${hidden.body.id}`)).body.seed).toBeNull()
      const row = db.get<{ template_id: string, seed: string }>('SELECT template_id, seed FROM cases WHERE id = ?', hidden.body.id)!
      expect(row.seed).not.toBe(seed)
      // the words key is not an unkeyed hash of any template with the seed the learner knows
      for (const t of templates) {
        for (const d of t.difficulties) expect(hidden.body.presentation.wordsKey).not.toBe(`w-${fnv(`1|${t.id}-${d}|${seed}`)}`)
      }
      // replaying the seed with every named template gives a different patient each time
      for (const t of templates) {
        const named = await student.post('/api/practice', { template: t.id, seed, mode, difficulty: 'standard' })
        if (named.status !== 201) continue
        expect(named.body.presentation, `${t.id} with the learner's seed reproduces the hidden case`).not.toEqual(hidden.body.presentation)
      }
    }
    db.close()
  })

  it('a practice set\'s cases carry no seed and cannot be rebuilt from the set and learner', async () => {
    const lecturer = await signedIn(baseURL, DEMO.lecturer)
    const jory = await signedIn(baseURL, 'jory.feldane@cyclodial.test')
    const joryId = (await jory.get('/api/auth/me')).body.user.id
    const sent = await lecturer.post('/api/review/practice-sets', { learnerIds: [joryId], focus: 'image-recorded', size: 3 })
    expect(sent.status, JSON.stringify(sent.body)).toBe(201)
    const set = ((await jory.get('/api/practice-sets')).body.items as { id: number, cases: { id: number }[] }[]).find(s => s.id === sent.body.id)!
    const db = readDb(server.dbPath)
    for (const c of set.cases) {
      const view = (await jory.get(`/api/practice/${c.id}`)).body
      expect(view.template).toBeNull()
      expect(view.seed).toBeNull()
      const row = db.get<{ template_id: string, seed: string }>('SELECT template_id, seed FROM cases WHERE id = ?', c.id)!
      // the seed is not one the learner could work out from the set's number and their own id
      expect(row.seed).not.toMatch(new RegExp(`^set${sent.body.id}-l${joryId}-`))
      expect(row.seed).toMatch(/^h[0-9a-f]{20}$/)
    }
    db.close()
  })
})
