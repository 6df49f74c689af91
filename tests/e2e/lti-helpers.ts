// A practice learning platform for the browser tests (tests/support/lti-platform.ts),
// started in the test process on a loopback port and registered through the admin API.
import { expect, request, type Page } from '@playwright/test'
import { PracticePlatform } from '../support/lti-platform'
import { sameOrigin } from './helpers'

/** Starts a platform with its own course and registers it with the app at `baseURL`. */
export async function registeredPlatform(baseURL: string, courseTitle: string): Promise<PracticePlatform> {
  const platform = new PracticePlatform(baseURL, { id: `course-${Date.now()}`, title: courseTitle })
  await platform.start()
  const api = await request.newContext({ baseURL, extraHTTPHeaders: { origin: baseURL } })
  try {
    expect((await api.post('/api/auth/login', { data: { email: 'admin@cyclodial.test', password: 'cyclodial-demo' } })).status()).toBe(200)
    const made = await api.post('/api/admin/lti/platforms', { data: platform.registration(`Practice platform ${courseTitle}`) })
    expect(made.status(), await made.text()).toBe(201)
  }
  finally {
    await api.dispose()
  }
  return platform
}

/** A tutor's first launch from the platform's course, asking for content: lands on the course page. */
export async function tutorDeepLinkLaunch(page: Page, platform: PracticePlatform): Promise<string> {
  await page.goto(`${platform.issuer}/start?as=tutor&deep=1`)
  await expect(page).toHaveURL(/\/lti\/course\?launch=[\w-]+$/)
  const url = new URL(page.url())
  return url.pathname + url.search
}

/** Links the launch's course to a new cohort through the API; returns the deep-linking page's path. */
export async function linkCourse(page: Page, coursePath: string, cohortName: string): Promise<string> {
  const launch = new URL(coursePath, page.url()).searchParams.get('launch')!
  const res = await page.request.post(`/api/lti/launches/${launch}/course`, { headers: sameOrigin(page), data: { newCohortName: cohortName } })
  expect(res.status(), await res.text()).toBe(200)
  return (await res.json()).next as string
}
