// Pages that survive a reload: every staff and student page of the demo school,
// opened by direct URL (server-rendered, as a link from an e-mail or a reload gives
// it) while signed in as a role that may see it. The HTML the server sends must
// already carry the page's main heading, the page must show it once hydrated, and
// the browser must log no console error. Ids come from the demo school through the
// API the pages use, so the table holds routes, not numbers that could drift.
import { expect, test } from '@playwright/test'
import type { APIRequestContext, Page } from '@playwright/test'
import { signIn } from './helpers'

type Ids = Record<string, number | string>
interface Route { path: string, heading: RegExp }

async function json<T>(request: APIRequestContext, url: string): Promise<T> {
  const r = await request.get(url)
  expect(r.status(), url).toBe(200)
  return await r.json() as T
}

interface QuizList { items: { id: number, title: string }[] }
interface Results { items: { studentId: number, name: string, status: string, items: Record<string, { attemptId: number | null }> }[], columns: { id: number, kind: string }[] }

/** Ids a member of staff's pages need: the demo's released quiz, one of its attempts and students, a replay. */
async function staffIds(request: APIRequestContext, withReview: boolean): Promise<Ids> {
  const quizzes = await json<QuizList>(request, '/api/quizzes')
  const week3 = quizzes.items.find(q => q.title === 'Week 3: writing the record')!
  const results = await json<Results>(request, `/api/quizzes/${week3.id}/results?pageSize=100`)
  const dmr = results.columns.find(c => c.kind === 'dmr')!
  const sat = results.items.find(r => r.items[dmr.id]?.attemptId)!
  const ids: Ids = { quiz: week3.id, student: sat.studentId, studentName: sat.name, attempt: sat.items[dmr.id]!.attemptId! }
  if (withReview) {
    const replay = await json<{ items: { id: number }[] }>(request, '/api/review/attempts?pageSize=5')
    ids.review = replay.items[0]!.id
  }
  return ids
}

const STAFF_QUIZ_PAGES: Route[] = [
  { path: '/quizzes', heading: /^Quizzes$/ },
  { path: '/quizzes/:quiz', heading: /^Week 3: writing the record$/ },
  { path: '/quizzes/:quiz/results', heading: /^Results: Week 3: writing the record$/ },
  { path: '/quizzes/:quiz/platform-marks', heading: /^Marks sent to learning platforms: Week 3: writing the record$/ },
  { path: '/quizzes/:quiz/attempts/:attempt', heading: /· item \d+$/ },
  // blank on a direct link before: the cases were fetched without the session cookie
  { path: '/quizzes/:quiz/students/:student', heading: /: the patients of “Week 3: writing the record”$/ },
  { path: '/record-checker', heading: /./ },
  { path: '/roster', heading: /./ },
  { path: '/practice', heading: /./ },
  { path: '/practice/history', heading: /./ },
  { path: '/fundus/photos', heading: /./ },
]
const REVIEW_PAGES: Route[] = [
  { path: '/review', heading: /^Slip patterns$/ },
  { path: '/review/attempts', heading: /./ },
  { path: '/review/attempts/:review', heading: /./ },
  { path: '/review/sets', heading: /./ },
  { path: '/casebook', heading: /./ },
  { path: '/casebook/preview?type=engine&templateId=normal-standard', heading: /^Preview: / },
]

