// Staff homes on the demo school: what needs doing now, and the cohorts' commonest slips.
import { expect, test } from '@playwright/test'
import { signIn } from './helpers'

for (const email of ['tutor@cyclodial.test', 'lecturer@cyclodial.test']) {
  test(`${email} sees open and coming quizzes and the commonest slips on the home page`, async ({ page }) => {
    await signIn(page, email)
    const quizzes = page.getByRole('region', { name: 'Quizzes' })
    // the demo seeds, for each cohort, one quiz open now and one scheduled (db/seed/quizzes.ts)
    await expect(quizzes.getByTestId('home-quizzes-open').getByRole('link', { name: 'Week 6: patients who look different' }).first()).toBeVisible()
    await expect(quizzes.getByTestId('home-quizzes-upcoming').getByRole('link', { name: 'End-of-term assessment' }).first()).toBeVisible()
    await quizzes.getByTestId('home-quizzes-open').getByRole('link').first().click()
    await expect(page).toHaveURL(/\/quizzes\/\d+\/results$/)
    await page.goBack()

    const slips = page.getByRole('region', { name: 'Slips in the last eight weeks' })
    await expect(slips.getByTestId('home-slips').getByRole('listitem')).toHaveCount(3)
    await expect(slips.getByText(/per 100 attempts/).first()).toBeVisible()
    await slips.getByRole('link', { name: 'Slip patterns' }).click()
    await expect(page).toHaveURL(/\/review\?from=\d{4}-\d{2}-\d{2}$/)
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('Slip patterns')
  })
}
