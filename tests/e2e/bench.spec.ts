// The bench end to end, in Debian's Chromium against the built server: a student
// opens a case on a fixed seed, turns the dials until the patient reports the
// lines level and parallel — once with the mouse, once with the keyboard alone —
// writes the record from the dial readings, and gets the marks.
import { expect, test } from '@playwright/test'
import type { Locator, Page, Response } from '@playwright/test'
import { SLIP_INFO } from '../../shared/engine/slips'
import type { SlipCode } from '../../shared/engine/slips'
import { sameOrigin, signIn } from './helpers'

// so-palsy-right, standard, this seed: a reliable patient who sees both lines, with
// a vertical deviation that keeps them apart (chosen so the lines never overlap).
const TEMPLATE = 'so-palsy-right'
const SEED = 'e2e-bench-1'
const STUDENT = 'student@cyclodial.test'

type Eye = 'RE' | 'LE'
const COLOUR: Record<Eye, string> = { RE: 'red', LE: 'white' }

async function openCase(page: Page, mode = 'learner-turns'): Promise<number> {
  const res = await page.request.post('/api/practice', { headers: sameOrigin(page), data: { template: TEMPLATE, seed: SEED, mode } })
  expect(res.status()).toBe(201)
  const body = await res.json()
  expect(body.presentation.response).toMatchObject({ reliability: 'fine', streaksSeen: 'both' })
  await page.goto(`/practice/${body.id}`)
  await expect(page.getByRole('heading', { name: 'Trial frame' })).toBeVisible()
  return body.id as number
}

const words = (page: Page) => page.getByTestId('patient-words').innerText()

/**
 * Which way to turn a rod, from what the patient says about that eye's line, the
 * way a learner would: a line whose left end is lower needs the reading raised
 * (anticlockwise); its right end lower, lowered. Null once the line looks level.
 */
function advice(text: string, eye: Eye): { sign: 1 | -1, size: number } | null {
  const c = COLOUR[eye]
  if (new RegExp(`the ${c} line looks level`, 'i').test(text)) return null
  const m = text.match(new RegExp(`the ${c} line slopes (slightly |steeply )?down to my (left|right)`, 'i'))
  if (!m) throw new Error(`no word about the ${c} line in: ${text}`)
  const size = m[1] === 'slightly ' ? 0.5 : m[1] === 'steeply ' ? 4 : 2
  return { sign: m[2] === 'left' ? 1 : -1, size }
}

const reading = async (dial: Locator) => Number(await dial.getAttribute('aria-valuenow'))

/**
 * Turn a dial with the mouse: press inside the cell, move out to 2.5 × the scale's
 * radius (where the rod turns at 1/2.5 of the pointer's turn) and sweep round.
 */
async function mouseTurn(page: Page, dial: Locator, degrees: number) {
  const box = (await dial.boundingBox())!
  const cx = box.x + box.width / 2
  const cy = box.y + box.height / 2
  const R = box.width / 2 / 1.34
  const far = 2.5 * R
  const at = (deg: number, r: number) => {
    const rad = (deg * Math.PI) / 180
    return { x: cx + r * Math.cos(rad), y: cy - r * Math.sin(rad) }
  }
  const start = at(270, 0.5 * R)
  await page.mouse.move(start.x, start.y)
  await page.mouse.down()
  const out = at(270, far)
  await page.mouse.move(out.x, out.y, { steps: 4 })
  const sweep = degrees * 2.5
  const steps = Math.max(2, Math.ceil(Math.abs(sweep)))
  for (let i = 1; i <= steps; i++) {
    const p = at(270 + (sweep * i) / steps, far)
    await page.mouse.move(p.x, p.y)
  }
  await page.mouse.up()
}

/** Level one eye's line; `turn` is how the test turns the dial (mouse or keys). */
async function levelLine(page: Page, eye: Eye, turn: (sign: 1 | -1, size: number) => Promise<void>) {
  for (let i = 0; i < 60; i++) {
    const a = advice(await words(page), eye)
    if (!a) return
    await turn(a.sign, a.size)
  }
  throw new Error(`the ${COLOUR[eye]} line never looked level`)
}

