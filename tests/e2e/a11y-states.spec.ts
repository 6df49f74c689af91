// Accessibility beyond the first paint of each page: axe-core on every dialog and
// menu while open, the page title on each navigation, reduced motion and refused
// forms. Keyboard-only flows are in a11y-keyboard.spec.ts; reflow at 320 CSS pixels
// is in reflow.spec.ts.
import { expect, test } from '@playwright/test'
import type { Page } from '@playwright/test'
import { syntheticPng } from '../support/fundus'
import { checkOpenDialog, escapeBackTo, expectNoViolations } from './a11y-helpers'
import { sameOrigin, signIn } from './helpers'

const minutesFromNow = (m: number) => new Date(Date.now() + m * 60_000).toISOString()

test.describe('dialogs and menus while open', () => {
  test('administrator: changing a role and disabling an account', async ({ page }) => {
    await signIn(page, 'admin@cyclodial.test')
    await page.goto('/admin/users')
    await page.waitForLoadState('networkidle')
    await page.getByLabel('Search name or e-mail').fill('Inès Calloway')
    const row = page.getByRole('row', { name: /Inès Calloway/ })
    await expect(row).toHaveCount(1)
    await page.waitForLoadState('networkidle')
    const select = row.getByLabel('Role of Inès Calloway')
    await select.focus()
    await select.selectOption('tutor')
    await escapeBackTo(page, await checkOpenDialog(page, 'Make Inès Calloway a tutor?', 'role change'), select)
    await expect(select).toHaveValue('student')

    const disable = row.getByRole('button', { name: 'Disable' })
    await disable.focus()
    await page.keyboard.press('Enter')
    await escapeBackTo(page, await checkOpenDialog(page, 'Disable Inès Calloway\'s account?', 'disable account'), disable)
    await expect(row.getByRole('button', { name: 'Disable' })).toBeVisible()
  })

  test('student: finishing a quiz', async ({ page }) => {
    // a Heron student no other spec signs in as; starting the open demo quiz changes nothing others rely on
    await signIn(page, 'freya.dunmoor@cyclodial.test')
    await page.goto('/student/quizzes')
    await page.waitForLoadState('networkidle')
    await page.getByRole('link', { name: 'Week 6: patients who look different' }).first().click()
    await expect(page).toHaveURL(/\/student\/quizzes\/\d+$/)
    const quizUrl = page.url()
    await page.waitForLoadState('networkidle')
    const start = page.getByRole('button', { name: 'Start the quiz' })
    if (await start.isVisible()) {
      await start.click()
      await expect(page).toHaveURL(/\/items\/\d+$/)
      await page.goto(quizUrl)
      await page.waitForLoadState('networkidle')
    }
    const finish = page.getByRole('button', { name: 'Finish the quiz' })
    await finish.focus()
    await page.keyboard.press('Enter')
    await escapeBackTo(page, await checkOpenDialog(page, 'Finish the quiz now?', 'finish the quiz'), finish)
  })

  test('tutor: releasing results, and deleting a fundus photograph', async ({ page }) => {
    await signIn(page, 'tutor2@cyclodial.test')
    const headers = sameOrigin(page)
    const cohorts = await (await page.request.get('/api/quizzes/cohorts')).json() as { id: number, name: string }[]
    const heron = cohorts.find(c => c.name.startsWith('Heron cohort'))!.id // admin.spec renames it 'Heron cohort (Year 2)'
    // a quiz that has closed and is not released: the Release button is live
    const quiz = await (await page.request.post('/api/quizzes', { headers, data: { title: 'Accessibility check: closed', opensAt: minutesFromNow(-120), closesAt: minutesFromNow(-60), cohortIds: [heron] } })).json() as { id: number }
    expect((await page.request.post(`/api/quizzes/${quiz.id}/items`, { headers, data: { kind: 'dmr', source: { type: 'engine', templateId: 'so-palsy-right-standard' } } })).status()).toBe(201)
    expect((await page.request.patch(`/api/quizzes/${quiz.id}`, { headers, data: { published: true } })).status()).toBe(200)
    await page.goto(`/quizzes/${quiz.id}/results`)
    await page.waitForLoadState('networkidle')
    const release = page.getByRole('button', { name: 'Release results' })
    await release.focus()
    await page.keyboard.press('Enter')
    await escapeBackTo(page, await checkOpenDialog(page, 'Release the results?', 'release results'), release)
    await expect(page.getByRole('button', { name: 'Release results' })).toBeVisible()

    // the fundus photograph library asks in the same dialog before deleting
    await page.goto('/fundus/photos')
    await page.waitForLoadState('networkidle')
    const up = await page.request.post('/api/fundus/photos', {
      headers,
      multipart: { file: { name: 'keep.png', mimeType: 'image/png', buffer: await syntheticPng() }, title: 'Accessibility check: keep me', eye: 'RE', consent: 'yes' },
    })
    expect(up.status()).toBe(201)
    await page.goto('/fundus/photos')
    await page.waitForLoadState('networkidle')
    const del = page.getByRole('button', { name: 'Delete Accessibility check: keep me' })
    await del.focus()
    await page.keyboard.press('Enter')
    const dialog = await checkOpenDialog(page, 'Delete “Accessibility check: keep me”?', 'delete a photograph')
    await expect(dialog).toContainText('cannot be undone')
    await escapeBackTo(page, dialog, del)
    await expect(page.getByRole('button', { name: 'Delete Accessibility check: keep me' })).toBeVisible()
    await del.click()
    await page.getByRole('dialog').getByRole('button', { name: 'Delete the photograph' }).click()
    await expect(page.getByText('Deleted “Accessibility check: keep me”.')).toBeVisible()
  })

  test('panels that open in place: new quiz, new case template and exact case, a practice set', async ({ page }) => {
    await signIn(page, 'tutor@cyclodial.test')
    await page.goto('/quizzes')
    await page.waitForLoadState('networkidle')
    await page.getByRole('button', { name: 'New quiz' }).click()
    await expect(page.getByRole('button', { name: 'New quiz' })).toHaveAttribute('aria-expanded', 'true')
    await expectNoViolations(page, 'new quiz open')

    await page.goto('/casebook')
    await page.waitForLoadState('networkidle')
    for (const name of ['New case template', 'New exact case']) {
      await page.getByRole('button', { name }).click()
      await expect(page.getByRole('button', { name })).toHaveAttribute('aria-expanded', 'true')
      await expectNoViolations(page, `${name} open`)
    }

    await page.goto('/review')
    await page.waitForLoadState('networkidle')
    const send = page.getByRole('button', { name: /^Send practice set to / }).first()
    await send.click()
    await expect(send).toHaveAttribute('aria-expanded', 'true')
    await expectNoViolations(page, 'send a practice set open')
    // the cohort-wide set, offered once one cohort is chosen
    await page.getByLabel('Cohort', { exact: true }).selectOption({ label: 'Kestrel cohort' })
    await expect(page).toHaveURL(/cohortId=\d+/)
    const cohortSet = page.getByRole('button', { name: 'Send a practice set to Kestrel cohort' })
    await cohortSet.click()
    await expect(cohortSet).toHaveAttribute('aria-expanded', 'true')
    await expectNoViolations(page, 'cohort practice set open')
  })

  test('the compact menu on a narrow screen', async ({ page }) => {
    await page.setViewportSize({ width: 375, height: 740 })
    await signIn(page, 'lecturer@cyclodial.test')
    await page.waitForLoadState('networkidle')
    const menu = page.getByRole('button', { name: 'Menu' })
    await menu.focus()
    await page.keyboard.press('Enter')
    await expect(menu).toHaveAttribute('aria-expanded', 'true')
    await expect(page.getByRole('navigation', { name: /compact/ })).toBeVisible()
    await expectNoViolations(page, 'compact menu open')
  })
})

