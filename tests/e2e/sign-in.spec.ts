import { expect, test } from '@playwright/test'
import { gotoReady, hydrated, signIn, signOut } from './helpers'

const homes = [
  { email: 'student@cyclodial.test', home: '/student', heading: /Welcome, Tamsin Arkwell/ },
  { email: 'tutor@cyclodial.test', home: '/tutor', heading: /Welcome, Sunniva Okafor-Reyes/ },
  { email: 'lecturer@cyclodial.test', home: '/lecturer', heading: /Welcome, Dr Imre Vantongeren/ },
  { email: 'admin@cyclodial.test', home: '/admin', heading: /Administration/ },
]

for (const { email, home, heading } of homes) {
  test(`${email} signs in and lands on ${home}`, async ({ page }) => {
    await signIn(page, email)
    await expect(page).toHaveURL(new RegExp(`${home}$`))
    await expect(page.getByRole('heading', { level: 1 })).toHaveText(heading)
    await expect(page.getByRole('contentinfo').getByRole('note', { name: 'Educational simulation' })).toBeVisible()
    await signOut(page)
  })
}

test('a wrong password shows one clear message and keeps the e-mail', async ({ page }) => {
  await gotoReady(page, '/login')
  await page.getByLabel('E-mail').fill('tutor2@cyclodial.test')
  await page.getByLabel('Password').fill('not-the-password')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page.getByRole('alert')).toHaveText(/do not match an active account/)
  await expect(page.getByLabel('E-mail')).toHaveValue('tutor2@cyclodial.test')
})

test('a student opening an admin page is refused', async ({ page }) => {
  await signIn(page, 'student@cyclodial.test')
  await page.goto('/admin/users')
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Not available to your role')
  await expect(page.getByText('403')).toBeVisible()
  const api = await page.request.get('/api/admin/users')
  expect(api.status()).toBe(403)
})

test('a signed-out visitor is sent to sign in, then back to the page asked for', async ({ page }) => {
  await page.goto('/admin/cohorts')
  await expect(page).toHaveURL(/\/login\?next=(%2F|\/)admin(%2F|\/)cohorts$/)
  await hydrated(page)
  await page.getByLabel('E-mail').fill('admin@cyclodial.test')
  await page.getByLabel('Password').fill('cyclodial-demo')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page).toHaveURL(/\/admin\/cohorts$/)
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Cohorts')
})