/** The record, worked out from the dial readings by the reading rule (domain.md §3.4, common practice). */
function recordFrom(readings: Record<Eye, number>): string {
  const eye = (e: Eye) => {
    const t = e === 'RE' ? readings.RE - 90 : 90 - readings.LE
    const amount = Math.round(Math.abs(t))
    return amount === 0 ? `${e} no torsion` : `${e} ${amount}° ${t > 0 ? 'excyclotorsion' : 'incyclotorsion'}`
  }
  return `DMR, near, primary position: ${eye('RE')}, ${eye('LE')}.`
}

/** Every JSON answer from the API, to check what reached the browser before submission. */
function collectApi(page: Page) {
  const bodies: { url: string, text: string }[] = []
  page.on('response', async (r: Response) => {
    if (!r.url().includes('/api/') || !(r.headers()['content-type'] ?? '').includes('json')) return
    bodies.push({ url: r.url(), text: await r.text().catch(() => '') })
  })
  return bodies
}

/** Nothing that names the answer: condition words, directions, truth-only keys (architecture.md). */
const ANSWER = /excyclo|incyclo|extorsion|intorsion|palsy|paresis|oblique|rectus|skew|thyroid|suppress|"truth"|"modelRecord"|"condition"|"label"|"torsion"/i
const DIRECTION_OR_TRUTH = /excyclo|incyclo|extorsion|intorsion|"truth"|"modelRecord"|"condition"|"torsion"|"levelAt"/i

async function expectFullMarks(page: Page, submitted: Response) {
  const result = await submitted.json()
  await expect(page.getByTestId('score')).toHaveText('100%')
  await expect(page.getByTestId('no-slips')).toBeVisible()
  expect(result.score).toBe(1)
  expect(result.slips).toEqual([])
  // every criterion marked in full, as the server's engine graded it
  const rows = page.getByTestId('feedback').getByRole('table', { name: 'Marks by criterion' }).first().locator('tbody tr')
  await expect(rows).toHaveCount(result.marks.length)
  for (const m of result.marks) {
    await expect(page.locator(`tr[data-criterion="${m.criterion}"]`)).toContainText(`${m.weight} of ${m.weight}`)
  }
  await expect(page.getByTestId('model-record')).toHaveText(result.modelRecord)
}

