// A quiz end to end in Debian's Chromium against the built server: a tutor builds
// a two-item quiz and publishes it; a student sits it on the bench (patient turns,
// then learner turns) with no feedback, autosave surviving a reload; the tutor
// closes it, opens the student's attempt, changes a mark, releases and downloads
// the CSV; the student then sees the marks.
import { readFileSync } from 'node:fs'
import { expect, test } from '@playwright/test'
import type { Page, Response } from '@playwright/test'
import Papa from 'papaparse'
import { signIn } from './helpers'

const TUTOR = 'tutor@cyclodial.test'
const STUDENT = 'student@cyclodial.test'
const TITLE = 'Browser quiz: two patients'
const pad = (n: number) => String(n).padStart(2, '0')
/** A datetime-local value, minutes from now (the browser and this process share a time zone). */
const local = (minutes: number) => {
  const d = new Date(Date.now() + minutes * 60_000)
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`
}

/** Which way to turn a rod from what the patient says about that eye's line (as a learner would). */
function advice(text: string, colour: 'red' | 'white'): 1 | -1 | 0 {
  if (new RegExp(`the ${colour} line looks level`, 'i').test(text)) return 0
  const m = text.match(new RegExp(`the ${colour} line slopes (?:slightly |steeply )?down to my (left|right)`, 'i'))
  if (!m) throw new Error(`no word about the ${colour} line in: ${text}`)
  return m[1] === 'left' ? 1 : -1
}

async function levelWithKeys(page: Page, eye: 'RE' | 'LE') {
  const dial = page.getByRole('slider', { name: eye === 'RE' ? 'Right eye dial' : 'Left eye dial' })
  await dial.focus()
  for (let i = 0; i < 60; i++) {
    const a = advice(await page.getByTestId('patient-words').innerText(), eye === 'RE' ? 'red' : 'white')
    if (a === 0) return Number(await dial.getAttribute('aria-valuenow'))
    await page.keyboard.press(a > 0 ? 'ArrowUp' : 'ArrowDown')
  }
  throw new Error(`the ${eye} line never looked level`)
}

/** The record from the readings by the reading rule (domain.md §3.4, common practice). */
function recordFrom(r: { RE: number, LE: number }): string {
  const eye = (e: 'RE' | 'LE') => {
    const t = e === 'RE' ? r.RE - 90 : 90 - r.LE
    const a = Math.round(Math.abs(t))
    return a === 0 ? `${e} no torsion` : `${e} ${a}° ${t > 0 ? 'excyclotorsion' : 'incyclotorsion'}`
  }
  return `DMR, near, primary position: ${eye('RE')}, ${eye('LE')}.`
}

/** Student-facing API answers, minus what the student typed themselves (record, readings). */
function collectApi(page: Page) {
  const bodies: { url: string, json: unknown }[] = []
  page.on('response', async (r: Response) => {
    if (!r.url().includes('/api/quizzes') || !(r.headers()['content-type'] ?? '').includes('json')) return
    const json = await r.json().catch(() => null)
    if (json && typeof json === 'object' && 'draft' in json && json.draft) delete (json.draft as Record<string, unknown>).record
    bodies.push({ url: r.url(), json })
  })
  return bodies
}
const ANSWER = /excyclo|incyclo|extorsion|intorsion|palsy|paresis|oblique|rectus|skew|thyroid|suppress|"truth"|"modelRecord"|"condition"|"label"|"torsion"|"templateId"/i

test('a tutor builds a two-item quiz, a student sits it, the tutor marks, releases and exports', async ({ browser }) => {
  test.setTimeout(180_000)
  const tutor = await browser.newPage()
  await signIn(tutor, TUTOR)
  await tutor.getByRole('link', { name: 'Quizzes', exact: true }).first().click()
  await expect(tutor.getByRole('heading', { level: 1, name: 'Quizzes' })).toBeVisible()
  await tutor.getByRole('button', { name: 'New quiz' }).click()
  await tutor.getByLabel('Title').fill(TITLE)
  await tutor.getByLabel('Instructions for students').fill('Measure in primary position at near and record what you find.')
  await tutor.getByLabel('Opens').fill(local(-5))
  await tutor.getByLabel('Closes').fill(local(120))
  await tutor.getByLabel('Time limit (minutes)').fill('30')
  await tutor.getByLabel('Kestrel cohort').check()
  await tutor.getByRole('button', { name: 'Create quiz' }).click()
  await expect(tutor.getByRole('heading', { level: 1, name: TITLE })).toBeVisible()

  const form = tutor.getByRole('form', { name: 'Add an item' })
  await form.getByLabel('Case', { exact: true }).selectOption({ label: 'Acquired right superior oblique palsy (standard)' })
  await form.getByLabel('What the student is asked').fill('Patient A: the patient turns the rods; read the scales and record.')
  await form.getByRole('button', { name: 'Add item' }).click()
  await expect(tutor.getByText('Item 1 added.')).toBeVisible()
  await form.getByLabel('Case', { exact: true }).selectOption({ label: 'Exact: right SO palsy, 6° primary' })
  await form.getByLabel('What the student is asked').fill('Patient B: turn the rods yourself and record.')
  await form.getByLabel('Learner turns (the student sets the dials)').check()
  await expect(form.getByLabel('A different patient for each student')).toBeDisabled()
  await form.getByRole('button', { name: 'Add item' }).click()
  await expect(tutor.getByText('Item 2 added.')).toBeVisible()
  await expect(tutor.getByRole('listitem', { name: /^Item \d$/ })).toHaveCount(2)
  await tutor.getByRole('button', { name: 'Publish' }).click()
  await expect(tutor.getByText('Published: students of the assigned cohorts see it.')).toBeVisible()
  await tutor.screenshot({ path: 'test-results/screenshots/quiz-builder.png', fullPage: true })
  const quizId = Number(tutor.url().match(/\/quizzes\/(\d+)/)![1])

  // the student sits it
  const student = await browser.newPage()
  const api = collectApi(student)
  await signIn(student, STUDENT)
  await student.getByRole('link', { name: 'Quizzes', exact: true }).first().click()
  await expect(student.getByRole('heading', { name: 'Open now' })).toBeVisible()
  await student.getByRole('link', { name: TITLE }).click()
  await student.getByRole('button', { name: 'Start the quiz' }).click()
  await expect(student).toHaveURL(new RegExp(`/student/quizzes/${quizId}/items/\\d+$`))
  await expect(student.getByRole('heading', { level: 1, name: 'Item 1' })).toBeVisible()
  await expect(student.getByRole('timer')).toContainText(/Time left (29|30) min/)

  // item 1, patient turns: ask, read the scales, record; autosave survives a reload
  const turned = student.waitForResponse(r => r.url().endsWith('/turns') && r.request().method() === 'POST')
  await student.getByRole('button', { name: 'Ask the patient to set the rods' }).click()
  const turn = await (await turned).json()
  await expect(student.getByTestId('active-trial')).toContainText('Trial 1')
  const read = { RE: Math.round(turn.readings.RE), LE: Math.round(turn.readings.LE) }
  await student.getByLabel('Your reading, right-eye scale (°)').fill(String(read.RE))
  await student.getByLabel('Your reading, left-eye scale (°)').fill(String(read.LE))
  await student.getByLabel('Your record').fill(recordFrom(read))
  await expect(student.getByTestId('save-state')).toContainText('All changes saved')
  await student.reload()
  await expect(student.getByLabel('Your record')).toHaveValue(recordFrom(read))
  await expect(student.getByLabel('Your reading, right-eye scale (°)')).toHaveValue(String(read.RE))
  await expect(student.getByTestId('active-trial')).toContainText('Trial 1')
  const sent1 = student.waitForResponse(r => r.url().endsWith('/attempts') && r.request().method() === 'POST')
  await student.getByRole('button', { name: 'Submit record' }).click()
  expect((await sent1).status()).toBe(201)
  await expect(student.getByText('Your record has been taken. Marks appear when your tutor releases them.')).toBeVisible()
  await expect(student.getByTestId('feedback')).toHaveCount(0)
  await student.screenshot({ path: 'test-results/screenshots/quiz-sitting-submitted.png', fullPage: true })

  // item 2, learner turns with the keyboard
  await student.getByRole('link', { name: 'Item 2 →' }).click()
  await expect(student.getByRole('heading', { level: 1, name: 'Item 2' })).toBeVisible()
  const readings = { RE: await levelWithKeys(student, 'RE'), LE: await levelWithKeys(student, 'LE') }
  await student.getByLabel('Your record').fill(recordFrom(readings))
  await student.screenshot({ path: 'test-results/screenshots/quiz-sitting-1280x720.png' })
  const sent2 = student.waitForResponse(r => r.url().endsWith('/attempts') && r.request().method() === 'POST')
  await student.getByRole('button', { name: 'Submit record' }).click()
  expect((await sent2).status()).toBe(201)
  await expect(student.getByText('Your record has been taken.')).toBeVisible()
  await student.getByRole('link', { name: 'All items' }).click()
  await student.getByRole('button', { name: 'Finish the quiz' }).click()
  // finishing asks first (issue 13: confirm what cannot be undone)
  await student.getByRole('dialog', { name: 'Finish the quiz now?' }).getByRole('button', { name: 'Finish the quiz' }).click()
  await expect(student.getByText('Your work is in.')).toBeVisible()
  // nothing the student's browser received named the answer
  expect(api.length).toBeGreaterThan(5)
  for (const b of api) expect(JSON.stringify(b.json), b.url).not.toMatch(ANSWER)

  // the tutor reviews, changes a mark, closes, releases and exports
  await tutor.goto(`/quizzes/${quizId}/results`)
  const row = tutor.getByRole('row', { name: /Tamsin Arkwell/ })
  await expect(row).toContainText('Finished')
  await row.getByRole('link', { name: /item 1:/ }).click()
  await expect(tutor.getByRole('heading', { level: 1, name: 'Tamsin Arkwell · item 1' })).toBeVisible()
  await expect(tutor.getByLabel('Your record')).toHaveValue(recordFrom(read))
  await expect(tutor.getByLabel('Your record')).toHaveAttribute('readonly', '')
  await tutor.getByRole('button', { name: 'Change the Test named mark' }).click()
  await tutor.getByLabel('New mark (0–1)').fill('0.5')
  await tutor.getByLabel('Reason (the student sees it)').fill('Write the test out in full in a quiz.')
  await tutor.getByRole('button', { name: 'Save mark' }).click()
  await expect(tutor.getByText('Mark changed; the change is in the audit log.')).toBeVisible()
  await tutor.screenshot({ path: 'test-results/screenshots/quiz-attempt-review.png', fullPage: true })

  await tutor.goto(`/quizzes/${quizId}`)
  await tutor.getByLabel('Closes').fill(local(-1))
  await tutor.getByRole('button', { name: 'Save settings' }).click()
  await expect(tutor.getByText('Settings saved.')).toBeVisible()
  await tutor.getByRole('link', { name: 'Results' }).click()
  await tutor.getByRole('button', { name: 'Release results' }).click()
  // releasing asks first and says who is e-mailed (issue 13)
  const release = tutor.getByRole('dialog', { name: 'Release the results?' })
  await expect(release).toContainText(/\d+ students? will be e-mailed/)
  await release.getByRole('button', { name: 'Release and e-mail' }).click()
  await expect(tutor.getByText(/Results released; \d+ students? e-mailed\./)).toBeVisible()
  await tutor.screenshot({ path: 'test-results/screenshots/quiz-results.png', fullPage: true })
  const download = tutor.waitForEvent('download')
  await tutor.getByRole('link', { name: 'Download CSV' }).click()
  const csv = readFileSync(await (await download).path(), 'utf8').replace(/^\uFEFF/, '')
  const rows = Papa.parse<string[]>(csv.trim()).data
  expect(rows[0]).toEqual(expect.arrayContaining(['Student', 'Item 1 total', 'Item 2 total', 'Total points']))
  expect(rows.filter(r => r[1]?.endsWith('@cyclodial.test')).length).toBe(rows.length - 1)
  expect(rows.find(r => r[1] === STUDENT)).toBeTruthy()

  // the student sees the marks now
  await student.goto(`/student/quizzes/${quizId}`)
  await expect(student.getByText(/^Total: [\d.]+ of [\d.]+ \(\d+%\)$/)).toBeVisible()
  await expect(student.getByText('Changed by your tutor: Write the test out in full in a quiz.')).toBeVisible()
})
