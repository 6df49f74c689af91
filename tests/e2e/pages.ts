// Every page of Cyclodial and who can reach it, for the accessibility run (a11y.spec.ts).
// Kept beside the route table: a11y.spec.ts fails when a file under pages/ is neither
// listed here nor in NOT_VISITED, so a new page cannot be forgotten.
// Ids of the demo school are found through the UI (links on list pages) or the API,
// never written in.
import { expect, request, type Page } from '@playwright/test'
import { syntheticPng } from '../support/fundus'
import { DEMO_PASSWORD, gotoReady, sameOrigin } from './helpers'
import { linkCourse, registeredPlatform, tutorDeepLinkLaunch } from './lti-helpers'

export type Who = 'signed-out' | 'student' | 'tutor' | 'lecturer' | 'admin'

export interface A11yPage {
  /** the file under pages/ that renders it */
  file: string
  /** what the check is about, for the test title */
  name: string
  /** the path to open, or a way to find it once signed in (then the page is opened, unless the finder already went there) */
  path: string | ((page: Page) => Promise<string>)
  /** who signs in: one demo account per role, or a named demo student for pages that need a history */
  as: Who
  account?: string
  /** something to wait for or do before axe runs (a dialog open, a case drawn) */
  ready?: (page: Page) => Promise<void>
}

export const ACCOUNTS: Record<Exclude<Who, 'signed-out'>, string> = {
  student: 'student@cyclodial.test',
  tutor: 'tutor@cyclodial.test',
  lecturer: 'lecturer@cyclodial.test',
  admin: 'admin@cyclodial.test',
}
// A Kestrel student of the demo school with a practice history and sittings of the
// demo quizzes; no other e2e spec signs in as them, so starting a quiz here changes
// nothing another spec relies on.
export const HISTORY_STUDENT = 'oisin.marrable@cyclodial.test'

/** Same-origin link paths on a page, in document order. */
export async function linksOn(page: Page, path: string): Promise<string[]> {
  await page.goto(path)
  await page.waitForLoadState('networkidle')
  return page.locator('main a[href]').evaluateAll(as => as.map((a) => {
    const url = new URL((a as HTMLAnchorElement).href)
    return url.pathname + url.search
  }))
}

/** The first link on `path` matching `pattern`; fails the test if there is none. */
export async function firstLink(page: Page, path: string, pattern: RegExp): Promise<string> {
  const found = (await linksOn(page, path)).find(p => pattern.test(p))
  expect(found, `a link matching ${pattern} on ${path}`).toBeTruthy()
  return found!
}

/** The first link matching `pattern` on any of the pages linked from `path` by `via`. */
async function linkThrough(page: Page, path: string, via: RegExp, pattern: RegExp): Promise<string> {
  const hops = [...new Set((await linksOn(page, path)).filter(p => via.test(p)))]
  for (const hop of hops) {
    const found = (await linksOn(page, hop)).find(p => pattern.test(p))
    if (found) return found
  }
  expect.soft(false, `a link matching ${pattern} on a page ${via} linked from ${path}`).toBe(true)
  throw new Error(`no link matching ${pattern} reachable from ${path}`)
}

/** A fresh practice case for the signed-in person, through the API. */
async function newCase(page: Page): Promise<number> {
  await page.goto('/practice')
  const res = await page.request.post('/api/practice', { headers: sameOrigin(page), data: { template: 'long-standing-so-palsy', difficulty: 'standard', seed: 'e2e-a11y' } })
  expect(res.status()).toBe(201)
  return (await res.json()).id as number
}

/** The demo quiz open now, started (or continued) by the signed-in student: its first item. */
async function openQuizItem(page: Page): Promise<string> {
  const quiz = await firstLink(page, '/student/quizzes', /^\/student\/quizzes\/\d+$/)
  await gotoReady(page, quiz)
  const start = page.getByRole('button', { name: 'Start the quiz' })
  if (await start.isVisible()) {
    await start.click()
    await expect(page).toHaveURL(/\/items\/\d+$/)
    return new URL(page.url()).pathname
  }
  return firstLink(page, quiz, /^\/student\/quizzes\/\d+\/items\/\d+$/)
}