test.describe('charts', () => {
  test('each chart names the table that holds its figures', async ({ page }) => {
    await signIn(page, 'lecturer@cyclodial.test')
    await page.goto('/review')
    await page.waitForLoadState('networkidle')
    const charts = page.getByTestId('review-chart')
    await expect(charts.first()).toBeVisible()
    const n = await charts.count()
    expect(n).toBeGreaterThanOrEqual(3)
    for (let i = 0; i < n; i++) {
      const chart = charts.nth(i)
      await expect(chart).toHaveAttribute('role', 'img')
      const label = (await chart.getAttribute('aria-label'))!
      const tableId = (await chart.getAttribute('aria-details'))!
      const table = page.locator(`[id="${tableId}"]`)
      await expect(table, label).toBeAttached()
      // the name quotes the table's caption, so a screen reader user can find it by name
      const captions = await table.evaluate(el => [...(el.matches('table') ? [el] : el.querySelectorAll('table'))].map(t => (t as HTMLTableElement).caption?.textContent?.trim() ?? ''))
      for (const caption of captions) expect(label, `chart ${i}`).toContain(caption)
    }
    // reversed directions are said in words, not only in red (WCAG 2.1 SC 1.4.1)
    const directions = page.getByRole('region', { name: /Direction: true against recorded/ })
    const reversedCells = directions.locator('td.text-bad')
    const cells = await reversedCells.count()
    for (let i = 0; i < cells; i++) await expect(reversedCells.nth(i)).toContainText('reversed')
  })
})

