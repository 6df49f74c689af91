// What cannot be undone asks first, in one accessible dialog (components/ui/UiConfirm.vue):
// a modal named by its heading, focus on the safe choice, Tab kept inside, Escape
// cancels and gives focus back to what opened it. Covers changing a role, disabling an
// account, removing a quiz item, a student's Finish the quiz and Release results; and
// on the same quiz, students who never started are shown as such, never as 0 %.
import { readFileSync } from 'node:fs'
import { expect, test } from '@playwright/test'
import type { Locator, Page } from '@playwright/test'
import Papa from 'papaparse'
import { DEMO_PEOPLE } from '../../db/seed/school'
import { signIn } from './helpers'

const pad = (n: number) => String(n).padStart(2, '0')
const local = (minutes: number) => {
  const d = new Date(Date.now() + minutes * 60_000)
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`
}

/** The open dialog, checked for its accessible shape (WAI-ARIA APG dialog (modal) pattern). */
async function openDialog(page: Page, title: string | RegExp): Promise<Locator> {
  const dialog = page.getByRole('dialog', { name: title })
  await expect(dialog).toBeVisible()
  await expect(dialog).toHaveAttribute('aria-modal', 'true')
  await expect(dialog.getByRole('heading', { level: 2 })).toHaveText(title)
  // focus moved into the dialog, on the choice that changes nothing
  await expect(dialog.getByRole('button').first()).toBeFocused()
  // Tab and Shift+Tab stay inside (WAI-ARIA APG: focus is trapped in a modal dialog)
  const buttons = dialog.getByRole('button')
  const n = await buttons.count()
  for (let i = 0; i < n + 1; i++) {
    await page.keyboard.press('Tab')
    expect(await dialog.evaluate(d => d.contains(document.activeElement))).toBe(true)
  }
  await page.keyboard.press('Shift+Tab')
  expect(await dialog.evaluate(d => d.contains(document.activeElement))).toBe(true)
  return dialog
}

test('an administrator confirms a role change and disabling an account; Escape changes nothing', async ({ page }) => {
  await signIn(page, 'admin@cyclodial.test')
  await page.goto('/admin/users')
  await page.waitForLoadState('networkidle')
  await page.getByLabel('Search name or e-mail').fill('Rafe Tolliver')
  const row = page.getByRole('row', { name: /Rafe Tolliver/ })
  await expect(row).toHaveCount(1)
  const select = row.getByLabel('Role of Rafe Tolliver')
  // the filtered list has arrived (debounced search) before anything is changed
  await page.waitForLoadState('networkidle')
  let patches = 0
  page.on('request', (r) => {
    if (r.method() === 'PATCH' && r.url().includes('/api/admin/users/')) patches++
  })

  // Escape: nothing sent, the select shows the role again, focus back on the select
  await select.focus()
  await select.selectOption('lecturer')
  let dialog = await openDialog(page, 'Make Rafe Tolliver a lecturer?')
  await expect(dialog).toContainText('changes from student to lecturer')
  await page.keyboard.press('Escape')
  await expect(dialog).toBeHidden()
  await expect(select).toHaveValue('student')
  await expect(select).toBeFocused()
  expect(patches).toBe(0)

  // confirmed: the role changes
  await select.selectOption('lecturer')
  dialog = await openDialog(page, 'Make Rafe Tolliver a lecturer?')
  await page.screenshot({ path: 'test-results/screenshots/confirm-role.png' })
  await dialog.getByRole('button', { name: 'Change the role' }).click()
  await expect(page.getByText('Rafe Tolliver is now a lecturer.')).toBeVisible()
  expect(patches).toBe(1)
  await select.selectOption('student')
  await (await openDialog(page, 'Make Rafe Tolliver a student?')).getByRole('button', { name: 'Change the role' }).click()
  await expect(page.getByText('Rafe Tolliver is now a student.')).toBeVisible()

  // disabling asks; Cancel keeps the account; confirming disables it; enabling does not ask
  const disable = row.getByRole('button', { name: 'Disable' })
  await disable.click()
  dialog = await openDialog(page, 'Disable Rafe Tolliver\'s account?')
  await dialog.getByRole('button', { name: 'Cancel' }).click()
  await expect(dialog).toBeHidden()
  await expect(disable).toBeFocused()
  await expect(row.getByRole('button', { name: 'Disable' })).toBeVisible()
  await disable.click()
  await (await openDialog(page, 'Disable Rafe Tolliver\'s account?')).getByRole('button', { name: 'Disable the account' }).click()
  await expect(page.getByText('Rafe Tolliver disabled.')).toBeVisible()
  await row.getByRole('button', { name: 'Enable' }).click()
  await expect(page.getByText('Rafe Tolliver enabled.')).toBeVisible()
  await expect(page.getByRole('dialog')).toBeHidden()
})

test('removing an item, finishing a quiz and releasing results ask first; not started is not zero', async ({ browser }) => {
  test.setTimeout(180_000)
  const TITLE = 'Confirmations quiz'
  const tutor = await browser.newPage()
  await signIn(tutor, 'tutor@cyclodial.test')
  await tutor.goto('/quizzes')
  await tutor.waitForLoadState('networkidle')
  await tutor.getByRole('button', { name: 'New quiz' }).click()
  await tutor.getByLabel('Title').fill(TITLE)
  await tutor.getByLabel('Opens').fill(local(-5))
  await tutor.getByLabel('Closes').fill(local(120))
  await tutor.getByLabel('Kestrel cohort').check()
  await tutor.getByRole('button', { name: 'Create quiz' }).click()
  await expect(tutor.getByRole('heading', { level: 1, name: TITLE })).toBeVisible()
  const quizId = Number(tutor.url().match(/\/quizzes\/(\d+)/)![1])
  const form = tutor.getByRole('form', { name: 'Add an item' })
  for (const prompt of ['Patient A', 'Patient B']) {
    await form.getByLabel('Case', { exact: true }).selectOption({ label: 'Exact: right SO palsy, 6° primary' })
    await form.getByLabel('What the student is asked').fill(prompt)
    await form.getByRole('button', { name: 'Add item' }).click()
    await expect(tutor.getByText(/Item \d added\./)).toBeVisible()
  }
  const items = tutor.getByRole('listitem', { name: /^Item \d$/ })
  await expect(items).toHaveCount(2)

  // removing an item: Escape keeps it, confirming removes it
  const remove2 = tutor.getByRole('button', { name: 'Remove item 2' })
  await remove2.click()
  let dialog = await openDialog(tutor, 'Remove item 2?')
  await expect(dialog).toContainText('“Patient B”')
  await tutor.keyboard.press('Escape')
  await expect(dialog).toBeHidden()
  await expect(remove2).toBeFocused()
  await expect(items).toHaveCount(2)
  await remove2.click()
  await (await openDialog(tutor, 'Remove item 2?')).getByRole('button', { name: 'Remove the item' }).click()
  await expect(tutor.getByText('Item 2 removed.')).toBeVisible()
  await expect(items).toHaveCount(1)
  await tutor.getByRole('button', { name: 'Publish' }).click()
  await expect(tutor.getByText('Published: students of the assigned cohorts see it.')).toBeVisible()

  // the student starts, then Finish the quiz asks first
  const student = await browser.newPage()
  await signIn(student, 'student@cyclodial.test')
  await student.goto(`/student/quizzes/${quizId}`)
  await student.waitForLoadState('networkidle')
  await student.getByRole('button', { name: 'Start the quiz' }).click()
  await expect(student).toHaveURL(/\/items\/\d+$/)
  await student.goto(`/student/quizzes/${quizId}`)
  await student.waitForLoadState('networkidle')
  const finish = student.getByRole('button', { name: 'Finish the quiz' })
  await finish.click()
  dialog = await openDialog(student, 'Finish the quiz now?')
  await expect(dialog).toContainText('1 item has not been submitted')
  await student.screenshot({ path: 'test-results/screenshots/confirm-finish.png' })
  await student.keyboard.press('Escape')
  await expect(dialog).toBeHidden()
  await expect(finish).toBeFocused()
  await student.reload()
  await expect(student.getByRole('button', { name: 'Finish the quiz' })).toBeVisible()
  await student.getByRole('button', { name: 'Finish the quiz' }).click()
  await (await openDialog(student, 'Finish the quiz now?')).getByRole('button', { name: 'Finish the quiz' }).click()
  await expect(student.getByText('Your work is in.')).toBeVisible()

  // close it; Release results says who is e-mailed, those who never sat included
  await tutor.getByLabel('Closes').fill(local(-1))
  await tutor.getByRole('button', { name: 'Save settings' }).click()
  await expect(tutor.getByText('Settings saved.')).toBeVisible()
  await tutor.goto(`/quizzes/${quizId}/results`)
  await tutor.waitForLoadState('networkidle')
  const kestrel = DEMO_PEOPLE.filter(p => p.role === 'student' && p.cohort === 'Kestrel cohort')
  expect(kestrel.length).toBe(6)

  // not started is not zero: the rows, the summary and the CSV
  await expect(tutor.getByText(`1 of ${kestrel.length} started · 1 finished · mean of those who finished 0%`)).toBeVisible()
  for (const p of kestrel.filter(p => p.email !== 'student@cyclodial.test')) {
    const row = tutor.getByRole('row', { name: new RegExp(p.name) })
    await expect(row.getByRole('cell').nth(1)).toHaveText('Not started')
    await expect(row.getByTestId('total-not-started')).toHaveText('not started')
    await expect(row).not.toContainText('%')
  }
  await expect(tutor.getByRole('row', { name: /Tamsin Arkwell/ })).toContainText('0%')
  await tutor.screenshot({ path: 'test-results/screenshots/results-not-started-1280x720.png', fullPage: true })
  await tutor.setViewportSize({ width: 820, height: 1180 })
  await expect(tutor.getByTestId('total-not-started').first()).toBeAttached()
  await tutor.screenshot({ path: 'test-results/screenshots/results-not-started-820x1180.png', fullPage: true })
  await tutor.setViewportSize({ width: 1280, height: 720 })
  const download = tutor.waitForEvent('download')
  await tutor.getByRole('link', { name: 'Download CSV' }).click()
  const csv = Papa.parse<string[]>(readFileSync(await (await download).path(), 'utf8').replace(/^\uFEFF/, '').trim()).data
  const header = csv[0]!
  const never = csv.find(r => r[1] === 'jory.feldane@cyclodial.test')!
  expect(never[header.indexOf('Status')]).toBe('not started')
  for (const col of ['Item 1 total', 'Slips', 'Total points', 'Total %']) expect(never[header.indexOf(col)], col).toBe('')
  expect(csv.find(r => r[1] === 'student@cyclodial.test')![header.indexOf('Total %')]).toBe('0')

  const release = tutor.getByRole('button', { name: 'Release results' })
  await release.click()
  dialog = await openDialog(tutor, 'Release the results?')
  await expect(dialog).toContainText(`${kestrel.length} students will be e-mailed that the results are out, including the ${kestrel.length - 1} who never sat the quiz`)
  await tutor.screenshot({ path: 'test-results/screenshots/confirm-release.png' })
  await tutor.keyboard.press('Escape')
  await expect(dialog).toBeHidden()
  await expect(release).toBeFocused()
  await expect(tutor.getByText(/Results released/)).toHaveCount(0)
  await release.click()
  await (await openDialog(tutor, 'Release the results?')).getByRole('button', { name: 'Release and e-mail' }).click()
  await expect(tutor.getByText(`Results released; ${kestrel.length} students e-mailed.`)).toBeVisible()
  await expect(tutor.getByRole('button', { name: 'Release results' })).toHaveCount(0)
})
