// LTI 1.3 in Chromium with the practice platform (tests/support/lti-platform.ts): a tutor
// deep-links a quiz into a course; a student launches, sits it and hands it in; the tutor
// releases; the practice platform receives the score. The LTI pages pass axe on the way.
import AxeBuilder from '@axe-core/playwright'
import { expect, test, type Page } from '@playwright/test'
import type { PracticePlatform } from '../support/lti-platform'
import { WCAG_TAGS } from './a11y-helpers'
import { hydrated, sameOrigin } from './helpers'
import { registeredPlatform } from './lti-helpers'

const COURSE = `Orthoptics practice course ${Date.now()}`
const TITLE = 'Course quiz: cyclotorsion record'

let platform: PracticePlatform

test.beforeAll(async ({ baseURL }) => {
  platform = await registeredPlatform(baseURL!, COURSE)
})
test.afterAll(async () => {
  await platform?.stop()
})

async function noAxeViolations(page: Page) {
  const results = await new AxeBuilder({ page }).withTags(WCAG_TAGS).analyze()
  expect(results.violations.map(v => `${v.id}: ${v.nodes.map(n => n.target.join(' ')).slice(0, 3).join(', ')}`), page.url()).toEqual([])
}

test('a tutor deep-links a quiz; a student launches, sits and hands in; the release reaches the platform', async ({ browser }) => {
  test.setTimeout(120_000)
  // the tutor clicks "add content" in the course: first launch from this course
  const tutor = await (await browser.newContext()).newPage()
  await tutor.goto(`${platform.issuer}/start?as=tutor&deep=1`)
  await expect(tutor).toHaveURL(/\/lti\/course\?launch=/)
  await expect(tutor.getByRole('heading', { level: 1, name: 'Link your course to a cohort' })).toBeVisible()
  await expect(tutor.getByText(COURSE).first()).toBeVisible()
  await tutor.waitForLoadState('networkidle')
  await noAxeViolations(tutor)
  await expect(tutor.getByLabel('Name of the new cohort')).toHaveValue(COURSE)
  await tutor.getByRole('button', { name: 'Link the course' }).click()
  await expect(tutor).toHaveURL(/\/lti\/deep-link\?launch=/)
  await expect(tutor.getByText('You have no quiz with items to add yet.')).toBeVisible()

  // the tutor (a new Cyclodial account, made by the launch) builds a quiz for the course's cohort
  const cohorts = await (await tutor.request.get('/api/quizzes/cohorts')).json() as { id: number, name: string }[] | { items: { id: number, name: string }[] }
  const cohort = (Array.isArray(cohorts) ? cohorts : cohorts.items).find(c => c.name === COURSE)!
  expect(cohort).toBeTruthy()
  const now = Date.now()
  const created = await tutor.request.post('/api/quizzes', { headers: sameOrigin(tutor), data: { title: TITLE, opensAt: new Date(now - 120_000).toISOString(), closesAt: new Date(now + 30 * 60_000).toISOString(), cohortIds: [cohort.id] } })
  expect(created.status(), await created.text()).toBe(201)
  const quizId = (await created.json()).id as number
  const item = await tutor.request.post(`/api/quizzes/${quizId}/items`, { headers: sameOrigin(tutor), data: { kind: 'dmr', source: { type: 'engine', templateId: 'so-palsy-right-standard' }, mode: 'patient-turns' } })
  expect(item.status(), await item.text()).toBe(201)
  expect((await tutor.request.patch(`/api/quizzes/${quizId}`, { headers: sameOrigin(tutor), data: { published: true } })).status()).toBe(200)

  await tutor.reload()
  await expect(tutor.getByRole('heading', { level: 1, name: 'Add a quiz to your course' })).toBeVisible()
  await tutor.waitForLoadState('networkidle')
  await noAxeViolations(tutor)
  await tutor.getByRole('radio', { name: new RegExp(TITLE) }).check()
  await tutor.getByRole('button', { name: 'Add to the course' }).click()
  // the signed response posts itself to the platform, which makes the link and its line item
  await expect(tutor).toHaveURL(`${platform.issuer}/deep-link-return`)
  await expect(tutor.getByRole('heading', { name: 'Added to the course' })).toBeVisible()
  await expect(tutor.locator('#added')).toContainText(TITLE)
  const link = [...platform.links.values()].find(l => l.custom.cyclodial_quiz === String(quizId))!
  expect(link.lineItemId).toBeTruthy()
  const maximum = platform.lineItems.get(link.lineItemId!)!.scoreMaximum
  expect(maximum).toBeGreaterThan(0)

  // a student clicks the link in the course and arrives signed in, at the quiz
  const student = await (await browser.newContext()).newPage()
  await student.goto(`${platform.issuer}/start?as=student&link=${link.id}`)
  await expect(student).toHaveURL(new RegExp(`/student/quizzes/${quizId}$`))
  await hydrated(student)
  await student.getByRole('button', { name: 'Start the quiz' }).click()
  await expect(student).toHaveURL(new RegExp(`/student/quizzes/${quizId}/items/\\d+$`))
  const turned = student.waitForResponse(r => r.url().endsWith('/turns') && r.request().method() === 'POST')
  await student.getByRole('button', { name: 'Ask the patient to set the rods' }).click()
  const turn = await (await turned).json()
  const read = { RE: Math.round(turn.readings.RE), LE: Math.round(turn.readings.LE) }
  await student.getByLabel('Your reading, right-eye scale (°)').fill(String(read.RE))
  await student.getByLabel('Your reading, left-eye scale (°)').fill(String(read.LE))
  await student.getByLabel('Your record').fill('DMR, near, primary position: RE 6° excyclotorsion, LE no torsion')
  const sent = student.waitForResponse(r => r.url().endsWith('/attempts') && r.request().method() === 'POST')
  await student.getByRole('button', { name: 'Submit record' }).click()
  expect((await sent).status()).toBe(201)
  await student.getByRole('link', { name: 'All items' }).click()
  await student.getByRole('button', { name: 'Finish the quiz' }).click()
  await student.getByRole('dialog', { name: 'Finish the quiz now?' }).getByRole('button', { name: 'Finish the quiz' }).click()
  await expect(student.getByText('Your work is in.')).toBeVisible()

  // the tutor closes the quiz and releases the results
  await tutor.goto(`/quizzes/${quizId}/results`)
  expect((await tutor.request.patch(`/api/quizzes/${quizId}`, { headers: sameOrigin(tutor), data: { closesAt: new Date(Date.now() - 1000).toISOString() } })).status()).toBe(200)
  await tutor.reload()
  const results = await (await tutor.request.get(`/api/quizzes/${quizId}/results`)).json()
  const row = results.items.find((r: { name: string }) => r.name === platform.people.student.name)
  await tutor.getByRole('button', { name: 'Release results' }).click()
  await tutor.getByRole('dialog', { name: 'Release the results?' }).getByRole('button', { name: 'Release and e-mail' }).click()
  await expect(tutor.getByText(/Results released/)).toBeVisible()

  // the practice platform receives the student's score on the line item
  await expect.poll(() => platform.scores.filter(s => s.lineItemId === link.lineItemId).length, { timeout: 15_000 }).toBe(1)
  const score = platform.scores.find(s => s.lineItemId === link.lineItemId)!
  expect(score).toMatchObject({ userId: platform.people.student.sub, scoreMaximum: maximum, scoreGiven: Math.round(row.earned * 100) / 100, activityProgress: 'Completed', gradingProgress: 'FullyGraded' })

  // and the tutor sees it in the log
  await tutor.getByRole('link', { name: 'Marks sent to learning platforms' }).click()
  await expect(tutor.getByRole('heading', { level: 1, name: new RegExp(`Marks sent to learning platforms: ${TITLE}`) })).toBeVisible()
  await expect(tutor.getByRole('row', { name: new RegExp(platform.people.student.name) })).toContainText('Sent')
  await tutor.waitForLoadState('networkidle')
  await noAxeViolations(tutor)
})

test('a replayed or tampered launch is refused with a page, in the browser too', async ({ page }) => {
  await page.goto(`${platform.issuer}/start?as=student`)
  await expect(page).toHaveURL(/\/student$/)
  // the browser's back button to the platform's post would replay it; do it by hand
  const res = await page.request.post('/api/lti/launch', { form: { id_token: 'not.a.token', state: 'no-such-state' } })
  expect(res.status()).toBe(400)
  expect(await res.text()).toContain('The launch from your learning platform was refused')
})