/** A student's patients, opened as a tutor does: from the results table, by following the link. */
async function studentsPatients(page: Page): Promise<string> {
  const path = await linkThrough(page, '/quizzes', /^\/quizzes\/\d+\/results$/, /^\/quizzes\/\d+\/students\/\d+$/)
  const results = path.replace(/\/students\/\d+$/, '/results')
  await page.goto(results)
  await page.waitForLoadState('networkidle')
  await page.locator(`main a[href="${path}"]`).first().click()
  await expect(page).toHaveURL(new RegExp(`${path}$`))
  return path
}

/**
 * A fundus photograph of the lecturer's own, uploaded through the API (the demo school ships
 * none). A lecturer's upload is shared with no cohort, so no other spec's lists change.
 */
async function ownPhoto(page: Page): Promise<string> {
  await page.goto('/fundus/photos')
  const res = await page.request.post('/api/fundus/photos', {
    headers: sameOrigin(page),
    multipart: {
      file: { name: 'a11y-fundus.png', mimeType: 'image/png', buffer: await syntheticPng() },
      title: 'Accessibility check fundus',
      eye: 'RE',
      consent: 'yes',
    },
  })
  expect(res.status()).toBe(201)
  return `/fundus/photos/${(await res.json()).id}`
}

/**
 * A practice set sent by the tutor to the demo student used for history pages only (found by
 * name in a results table), through the API as the slip-patterns screen sends it.
 */
async function practiceSet(page: Page): Promise<string> {
  const results = await firstLink(page, '/quizzes', /^\/quizzes\/\d+\/results$/)
  await page.goto(results)
  await page.waitForLoadState('networkidle')
  const href = await page.getByRole('link', { name: 'Oisín Marrable' }).first().getAttribute('href')
  const learnerId = Number(href!.match(/\/students\/(\d+)$/)![1])
  const res = await page.request.post('/api/review/practice-sets', { headers: sameOrigin(page), data: { learnerIds: [learnerId], focus: 'image-recorded', note: 'Accessibility check' } })
  expect(res.status()).toBe(201)
  return `/review/sets/${(await res.json()).id}`
}

/** The Heron tutor and a Heron student, used only for the handed-in fundus item, so no other spec's Kestrel lists change. */
export const FUNDUS_TUTOR = 'tutor2@cyclodial.test'
export const FUNDUS_STUDENT = 'noor.bramblecote@cyclodial.test'
let handedIn: { quizId: number, attemptId: number } | null = null

/**
 * A fundus quiz item handed in and released, made through the API: the Heron tutor sets a
 * quiz with one generated-fundus item, the student (in a request context of their own)
 * starts it and hands in marks for both eyes, then the tutor closes it and releases the
 * results. Made once per run; the tutor's and the student's pages both use it.
 */
