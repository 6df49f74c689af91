// Plain words for staff: walks the staff pages of the demo school (slip patterns,
// replays, quiz results and attempts, the audit log) and fails on any slip code or
// audit action code in the visible text. The codes come from the code itself:
// SLIP_CODES (shared/engine/slips.ts) and every action the server writes
// (tests/support/audit-actions.ts reads the writeAudit calls).
import { expect, test } from '@playwright/test'
import type { APIRequestContext, Page } from '@playwright/test'
import { SLIP_CODES } from '../../shared/engine/slips'
import { writtenAuditActions } from '../support/audit-actions'
import { sameOrigin, signIn } from './helpers'

const CODES = [...SLIP_CODES, ...writtenAuditActions()]

async function expectNoCodes(page: Page, url: string) {
  await page.goto(url)
  await expect(page.getByRole('heading', { level: 1 })).toBeVisible()
  await page.waitForLoadState('networkidle')
  const text = await page.locator('body').innerText()
  const found = CODES.filter(c => text.includes(c))
  expect(found, `${url} shows internal codes`).toEqual([])
  return text
}

async function get<T>(request: APIRequestContext, url: string): Promise<T> {
  const r = await request.get(url)
  expect(r.status(), url).toBe(200)
  return await r.json() as T
}

test('the list of codes is read from the code', () => {
  expect(SLIP_CODES.length).toBeGreaterThan(10)
  expect(CODES).toEqual(expect.arrayContaining(['direction-reversed', 'dial-value-as-amount', 'quiz.updated', 'user.role-changed']))
})

test('a tutor\'s and a lecturer\'s pages name slips and criteria in words', async ({ page }) => {
  test.setTimeout(180_000)
  for (const email of ['tutor@cyclodial.test', 'lecturer@cyclodial.test']) {
    await page.context().clearCookies()
    await signIn(page, email)
    const quizzes = await get<{ items: { id: number, title: string }[] }>(page.request, '/api/quizzes')
    const week3 = quizzes.items.find(q => q.title === 'Week 3: writing the record')!
    const results = await get<{ items: { items: Record<string, { attemptId: number | null, slips: string[] }> }[] }>(page.request, `/api/quizzes/${week3.id}/results?pageSize=100`)
    const withSlips = results.items.flatMap(r => Object.values(r.items)).filter(c => c.attemptId && c.slips.length).slice(0, 3)
    expect(withSlips.length, 'demo quiz attempts with slips').toBeGreaterThan(0)
    const replays = await get<{ items: { id: number, slips: unknown[] }[] }>(page.request, '/api/review/attempts?pageSize=50')
    const replayWithSlips = replays.items.filter(a => a.slips.length).slice(0, 3)
    expect(replayWithSlips.length, 'demo replays with slips').toBeGreaterThan(0)

    const pages = [
      email.startsWith('tutor') ? '/tutor' : '/lecturer',
      '/review',
      '/review/attempts',
      ...replayWithSlips.map(a => `/review/attempts/${a.id}`),
      '/review/sets',
      `/quizzes/${week3.id}/results`,
      ...withSlips.map(c => `/quizzes/${week3.id}/attempts/${c.attemptId}`),
    ]
    for (const url of pages) await expectNoCodes(page, url)
    // the slip patterns page still names the slips, in words
    const review = await expectNoCodes(page, '/review')
    expect(review).toMatch(/Direction reversed|Dial figure|Amount/i)
  }
})

test('the audit log says what changed in words, old → new', async ({ page }) => {
  await signIn(page, 'admin@cyclodial.test')
  // two changes to log: a role changed and changed back, and a quiz's time limit
  const users = await get<{ items: { id: number, name: string }[] }>(page.request, '/api/admin/users?q=Noor')
  const noor = users.items[0]!
  for (const role of ['tutor', 'student']) {
    expect((await page.request.patch(`/api/admin/users/${noor.id}`, { headers: sameOrigin(page), data: { role } })).status()).toBe(200)
  }
  const quizzes = await get<{ items: { id: number, title: string }[] }>(page.request, '/api/quizzes')
  const later = quizzes.items.find(q => q.title === 'End-of-term assessment')!
  expect((await page.request.patch(`/api/quizzes/${later.id}`, { headers: sameOrigin(page), data: { timeLimitMinutes: 75 } })).status()).toBe(200)
  expect((await page.request.patch(`/api/quizzes/${later.id}`, { headers: sameOrigin(page), data: { timeLimitMinutes: 60 } })).status()).toBe(200)

  const text = await expectNoCodes(page, '/admin/audit')
  expect(text).not.toMatch(/[{}]|"\w+":/)
  const rows = page.getByRole('row')
  await expect(rows.filter({ hasText: 'Role changed' }).filter({ hasText: 'Noor Bramblecote' }).first()).toContainText('Role: tutor → student')
  await expect(rows.filter({ hasText: 'Role changed' }).filter({ hasText: 'Noor Bramblecote' }).nth(1)).toContainText('Role: student → tutor')
  await expect(rows.filter({ hasText: 'Quiz changed' }).first()).toContainText('Time limit: 75 min → 60 min')
  await expect(rows.filter({ hasText: 'Quiz changed' }).first()).toContainText('quiz “End-of-term assessment”')
  await page.screenshot({ path: 'test-results/screenshots/audit-in-words.png', fullPage: true })
})
