import { expect, test } from '@playwright/test'
import { signIn } from './helpers'

test('a tutor checks a written record against a known finding', async ({ page }) => {
  await signIn(page, 'tutor@cyclodial.test')
  await page.getByRole('navigation', { name: 'Main', exact: true }).getByRole('link', { name: 'Record checker' }).click()
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Record checker')
  await expect(page.getByRole('note', { name: 'Educational simulation' }).first()).toBeVisible()

  // nothing entered: the fields say what is missing, nothing is sent
  await page.getByRole('button', { name: 'Check record' }).click()
  await expect(page.getByText('Paste or type the student\'s record.')).toBeVisible()

  const right = page.getByRole('group', { name: 'Right eye (RE)' })
  await right.getByLabel('Excyclotorsion').check()
  await expect(page.getByText('Give the degrees of torsion, or choose No torsion.')).toHaveCount(0)
  await right.getByLabel('Right eye (RE): degrees of torsion').fill('10')
  await page.getByLabel('RE reading (°)').fill('100')
  await page.getByLabel('LE reading (°)').fill('90')

  // the student recorded the tilt of the image, not the eye
  await page.getByLabel('Written record').fill('DMR N PP: RE 10 in, LE nil')
  await expect(page.getByTestId('check-read-as')).toContainText('RE 10° incyclo')
  await page.getByRole('button', { name: 'Check record' }).click()

  await expect(page.getByTestId('check-result').getByTestId('slips')).toContainText('Direction reversed — right eye')
  await expect(page.getByTestId('check-model')).toHaveText('DMR, near, primary position: RE 10° excyclotorsion, LE no torsion.')
  // a reversed direction is a critical slip (domain.md §5.2): the cap is said beside the marks
  await expect(page.getByTestId('marks-cap')).toContainText('This record would mislead the next clinician')
  await expect(page.getByTestId('marks-cap')).toContainText('Capped at 50 %')
  await expect(page.getByTestId('check-result').getByTestId('score')).toHaveText('50%')
  await page.screenshot({ path: 'test-results/screenshots/record-checker.png', fullPage: true })

  // the model record gets full marks
  await page.getByLabel('Written record').fill('DMR, near, primary position: RE 10° excyclotorsion, LE no torsion.')
  await page.getByRole('button', { name: 'Check record' }).click()
  await expect(page.getByTestId('check-result').getByTestId('score')).toHaveText('100%')
  await expect(page.getByTestId('check-result').getByTestId('no-slips')).toBeVisible()
  await expect(page.getByTestId('marks-cap')).toHaveCount(0)
})

test('a student has no record checker', async ({ page }) => {
  await signIn(page, 'student@cyclodial.test')
  await expect(page.getByRole('link', { name: 'Record checker' })).toHaveCount(0)
  await page.goto('/record-checker')
  await expect(page.getByRole('heading', { name: 'Not available to your role' })).toBeVisible()
})