async function fundusHandedIn(page: Page): Promise<{ quizId: number, attemptId: number }> {
  if (handedIn) return handedIn
  const origin = new URL(page.url()).origin
  const headers = { origin }
  const tutor = await request.newContext({ baseURL: origin })
  const student = await request.newContext({ baseURL: origin })
  try {
    for (const [ctx, email] of [[tutor, FUNDUS_TUTOR], [student, FUNDUS_STUDENT]] as const) {
      const res = await ctx.post('/api/auth/login', { headers, data: { email, password: DEMO_PASSWORD } })
      expect(res.status(), `sign in ${email}`).toBe(200)
    }
    const cohorts = await (await tutor.get('/api/quizzes/cohorts')).json() as { id: number, name: string }[]
    const heron = cohorts.find(c => c.name.startsWith('Heron cohort'))!.id // admin.spec renames it 'Heron cohort (Year 2)'
    const soon = (m: number) => new Date(Date.now() + m * 60_000).toISOString()
    const quiz = await tutor.post('/api/quizzes', { headers, data: { title: 'Accessibility check: a fundus', opensAt: soon(-1), closesAt: soon(60), cohortIds: [heron] } })
    expect(quiz.status(), await quiz.text()).toBe(201)
    const quizId = (await quiz.json()).id as number
    const item = await tutor.post(`/api/quizzes/${quizId}/items`, { headers, data: { kind: 'fundus', prompt: 'Mark both fundi.', source: { type: 'engine', templateId: 'so-palsy-right-standard' } } })
    expect(item.status(), await item.text()).toBe(201)
    // the route answers with the whole quiz; the new item is the last
    const itemId = ((await item.json()).items as { id: number }[]).at(-1)!.id
    expect((await tutor.patch(`/api/quizzes/${quizId}`, { headers, data: { published: true } })).status()).toBe(200)
    const started = await student.post(`/api/quizzes/${quizId}/start`, { headers })
    expect(started.status(), await started.text()).toBeLessThan(300)
    // marks anywhere on the picture (8 × 6 disc diameters): grading is not what is checked here
    const eye = { disc: { x: 5.2, y: 2.8 }, fovea: { x: 2.7, y: 3.1 }, finding: 'within-normal' }
    const sent = await student.post(`/api/quizzes/${quizId}/items/${itemId}/attempts`, { headers, data: { eyes: { RE: eye, LE: { ...eye, disc: { x: 2.8, y: 2.8 }, fovea: { x: 5.3, y: 3.1 } } } } })
    expect(sent.status(), await sent.text()).toBe(201)
    const attemptId = (await sent.json()).attemptId as number
    expect((await tutor.patch(`/api/quizzes/${quizId}`, { headers, data: { closesAt: soon(-0.5) } })).status()).toBe(200)
    expect((await tutor.post(`/api/quizzes/${quizId}/release`, { headers })).status()).toBeLessThan(300)
    handedIn = { quizId, attemptId }
    return handedIn
  }
  finally {
    await tutor.dispose()
    await student.dispose()
  }
}

/**
 * A tutor's first launch from a practice learning platform's course (the platform runs in
 * the test process; the launch replaces the demo tutor's session with the platform's tutor).
 */
async function ltiCoursePage(page: Page): Promise<string> {
  const platform = await registeredPlatform(new URL(page.url()).origin, `Accessibility course ${Date.now()}`)
  return tutorDeepLinkLaunch(page, platform)
}

/** The same, with the course linked to a new cohort: the page that offers quizzes for the course. */
async function ltiDeepLinkPage(page: Page): Promise<string> {
  const course = await ltiCoursePage(page)
  return linkCourse(page, course, `Accessibility cohort ${Date.now()}`)
}

const bench = async (page: Page) => {
  await expect(page.getByRole('heading', { level: 1 })).toBeVisible()
  await page.waitForLoadState('networkidle')
}

