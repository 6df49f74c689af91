// The lecturer's slip-patterns review in Debian's Chromium: filter to one cohort,
// see who reverses one eye only and who reverses both, send a practice set, and
// drill from a number down to one attempt's read-only replay.
import { expect, test } from '@playwright/test'
import { signIn } from './helpers'

test('a lecturer filters to one cohort, acts on a pattern and drills into an attempt', async ({ page }) => {
  await signIn(page, 'lecturer@cyclodial.test')
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Slip patterns' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Slip patterns' })).toBeVisible()

  await page.getByLabel('Cohort').selectOption({ label: 'Kestrel cohort' })
  await expect(page).toHaveURL(/cohortId=\d+/)
  const help = page.getByRole('region', { name: 'Who needs help' })
  const jory = help.getByRole('listitem').filter({ hasText: 'Jory Feldane' }).first()
  await expect(jory).toContainText('Reverses the direction in one eye only (left eye)')
  await expect(help.getByRole('listitem').filter({ hasText: 'Priya Vellacott' }).first()).toContainText('Reverses the direction (records the image)')
  // Heron's learners are filtered out
  await expect(help).not.toContainText('Milo Strathearn')
  await expect(help).not.toContainText('Kofi Ashgrove')

  // act on it: a practice set for the left-eye rule
  await jory.getByRole('button', { name: 'Send practice set to Jory Feldane' }).click()
  const form = page.getByRole('form', { name: 'Send a practice set to Jory Feldane' })
  await expect(form.getByLabel('Practise')).toHaveValue('left-right-rule-swapped')
  await expect(form.getByLabel('Eye whose rule is swapped')).toHaveValue('LE')
  await form.getByRole('button', { name: 'Send practice set' }).click()
  await expect(page.getByRole('status').filter({ hasText: 'sent to Jory Feldane' })).toContainText('Reading the left eye’s dial')

  // the chart has its table: drill from the count of reversed directions
  const frequency = page.getByRole('region', { name: 'Slip frequency' })
  await expect(frequency.getByRole('table')).toBeVisible()
  await frequency.getByRole('link', { name: /Direction reversed slips: see the attempts/ }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Attempts' })).toBeVisible()
  await expect(page.getByText('slip: Direction reversed')).toBeVisible()
  const rows = page.getByRole('table').getByRole('row')
  await expect(rows.nth(1)).toBeVisible()
  const cohorts = await page.getByRole('table').locator('tbody tr td:nth-child(3)').allTextContents()
  expect(cohorts.length).toBeGreaterThan(0)
  expect(new Set(cohorts.map(c => c.trim()))).toEqual(new Set(['Kestrel cohort']))

  await rows.nth(1).getByRole('link', { name: /Replay/ }).click()
  await expect(page.getByRole('heading', { level: 1, name: /^Attempt \d+: / })).toBeVisible()
  await expect(page.getByRole('heading', { name: 'The bench as submitted' })).toBeVisible()
  await expect(page.getByText('Direction reversed').first()).toBeVisible()
  await expect(page.getByRole('note', { name: 'Educational simulation' }).first()).toBeVisible()
})

test('a student cannot open slip patterns', async ({ page }) => {
  await signIn(page, 'student@cyclodial.test')
  const reply = await page.request.get('/api/review/slips')
  expect(reply.status()).toBe(403)
  await page.goto('/review')
  await expect(page.getByRole('heading', { level: 1, name: 'Not available to your role' })).toBeVisible()
})
