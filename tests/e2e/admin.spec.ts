import { expect, test } from '@playwright/test'
import { signIn } from './helpers'

test('an admin invites a tutor, who accepts from the link in the outbox', async ({ page, browser }) => {
  await signIn(page, 'admin@cyclodial.test')
  await page.getByRole('link', { name: 'Users' }).click()
  const invite = page.getByRole('form', { name: 'Invite someone' })
  await invite.getByLabel('E-mail').fill('fenna.corrivale@cyclodial.test')
  await invite.getByLabel('Role').selectOption('tutor')
  await page.getByRole('button', { name: 'Send invitation' }).click()
  await expect(page.getByText('Invitation sent to fenna.corrivale@cyclodial.test.')).toBeVisible()

  await page.getByRole('link', { name: 'Outbox' }).click()
  await page.getByRole('button', { name: /You are invited to Cyclodial/ }).first().click()
  await expect(page.getByTestId('outbox-to')).toHaveText(/fenna.corrivale/)
  const link = await page.getByRole('link', { name: /\/invite\// }).getAttribute('href')
  expect(link).toBeTruthy()

  const guest = await browser.newPage()
  await guest.goto(link!)
  await expect(guest.getByText('You are invited as a tutor')).toBeVisible()
  await guest.getByLabel('Your name').fill('Fenna Corrivale')
  await guest.getByLabel('Choose a password').fill('Moorland-Cobalt-Lyre-52')
  await guest.getByRole('button', { name: 'Create my account' }).click()
  await expect(guest).toHaveURL(/\/tutor$/)
  await expect(guest.getByRole('heading', { level: 1 })).toHaveText('Welcome, Fenna Corrivale')
  await guest.screenshot({ path: 'test-results/screenshots/tutor-home.png' })
  await guest.close()
})

test('an admin searches users and renames a cohort with the keyboard', async ({ page }) => {
  await signIn(page, 'admin@cyclodial.test')
  await page.goto('/admin/users')
  await page.getByLabel('Search name or e-mail').fill('quillon')
  await expect(page.getByRole('cell', { name: 'Adaeze Quillon', exact: true })).toBeVisible()
  await expect(page.locator('tbody tr')).toHaveCount(1)
  await page.screenshot({ path: 'test-results/screenshots/admin-users.png' })

  await page.goto('/admin/cohorts')
  await page.getByRole('row', { name: /Heron cohort/ }).getByRole('button', { name: 'Rename' }).click()
  const input = page.getByLabel('New name for Heron cohort')
  await expect(input).toBeFocused()
  await input.fill('Heron cohort (Year 2)')
  await input.press('Enter')
  await expect(page.getByText('Renamed to Heron cohort (Year 2).')).toBeVisible()
})