test.describe('page titles', () => {
  test('the title names each page as the person moves through the main navigation', async ({ page }) => {
    for (const email of ['student@cyclodial.test', 'tutor@cyclodial.test', 'lecturer@cyclodial.test', 'admin@cyclodial.test']) {
      await signIn(page, email)
      await page.waitForLoadState('networkidle')
      const nav = page.getByRole('navigation', { name: 'Main', exact: true })
      await expect(nav.getByRole('link').first()).toBeVisible()
      const labels = await nav.getByRole('link').allTextContents()
      expect(labels.length).toBeGreaterThan(2)
      const seen = new Set<string>()
      let before = await page.title()
      for (const label of labels.map(l => l.trim())) {
        const link = nav.getByRole('link', { name: label, exact: true })
        if (await link.getAttribute('aria-current') === 'page') continue
        await link.click()
        await expect(page.getByRole('heading', { level: 1 }).first()).toBeVisible()
        // client-side navigation: the title changes with the page (WCAG 2.1 SC 2.4.2 Page Titled)
        await expect(page).not.toHaveTitle(before)
        await expect(page).toHaveTitle(/^.+ · Cyclodial$/)
        const title = await page.title()
        expect(seen.has(title), `${email}: "${title}" used for two pages`).toBe(false)
        seen.add(title)
        before = title
      }
      await page.getByRole('button', { name: 'Sign out', exact: true }).click()
      await expect(page).toHaveURL(/\/login/)
    }
  })
})

test.describe('reduced motion', () => {
  const durations = (page: Page) => page.evaluate(() => ({
    transition: Number.parseFloat(getComputedStyle(document.querySelector('button')!).transitionDuration),
  }))

  test('with no preference, buttons ease their colours', async ({ page }) => {
    await page.emulateMedia({ reducedMotion: 'no-preference' })
    await page.goto('/login')
    expect((await durations(page)).transition).toBeGreaterThan(0.05)
  })

  test('asking the system for less motion stops the transitions and smooth scrolling', async ({ page }) => {
    await page.emulateMedia({ reducedMotion: 'reduce' })
    await page.goto('/login')
    // 0.01 ms: the transition ends at once (prefers-reduced-motion, Media Queries Level 5)
    expect((await durations(page)).transition).toBeLessThan(0.001)
    const scroll = await page.evaluate(() => getComputedStyle(document.documentElement).scrollBehavior)
    expect(scroll).toBe('auto')
  })
})

test.describe('refused forms', () => {
  /** After a refused submit, focus is on a field marked invalid whose description includes its shown error (WCAG 2.1 SC 3.3.1), or on the form's alert. */
  async function expectFocusOnError(page: Page, what: string) {
    const focused = page.locator(':focus')
    await expect(focused, what).toHaveCount(1)
    if (await focused.getAttribute('role') === 'alert') return
    await expect(focused, what).toHaveAttribute('aria-invalid', 'true')
    const ids = (await focused.getAttribute('aria-describedby') ?? '').split(/\s+/).filter(Boolean)
    const errors = await Promise.all(ids.map(id => page.locator(`[id="${id}"].field-error`).count()))
    expect(errors.some(n => n > 0), `${what}: the focused field is described by its error`).toBe(true)
  }

  test('forgotten password, cohorts, invitations, exact cases and photographs send focus to the first error', async ({ page }) => {
    test.setTimeout(120_000)
    await page.goto('/forgot')
    await page.waitForLoadState('networkidle')
    await page.getByRole('button', { name: 'Send reset link' }).click()
    await expectFocusOnError(page, 'forgotten password')

    await signIn(page, 'admin@cyclodial.test')
    await page.goto('/admin/cohorts')
    await page.waitForLoadState('networkidle')
    await page.getByRole('button', { name: 'Create cohort' }).click()
    await expectFocusOnError(page, 'new cohort')
    await page.goto('/admin/users')
    await page.waitForLoadState('networkidle')
    await page.getByRole('button', { name: 'Send invitation' }).click()
    await expectFocusOnError(page, 'invitation')
    await page.getByRole('button', { name: 'Sign out', exact: true }).click()

    await signIn(page, 'tutor@cyclodial.test')
    await page.goto('/casebook')
    await page.waitForLoadState('networkidle')
    await page.getByRole('button', { name: 'New exact case' }).click()
    await page.getByRole('button', { name: 'Save exact case' }).click()
    await expectFocusOnError(page, 'exact case')
    await page.goto('/fundus/photos')
    await page.waitForLoadState('networkidle')
    await page.getByRole('button', { name: 'Upload photograph' }).click()
    await expectFocusOnError(page, 'photograph upload')
  })
})