const ROLES: { who: string, email: string, ids: (r: APIRequestContext) => Promise<Ids>, routes: Route[] }[] = [
  {
    who: 'tutor',
    email: 'tutor@cyclodial.test',
    ids: r => staffIds(r, true),
    routes: [{ path: '/tutor', heading: /./ }, ...STAFF_QUIZ_PAGES, ...REVIEW_PAGES],
  },
  {
    who: 'lecturer',
    email: 'lecturer@cyclodial.test',
    ids: r => staffIds(r, true),
    routes: [{ path: '/lecturer', heading: /./ }, { path: '/quizzes/:quiz/students/:student', heading: /: the patients of “Week 3: writing the record”$/ }, { path: '/review', heading: /^Slip patterns$/ }],
  },
  {
    who: 'admin',
    email: 'admin@cyclodial.test',
    ids: r => staffIds(r, false),
    routes: [
      { path: '/admin', heading: /./ },
      { path: '/admin/users', heading: /^Users$/ },
      { path: '/admin/cohorts', heading: /./ },
      { path: '/admin/audit', heading: /./ },
      { path: '/admin/learning-platforms', heading: /^Learning platforms$/ },
      { path: '/admin/outbox', heading: /./ },
      { path: '/quizzes/:quiz/results', heading: /^Results: Week 3: writing the record$/ },
      { path: '/quizzes/:quiz/students/:student', heading: /: the patients of “Week 3: writing the record”$/ },
    ],
  },
  {
    who: 'student',
    // a demo student with practice history and a marked quiz (student@ keeps a clean slate)
    email: 'jory.feldane@cyclodial.test',
    ids: async (request) => {
      const quizzes = await json<QuizList>(request, '/api/quizzes')
      const week3 = quizzes.items.find(q => q.title === 'Week 3: writing the record')!
      const detail = await json<{ items: { feedback?: { attemptId: number } }[] }>(request, `/api/quizzes/${week3.id}`)
      const history = await json<{ items: { attemptId: number, caseId: number }[] }>(request, '/api/practice/history')
      // Jory is part-way through the demo's open quiz (db/seed/quizzes.ts), so its item page opens
      const week6 = quizzes.items.find(q => q.title === 'Week 6: patients who look different')!
      const open = await json<{ items: { id: number }[] }>(request, `/api/quizzes/${week6.id}`)
      const marked = detail.items.find(i => i.feedback)
      expect(marked, 'a marked item on the released demo quiz').toBeTruthy()
      expect(history.items.length, 'demo practice history').toBeGreaterThan(0)
      return { quiz: week3.id, open: week6.id, openItem: open.items[0]!.id, attempt: marked!.feedback!.attemptId, practiceAttempt: history.items[0]!.attemptId, case: history.items[0]!.caseId }
    },
    routes: [
      { path: '/student', heading: /./ },
      { path: '/student/quizzes', heading: /./ },
      { path: '/student/quizzes/:quiz', heading: /^Week 3: writing the record$/ },
      { path: '/student/quizzes/:quiz/attempts/:attempt', heading: /./ },
      { path: '/student/quizzes/:open/items/:openItem', heading: /^Item 1$/ },
      { path: '/practice', heading: /./ },
      { path: '/practice/history', heading: /./ },
      { path: '/practice/:case', heading: /./ },
      { path: '/practice/attempts/:practiceAttempt', heading: /./ },
      { path: '/fundus/cases/:case', heading: /./ },
      { path: '/fundus/photos', heading: /./ },
    ],
  },
]

function fill(path: string, ids: Ids): string {
  return path.replace(/:(\w+)/g, (_, k: string) => {
    if (ids[k] === undefined) throw new Error(`no demo id for :${k}`)
    return String(ids[k])
  })
}

function watchConsole(page: Page) {
  const errors: string[] = []
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text())
  })
  page.on('pageerror', e => errors.push(String(e)))
  return errors
}

for (const role of ROLES) {
  test(`every ${role.who} page renders its heading on a direct link and after a reload`, async ({ page }) => {
    test.setTimeout(180_000)
    await signIn(page, role.email)
    const ids = await role.ids(page.request)
    for (const route of role.routes) {
      const url = fill(route.path, ids)
      // the server's own HTML (the page request carries the session cookie) already has the heading;
      // the request carries what a browser sends on a typed-in link (W3C Fetch Metadata Request
      // Headers), which server rendering forwards to the API calls it makes
      const html = await (await page.request.get(url, { headers: { 'sec-fetch-site': 'none', 'sec-fetch-mode': 'navigate', 'sec-fetch-dest': 'document' } })).text()
      expect(/<h1[\s>]/.test(html), `${url}: no <h1> in the server-rendered page`).toBe(true)

      const errors = watchConsole(page)
      await page.goto(url)
      const h1 = page.getByRole('heading', { level: 1 })
      await expect(h1, url).toHaveCount(1)
      await expect(h1, url).toHaveText(route.heading)
      await page.reload()
      await expect(page.getByRole('heading', { level: 1 }), `${url} after a reload`).toHaveText(route.heading)
      await page.waitForLoadState('networkidle')
      expect(errors, `${url}: console errors`).toEqual([])
      page.removeAllListeners('console')
      page.removeAllListeners('pageerror')
    }
  })
}