test.describe('the bench', () => {
  test('with the mouse: drag until parallel, record, full marks', async ({ page }) => {
    await signIn(page, STUDENT)
    const api = collectApi(page)
    const caseId = await openCase(page)
    const re = page.getByRole('slider', { name: 'Right eye dial' })
    const le = page.getByRole('slider', { name: 'Left eye dial' })
    await expect(re).toHaveAttribute('aria-valuenow', '90')

    const mouse = (dial: Locator) => (sign: 1 | -1, size: number) => mouseTurn(page, dial, sign * size)
    await levelLine(page, 'RE', mouse(re))
    await levelLine(page, 'LE', mouse(le))
    await expect(page.getByTestId('patient-words')).toContainText('parallel now')
    // the drag really moved the rods (this patient's lines are not level at 90°)
    expect(await reading(re)).toBeGreaterThan(92)

    const readings = { RE: await reading(re), LE: await reading(le) }
    const record = recordFrom(readings)
    await page.getByLabel('Your record').fill(record)
    await expect(page.getByTestId('read-as')).toContainText('Test: double Maddox rod · Near · Primary')
    await page.evaluate(() => window.scrollTo(0, 0))
    await page.screenshot({ path: 'test-results/screenshots/bench-1280x720.png' })
    await page.screenshot({ path: 'test-results/screenshots/bench-1280x720-full.png', fullPage: true })

    // before submission: no answer in any API response the page received, nor in the page
    // payload (the learner chose this template, so its title may name the condition)
    for (const b of api) expect(b.text, b.url).not.toMatch(ANSWER)
    expect(await page.locator('#__NUXT_DATA__').textContent()).not.toMatch(DIRECTION_OR_TRUTH)

    const submitted = page.waitForResponse(r => r.url().includes('/attempts') && r.request().method() === 'POST')
    await page.getByRole('button', { name: 'Submit record' }).click()
    await expectFullMarks(page, await submitted)
    await expect(page.getByTestId('eye-image-sketch')).toBeVisible()
    await page.getByTestId('feedback').screenshot({ path: 'test-results/screenshots/bench-feedback.png' })

    // "another like this": a new case from the same template, ready to turn
    const title = await page.getByRole('heading', { level: 1 }).innerText()
    await page.getByRole('button', { name: 'Another like this' }).click()
    await expect(page).not.toHaveURL(new RegExp(`/practice/${caseId}$`))
    await expect(page).toHaveURL(/\/practice\/\d+$/)
    await expect(page.getByRole('heading', { level: 1 })).toHaveText(title)
    await expect(page.getByRole('slider', { name: 'Right eye dial' })).toHaveAttribute('aria-valuenow', '90')
    await expect(page.getByTestId('feedback')).toHaveCount(0)
  })

  test('with the keyboard alone: the same case, full marks', async ({ page }) => {
    await signIn(page, STUDENT)
    await openCase(page)
    const focusByTab = async (target: Locator, limit = 80) => {
      for (let i = 0; i < limit; i++) {
        if (await target.evaluate(el => el === document.activeElement)) return
        await page.keyboard.press('Tab')
      }
      throw new Error('could not reach the control with Tab')
    }
    const re = page.getByRole('slider', { name: 'Right eye dial' })
    const le = page.getByRole('slider', { name: 'Left eye dial' })
    const keys = (sign: 1 | -1, size: number) =>
      page.keyboard.press(size >= 4 ? (sign > 0 ? 'Shift+ArrowUp' : 'Shift+ArrowDown') : sign > 0 ? 'ArrowUp' : 'ArrowDown')

    await focusByTab(re)
    // focus is visible on the dial
    const outline = await re.evaluate(el => getComputedStyle(el).outlineStyle)
    expect(outline).not.toBe('none')
    await levelLine(page, 'RE', keys)
    await focusByTab(le)
    await levelLine(page, 'LE', keys)
    await expect(page.getByTestId('patient-words')).toContainText('parallel now')
    expect(Number.isInteger(await reading(re))).toBe(true)

    const record = recordFrom({ RE: await reading(re), LE: await reading(le) })
    await focusByTab(page.getByLabel('Your record'))
    await page.keyboard.type(record)
    await focusByTab(page.getByRole('button', { name: 'Submit record' }))
    const submitted = page.waitForResponse(r => r.url().includes('/attempts') && r.request().method() === 'POST')
    await page.keyboard.press('Enter')
    await expectFullMarks(page, await submitted)
    // Home returns a dial to 90° (the bench is locked now, so check on a fresh case)
    await openCase(page)
    await focusByTab(re)
    await page.keyboard.press('Shift+ArrowUp')
    await expect(re).toHaveAttribute('aria-valuenow', '95')
    await page.keyboard.press('Home')
    await expect(re).toHaveAttribute('aria-valuenow', '90')
  })

  test('a record of the image instead of the eye shows the slips the engine found', async ({ page }) => {
    await signIn(page, STUDENT)
    await openCase(page)
    const re = page.getByRole('slider', { name: 'Right eye dial' })
    await re.focus()
    await levelLine(page, 'RE', (sign, size) => page.keyboard.press(size >= 4 ? (sign > 0 ? 'Shift+ArrowUp' : 'Shift+ArrowDown') : sign > 0 ? 'ArrowUp' : 'ArrowDown'))
    const t = Math.round((await reading(re)) - 90)
    await page.getByLabel('Your record').fill(`DMR, near, primary position: RE ${t}° incyclotorsion, LE no torsion`)
    // the interpretation step, from the cover test on screen: right eye higher, worse in left
    // gaze and on right head tilt → right superior oblique (Parks three-step test, domain.md §7)
    const step = async (legend: string, option: string) => {
      const group = page.getByRole('group', { name: legend })
      await group.getByText(option, { exact: true }).click()
      await expect(group.getByRole('radio', { name: option, exact: true })).toBeChecked()
    }
    await step('1. Higher eye in primary position', 'Right eye')
    await step('2. Worse in gaze to the', 'Left')
    await step('3. Worse on head tilt to the', 'Right')
    await page.getByLabel('Palsied muscle').selectOption('RSO')
    const submitted = page.waitForResponse(r => r.url().includes('/attempts') && r.request().method() === 'POST')
    await page.getByRole('button', { name: 'Submit record' }).click()
    const result = await (await submitted).json()
    expect(JSON.parse((await submitted).request().postData()!).interpretation).toEqual({ higherEye: 'RE', worseGaze: 'left', worseTilt: 'right', muscle: 'RSO' })
    const codes = result.slips.map((s: { code: SlipCode }) => s.code)
    expect(codes).toContain('direction-reversed')
    const shown = page.getByTestId('slips')
    for (const code of codes as SlipCode[]) await expect(shown).toContainText(SLIP_INFO[code].title)
    await expect(page.getByTestId('score')).toHaveText(`${Math.round(result.score * 100)}%`)
    // the interpretation is graded on its own, by the server
    expect(result.interpretation.answer).toBe('RSO')
    expect(result.interpretation.score).toBe(1)
    await expect(page.getByTestId('interpretation-score')).toHaveText('100%')
  })

  test('autosave: a reload keeps the dials, the prisms and the record', async ({ page }) => {
    await signIn(page, STUDENT)
    const id = await openCase(page)
    const re = page.getByRole('slider', { name: 'Right eye dial' })
    await re.focus()
    await page.keyboard.press('Shift+ArrowUp')
    await page.keyboard.press('ArrowUp')
    await page.getByRole('button', { name: 'Place prism' }).click()
    const saved = page.waitForResponse(r => r.url().endsWith(`/api/practice/${id}/draft`) && (r.request().postData() ?? '').includes('DMR near'))
    await page.getByLabel('Your record').fill('DMR near')
    expect((await saved).status()).toBe(200)
    await expect(page.getByTestId('save-state')).toHaveText(/Saved/)
    await page.reload()
    await expect(page).toHaveURL(new RegExp(`/practice/${id}$`))
    await expect(re).toHaveAttribute('aria-valuenow', '96')
    await expect(page.getByRole('list', { name: 'Prisms in the frame' })).toContainText('6Δ base up · RE')
    await expect(page.getByLabel('Your record')).toHaveValue('DMR near')
  })

  test('patient turns: ask, read the scales, and the tablet layout', async ({ page }) => {
    await page.setViewportSize({ width: 820, height: 1180 })
    await signIn(page, STUDENT)
    await openCase(page, 'patient-turns')
    await expect(page.getByRole('slider')).toHaveCount(0)
    const answered = page.waitForResponse(r => r.url().endsWith('/turns') && r.request().method() === 'POST')
    await page.getByRole('button', { name: 'Ask the patient to set the rods' }).click()
    const turn = await (await answered).json()
    await expect(page.getByTestId('active-trial')).toContainText('Trial 1')
    await expect(page.getByTestId('patient-words')).toContainText(turn.words.text)
    // no figure on screen: the learner reads the engraved scale and types it in the box under that dial
    await expect(page.getByTestId('readout-RE')).toHaveText('Your reading, right-eye scale (°)')
    await expect(page.getByTestId('readout-RE').locator('input')).toHaveValue('')
    await page.screenshot({ path: 'test-results/screenshots/bench-tablet-patient-turns.png', fullPage: true })
    // the frame and the patient's view sit one above the other without overlapping
    const frame = await page.getByRole('figure', { name: 'Trial frame' }).boundingBox()
    const view = await page.getByRole('figure', { name: 'Patient\'s view' }).boundingBox()
    expect(frame!.y + frame!.height).toBeLessThanOrEqual(view!.y)

    // this test reads the scale from where the patient left the rods (the browser holds that)
    await page.getByLabel('Your reading, right-eye scale (°)').fill(String(turn.readings.RE))
    await page.getByLabel('Your reading, left-eye scale (°)').fill(String(turn.readings.LE))
    await page.getByLabel('Your record').fill(recordFrom(turn.readings))
    const submitted = page.waitForResponse(r => r.url().includes('/attempts') && r.request().method() === 'POST')
    await page.getByRole('button', { name: 'Submit record' }).click()
    const sent = JSON.parse((await submitted).request().postData()!)
    expect(sent).toMatchObject({ trial: turn.trial, readings: turn.readings })
    const result = await (await submitted).json()
    await expect(page.locator('tr[data-criterion="measurement"]')).toContainText('2 of 2')
    await expect(page.getByTestId('score')).toHaveText(`${Math.round(result.score * 100)}%`)
  })

  test('a hidden case\'s heading names the condition once the attempt is in (issue 11)', async ({ page }) => {
    await signIn(page, STUDENT)
    const res = await page.request.post('/api/practice', { headers: sameOrigin(page), data: { template: 'any' } })
    expect(res.status()).toBe(201)
    const { id } = await res.json()
    await page.goto(`/practice/${id}`)
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('A patient to assess')
    await expect(page.getByText('the condition is revealed after you submit')).toBeVisible()
    await page.getByLabel('Your record').fill('DMR, near, primary position: RE no torsion, LE no torsion.')
    const submitted = page.waitForResponse(r => r.url().includes('/attempts') && r.request().method() === 'POST')
    await page.getByRole('button', { name: 'Submit record' }).click()
    const { caseTitle } = await (await submitted).json()
    expect(caseTitle).toBeTruthy()
    // at once, without a reload, and the same after one
    await expect(page.getByRole('heading', { level: 1 })).toHaveText(caseTitle)
    await expect(page.getByText('the condition is revealed after you submit')).toHaveCount(0)
    await page.reload()
    await expect(page.getByRole('heading', { level: 1 })).toHaveText(caseTitle)
  })

  test('the picker opens a case and the history lists the attempt', async ({ page }) => {
    await signIn(page, STUDENT)
    await page.getByRole('link', { name: 'Practice', exact: true }).first().click()
    await expect(page).toHaveURL(/\/practice$/)
    await page.getByLabel('Case', { exact: true }).selectOption({ label: 'Any case — Cyclodial chooses, the condition stays hidden' })
    await page.getByRole('group', { name: 'Difficulty' }).getByText('Challenging', { exact: true }).click()
    await expect(page.getByRole('radio', { name: 'Challenging' })).toBeChecked()
    const api = collectApi(page)
    await page.getByRole('button', { name: 'Open the bench' }).click()
    await expect(page).toHaveURL(/\/practice\/\d+$/)
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('A patient to assess')
    // Cyclodial chose the case: nothing on the way to the bench or in its payload names it
    await page.getByRole('slider', { name: 'Right eye dial' }).or(page.getByRole('img', { name: /Right eye rod/ })).waitFor()
    expect(api.length).toBeGreaterThan(0)
    for (const b of api) expect(b.text, b.url).not.toMatch(ANSWER)
    // and the page as the server renders it (its payload) after a reload
    await page.reload()
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('A patient to assess')
    const payload = await page.locator('#__NUXT_DATA__').textContent()
    expect(payload).toContain('presentation')
    expect(payload).not.toMatch(ANSWER)
    await page.getByRole('link', { name: 'History' }).click()
    await expect(page.getByRole('heading', { level: 1 })).toHaveText('My attempts')
    const first = page.getByRole('table').getByRole('link').first()
    await first.click()
    await expect(page.getByText('read-only replay')).toBeVisible()
    await expect(page.getByTestId('feedback')).toBeVisible()
    await expect(page.getByRole('slider')).toHaveCount(0)
  })
})