export const PAGES: A11yPage[] = [
  // signed out
  { file: 'pages/login.vue', name: 'sign in', path: '/login', as: 'signed-out' },
  { file: 'pages/forgot.vue', name: 'forgotten password', path: '/forgot', as: 'signed-out' },
  { file: 'pages/reset/[token].vue', name: 'reset link (not valid)', path: '/reset/not-a-real-token', as: 'signed-out' },
  { file: 'pages/invite/[token].vue', name: 'invitation link (not valid)', path: '/invite/not-a-real-token', as: 'signed-out' },
  { file: 'pages/accessibility.vue', name: 'accessibility statement', path: '/accessibility', as: 'signed-out' },

  // student
  { file: 'pages/student/index.vue', name: 'student home', path: '/student', as: 'student' },
  { file: 'pages/student/quizzes/index.vue', name: 'quizzes', path: '/student/quizzes', as: 'student' },
  { file: 'pages/student/quizzes/[id]/index.vue', name: 'a quiz', path: p => firstLink(p, '/student/quizzes', /^\/student\/quizzes\/\d+$/), as: 'student' },
  { file: 'pages/practice/index.vue', name: 'practice', path: '/practice', as: 'student' },
  { file: 'pages/practice/history.vue', name: 'practice history', path: '/practice/history', as: 'student' },
  { file: 'pages/accessibility.vue', name: 'accessibility statement (signed in)', path: '/accessibility', as: 'student' },
  { file: 'pages/practice/[id].vue', name: 'the bench with a case open', path: async p => `/practice/${await newCase(p)}`, as: 'student', account: HISTORY_STUDENT, ready: bench },
  { file: 'pages/fundus/cases/[id].vue', name: 'the fundus marker', path: async p => `/fundus/cases/${await newCase(p)}`, as: 'student', account: HISTORY_STUDENT, ready: bench },
  { file: 'pages/practice/history.vue', name: 'practice history with attempts', path: '/practice/history', as: 'student', account: HISTORY_STUDENT },
  { file: 'pages/practice/attempts/[attemptId].vue', name: 'a practice attempt', path: p => firstLink(p, '/practice/history', /^\/practice\/attempts\/\d+$/), as: 'student', account: HISTORY_STUDENT },
  { file: 'pages/student/quizzes/[id]/items/[itemId].vue', name: 'a quiz item', path: openQuizItem, as: 'student', account: HISTORY_STUDENT, ready: bench },
  { file: 'pages/student/quizzes/[id]/attempts/[attemptId].vue', name: 'feedback on a quiz attempt', path: p => linkThrough(p, '/student/quizzes', /^\/student\/quizzes\/\d+$/, /^\/student\/quizzes\/\d+\/attempts\/\d+$/), as: 'student', account: HISTORY_STUDENT },

  // tutor
  { file: 'pages/tutor/index.vue', name: 'tutor home', path: '/tutor', as: 'tutor' },
  { file: 'pages/quizzes/index.vue', name: 'quizzes', path: '/quizzes', as: 'tutor' },
  { file: 'pages/quizzes/[id]/index.vue', name: 'a quiz (builder)', path: p => firstLink(p, '/quizzes', /^\/quizzes\/\d+$/), as: 'tutor' },
  { file: 'pages/quizzes/[id]/results.vue', name: 'the results table', path: p => firstLink(p, '/quizzes', /^\/quizzes\/\d+\/results$/), as: 'tutor' },
  { file: 'pages/quizzes/[id]/students/[studentId].vue', name: 'a student\'s patients', path: studentsPatients, as: 'tutor' },
  { file: 'pages/quizzes/[id]/attempts/[attemptId].vue', name: 'a quiz attempt', path: p => linkThrough(p, '/quizzes', /^\/quizzes\/\d+\/results$/, /^\/quizzes\/\d+\/attempts\/\d+$/), as: 'tutor' },
  { file: 'pages/casebook/index.vue', name: 'casebook', path: '/casebook', as: 'tutor' },
  { file: 'pages/casebook/preview.vue', name: 'casebook preview', path: p => firstLink(p, '/casebook', /^\/casebook\/preview\?/), as: 'tutor', ready: bench },
  { file: 'pages/fundus/photos/index.vue', name: 'fundus photographs', path: '/fundus/photos', as: 'tutor' },
  { file: 'pages/review/index.vue', name: 'slip patterns', path: '/review', as: 'tutor' },
  { file: 'pages/review/attempts/index.vue', name: 'slip pattern attempts', path: '/review/attempts', as: 'tutor' },
  { file: 'pages/review/attempts/[id].vue', name: 'an attempt replayed', path: p => firstLink(p, '/review/attempts', /^\/review\/attempts\/\d+$/), as: 'tutor', ready: bench },
  { file: 'pages/review/sets/index.vue', name: 'practice sets', path: '/review/sets', as: 'tutor' },
  { file: 'pages/review/sets/[id].vue', name: 'a practice set', path: practiceSet, as: 'tutor' },
  { file: 'pages/roster.vue', name: 'roster', path: '/roster', as: 'tutor' },
  { file: 'pages/record-checker.vue', name: 'record checker', path: '/record-checker', as: 'tutor' },
  { file: 'pages/practice/index.vue', name: 'practice', path: '/practice', as: 'tutor' },
  { file: 'pages/quizzes/[id]/platform-marks.vue', name: 'marks sent to learning platforms', path: async p => (await firstLink(p, '/quizzes', /^\/quizzes\/\d+\/results$/)).replace(/\/results$/, '/platform-marks'), as: 'tutor' },
  { file: 'pages/lti/course.vue', name: 'link a learning-platform course to a cohort', path: ltiCoursePage, as: 'tutor' },
  { file: 'pages/lti/deep-link.vue', name: 'add a quiz to a learning-platform course', path: ltiDeepLinkPage, as: 'tutor' },

  // lecturer
  { file: 'pages/lecturer/index.vue', name: 'lecturer home', path: '/lecturer', as: 'lecturer' },
  { file: 'pages/review/index.vue', name: 'slip patterns with data', path: '/review', as: 'lecturer' },
  { file: 'pages/quizzes/index.vue', name: 'quizzes', path: '/quizzes', as: 'lecturer' },
  { file: 'pages/quizzes/[id]/results.vue', name: 'the results table', path: p => firstLink(p, '/quizzes', /^\/quizzes\/\d+\/results$/), as: 'lecturer' },
  { file: 'pages/casebook/index.vue', name: 'casebook', path: '/casebook', as: 'lecturer' },
  { file: 'pages/fundus/photos/[id].vue', name: 'a fundus photograph (reference marker)', path: ownPhoto, as: 'lecturer', ready: bench },
  { file: 'pages/record-checker.vue', name: 'record checker', path: '/record-checker', as: 'lecturer' },

  // administrator
  { file: 'pages/admin/index.vue', name: 'administration', path: '/admin', as: 'admin' },
  { file: 'pages/admin/users.vue', name: 'users', path: '/admin/users', as: 'admin' },
  { file: 'pages/admin/cohorts.vue', name: 'cohorts', path: '/admin/cohorts', as: 'admin' },
  { file: 'pages/admin/outbox.vue', name: 'outbox', path: '/admin/outbox', as: 'admin' },
  { file: 'pages/admin/audit.vue', name: 'audit log', path: '/admin/audit', as: 'admin' },
  { file: 'pages/admin/learning-platforms.vue', name: 'learning platforms', path: '/admin/learning-platforms', as: 'admin' },
  { file: 'pages/quizzes/index.vue', name: 'quizzes', path: '/quizzes', as: 'admin' },
  { file: 'pages/roster.vue', name: 'roster', path: '/roster', as: 'admin' },
  { file: 'pages/record-checker.vue', name: 'record checker', path: '/record-checker', as: 'admin' },

  // a handed-in fundus quiz item (last: it adds a released quiz for the Heron cohort)
  { file: 'pages/quizzes/[id]/fundus-attempts/[attemptId].vue', name: 'a handed-in fundus item (staff)', path: async (p) => {
    const { quizId, attemptId } = await fundusHandedIn(p)
    return `/quizzes/${quizId}/fundus-attempts/${attemptId}`
  }, as: 'tutor', account: FUNDUS_TUTOR, ready: bench },
  { file: 'pages/student/quizzes/[id]/fundus-attempts/[attemptId].vue', name: 'a handed-in fundus item (student, released)', path: async (p) => {
    const { quizId, attemptId } = await fundusHandedIn(p)
    return `/student/quizzes/${quizId}/fundus-attempts/${attemptId}`
  }, as: 'student', account: FUNDUS_STUDENT, ready: bench },
]

/** Pages the run does not open, each with the reason. */
export const NOT_VISITED: Record<string, string> = {
  'pages/index.vue': 'only sends each person on to their home page, which is checked',
}
