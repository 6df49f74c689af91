import { expect, type Page } from '@playwright/test'

export const DEMO_PASSWORD = 'cyclodial-demo'

/**
 * Waits until the app has hydrated (plugins/hydrated.client.ts marks <html data-hydrated>):
 * typing or clicking before then meets server-rendered markup whose handlers are not
 * attached yet, and a form would submit natively.
 */
export async function hydrated(page: Page) {
  await page.locator('html[data-hydrated]').waitFor({ state: 'attached' })
}

export async function gotoReady(page: Page, path: string) {
  await page.goto(path)
  await hydrated(page)
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await gotoReady(page, '/login')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page).not.toHaveURL(/\/login/)
}

export async function signOut(page: Page) {
  await page.getByRole('button', { name: 'Sign out', exact: true }).click()
  await expect(page).toHaveURL(/\/login/)
}

/**
 * Headers for page.request calls that change something: Playwright's request API,
 * unlike the browser's own fetch, sends no Origin, and the server refuses a
 * signed-in POST/PUT/PATCH/DELETE without one.
 */
export function sameOrigin(page: Page): { origin: string } {
  return { origin: new URL(page.url()).origin }
}
