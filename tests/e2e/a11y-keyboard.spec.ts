// Accessibility by keyboard alone: a tutor builds a quiz and reads its results, a
// lecturer works slip patterns, never clicking (Tab, Enter, Space, Escape).
import { expect, test } from '@playwright/test'
import { checkOpenDialog, escapeBackTo, tabTo } from './a11y-helpers'
import { signIn } from './helpers'

test.describe('keyboard alone', () => {
  test('a tutor builds a quiz: refused without a title, created, an item added, removal asked and kept', async ({ page }) => {
    test.setTimeout(120_000)
    await signIn(page, 'tutor@cyclodial.test')
    await page.goto('/quizzes')
    await page.waitForLoadState('networkidle')

    await tabTo(page, page.getByRole('button', { name: 'New quiz' }))
    await page.keyboard.press('Enter')
    const form = page.getByRole('form', { name: 'Quiz settings' })
    await expect(form).toBeVisible()
    // refused without a title: focus lands on the title, which names its error
    await tabTo(page, form.getByRole('button', { name: 'Create quiz' }))
    await page.keyboard.press('Enter')
    const title = form.getByLabel('Title')
    await expect(title).toBeFocused()
    await expect(title).toHaveAttribute('aria-invalid', 'true')
    const described = (await title.getAttribute('aria-describedby'))!.split(' ')
    await expect(form.locator(`[id="${described.at(-1)}"]`)).toHaveClass(/field-error/)
    await page.keyboard.type('Keyboard-built quiz')
    await tabTo(page, form.getByLabel('Kestrel cohort'))
    await page.keyboard.press('Space')
    await expect(form.getByLabel('Kestrel cohort')).toBeChecked()
    await tabTo(page, form.getByRole('button', { name: 'Create quiz' }))
    await page.keyboard.press('Enter')
    await expect(page.getByRole('heading', { level: 1, name: 'Keyboard-built quiz' })).toBeVisible()
    await expect(page).toHaveTitle(/Keyboard-built quiz/)
    await page.waitForLoadState('networkidle')

    // add an item: the case chosen with the arrow keys
    const add = page.getByRole('form', { name: 'Add an item' })
    const source = add.getByLabel('Case', { exact: true })
    await tabTo(page, source)
    await page.keyboard.press('ArrowDown')
    await expect(source).not.toHaveValue('')
    await tabTo(page, add.getByLabel('What the student is asked'))
    await page.keyboard.type('Measure and record.')
    await tabTo(page, add.getByRole('button', { name: 'Add item' }))
    await page.keyboard.press('Enter')
    await expect(page.getByText('Item 1 added.')).toBeVisible()
    await expect(page.getByRole('listitem', { name: 'Item 1' })).toBeVisible()

    // removing asks; Escape keeps the item and gives focus back
    const remove = page.getByRole('button', { name: 'Remove item 1' })
    await page.locator('h1').focus().catch(() => {})
    await tabTo(page, remove)
    await page.keyboard.press('Enter')
    await escapeBackTo(page, await checkOpenDialog(page, 'Remove item 1?', 'remove item'), remove)
    await expect(page.getByRole('listitem', { name: 'Item 1' })).toBeVisible()
  })

  test('a tutor reads the results: filter, open a student\'s item, come back', async ({ page }) => {
    await signIn(page, 'tutor@cyclodial.test')
    await page.goto('/quizzes')
    await page.waitForLoadState('networkidle')
    const quiz = page.getByRole('row', { name: /Week 3: writing the record/ })
    await tabTo(page, quiz.getByRole('link', { name: /Results/ }).first())
    await page.keyboard.press('Enter')
    await expect(page.getByRole('heading', { level: 1 })).toContainText('Week 3: writing the record')
    await expect(page).toHaveTitle(/Results/)
    await page.waitForLoadState('networkidle')

    // the search field filters the table
    const search = page.getByLabel('Search name or e-mail')
    await tabTo(page, search)
    await page.keyboard.type('Priya')
    await expect(page.getByRole('row', { name: /Priya Vellacott/ })).toHaveCount(1)
    await expect(page.getByRole('row', { name: /Jory Feldane/ })).toHaveCount(0)
    await page.waitForLoadState('networkidle')

    // an item's marks open from its figure, named for the student and the item
    const item = page.getByRole('link', { name: /^Priya Vellacott, item 1:/ })
    await tabTo(page, item)
    await page.keyboard.press('Enter')
    await expect(page).toHaveURL(/\/attempts\/\d+$/)
    await expect(page.getByRole('heading', { level: 1 })).toContainText('Priya Vellacott')
    // and back to the results by the page's own link
    await tabTo(page, page.getByRole('link', { name: '← Results' }))
    await page.keyboard.press('Enter')
    await expect(page).toHaveURL(/\/results$/)
    await expect(page.getByRole('heading', { level: 1 })).toContainText('Results')
  })

  test('a lecturer works slip patterns: filter by cohort, send a practice set, drill into the attempts', async ({ page }) => {
    test.setTimeout(120_000)
    await signIn(page, 'lecturer@cyclodial.test')
    await page.goto('/review')
    await page.waitForLoadState('networkidle')

    const cohort = page.getByLabel('Cohort', { exact: true })
    await tabTo(page, cohort)
    // choose with the arrow keys: the first cohort after "all"
    await page.keyboard.press('ArrowDown')
    await expect(page).toHaveURL(/cohortId=\d+/)
    await page.waitForLoadState('networkidle')

    const help = page.getByRole('region', { name: 'Who needs help' })
    const learner = help.getByRole('listitem').filter({ has: page.getByRole('button', { name: /^Send practice set to / }) }).first()
    const open = learner.getByRole('button', { name: /^Send practice set to / })
    const who = (await open.textContent())!.replace(/^\s*Send practice set to\s*/, '').trim()
    await tabTo(page, open)
    await page.keyboard.press('Enter')
    await expect(open).toHaveAttribute('aria-expanded', 'true')
    const form = page.getByRole('form', { name: `Send a practice set to ${who}` })
    await tabTo(page, form.getByRole('button', { name: 'Send practice set' }))
    await page.keyboard.press('Enter')
    await expect(page.getByRole('status').filter({ hasText: `sent to ${who}` })).toBeVisible()

    // from a figure in the slip-frequency table down to the attempts behind it
    const frequency = page.getByRole('region', { name: 'Slip frequency' })
    const figure = frequency.getByRole('link', { name: /slips: see the attempts$/ }).first()
    await tabTo(page, figure, 400)
    await page.keyboard.press('Enter')
    await expect(page.getByRole('heading', { level: 1, name: 'Attempts' })).toBeVisible()
    await page.waitForLoadState('networkidle')
    const replay = page.getByRole('table').getByRole('link', { name: /Replay/ }).first()
    await tabTo(page, replay)
    await page.keyboard.press('Enter')
    await expect(page.getByRole('heading', { level: 1, name: /^Attempt \d+: / })).toBeVisible()
  })
})
