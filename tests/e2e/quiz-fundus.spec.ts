// A fundus item in a quiz, in Debian's Chromium against the built server: a tutor
// adds a fundus item in the builder; a student sits it on the fundus marker —
// pointer for one eye, keyboard alone for the other — with autosave surviving a
// reload, hands it in, and sees no marks before release.
import { expect, test } from '@playwright/test'
import type { Page } from '@playwright/test'
import type { StudentFundusItem } from '#shared/types/quiz'
import { gotoReady, sameOrigin, signIn } from './helpers'

const TITLE = 'Browser quiz: a fundus'
const minutesFromNow = (m: number) => new Date(Date.now() + m * 60_000).toISOString()

async function canvasPoint(page: Page, p: { x: number, y: number }, width: number) {
  const box = (await page.getByTestId('fundus-canvas').boundingBox())!
  const scale = box.width / width
  return { x: box.x + p.x * scale, y: box.y + p.y * scale }
}

test('a tutor adds a fundus item; a student marks it by pointer and keyboard, reloads and hands it in', async ({ browser }) => {
  const tutor = await browser.newPage()
  await signIn(tutor, 'tutor@cyclodial.test')
  const cohorts = await (await tutor.request.get('/api/quizzes/cohorts')).json() as { id: number, name: string }[]
  const kestrel = cohorts.find(c => c.name === 'Kestrel cohort')!.id
  const created = await (await tutor.request.post('/api/quizzes', { headers: sameOrigin(tutor), data: { title: TITLE, opensAt: minutesFromNow(-1), closesAt: minutesFromNow(60), cohortIds: [kestrel] } })).json() as { id: number }

  // the builder: a fundus item whose picture is a generated case's fundus
  await tutor.goto(`/quizzes/${created.id}`)
  await tutor.getByLabel('Fundus (disc–fovea angle)').check()
  await tutor.getByLabel('Picture', { exact: true }).selectOption({ value: 'engine:so-palsy-right-standard' })
  await tutor.getByLabel('What the student is asked').fill('Measure both fundi and record the objective finding.')
  await tutor.getByRole('button', { name: 'Add item' }).click()
  await expect(tutor.getByText('Item 1 added.')).toBeVisible()
  await expect(tutor.getByTestId('fundus-item-1')).toContainText('both eyes')
  await tutor.screenshot({ path: 'test-results/screenshots/quiz-fundus-builder.png', fullPage: true })
  expect((await tutor.request.patch(`/api/quizzes/${created.id}`, { headers: sameOrigin(tutor), data: { published: true } })).status()).toBe(200)

  const student = await browser.newPage({ viewport: { width: 1280, height: 720 } })
  await signIn(student, 'adaeze.quillon@cyclodial.test')
  await gotoReady(student, `/student/quizzes/${created.id}`)
  // the picture arrives as pixels rendered on the server
  const rendered = student.waitForResponse(r => /\/pictures\/RE$/.test(new URL(r.url()).pathname))
  await student.getByRole('button', { name: 'Start the quiz' }).click()
  await expect(student).toHaveURL(/\/items\/\d+$/)
  const itemUrl = student.url()
  const apiPath = new URL(itemUrl).pathname.replace('/student/quizzes/', '/api/quizzes/')
  const item = await (await student.request.get(apiPath)).json() as StudentFundusItem
  expect(item.kind).toBe('fundus')
  // the student's page holds no disc or fovea coordinates: the tutor's view of the same picture says where they are
  expect(item.presentation).toBeNull()
  expect(JSON.stringify(item)).not.toMatch(/"(disc|fovea|lookKey)"/)
  const me = (await (await student.request.get('/api/auth/me')).json()).user.id
  const pics = (await (await tutor.request.get(`/api/quizzes/${created.id}/items/${item.itemId}/cases/${me}`)).json()).presentation.eyes
  await expect(student.getByTestId('quiz-fundus')).toBeVisible()
  const picture = await rendered
  expect(picture.status()).toBe(200)
  expect(picture.headers()['content-type']).toBe('image/png')
  // …and the marker paints them: the optic disc shows bright where the picture has it
  const discBrightness = () => student.getByTestId('fundus-canvas').evaluate((el, p) => {
    const canvas = el as HTMLCanvasElement
    const perUnit = canvas.width / p.width
    // the brightest pixel within 0.3 disc diameters of the disc centre (vessels cross the centre itself)
    const r = Math.round(0.3 * perUnit)
    const d = canvas.getContext('2d')!.getImageData(Math.round(p.x * perUnit) - r, Math.round(p.y * perUnit) - r, 2 * r, 2 * r).data
    let best = 0
    for (let i = 0; i < d.length; i += 4) best = Math.max(best, d[i]! + d[i + 1]! + d[i + 2]!)
    return best
  }, { x: pics.RE.disc.x, y: pics.RE.disc.y, width: pics.RE.frame.width })
  await expect.poll(discBrightness).toBeGreaterThan(550)

  // right eye by pointer: disc centre, then the fovea
  const re = pics.RE
  const disc = await canvasPoint(student, re.disc, re.frame.width)
  const fovea = await canvasPoint(student, re.fovea, re.frame.width)
  await student.mouse.click(disc.x, disc.y)
  await student.mouse.click(fovea.x, fovea.y)
  await student.getByLabel('Within the normal range').check()
  await expect(student.getByTestId('fundus-angle')).toBeVisible()

  // left eye by keyboard alone: the tabs, then Enter drops a mark in the middle and arrows move it
  await student.getByRole('tab', { name: 'Right eye (RE)' }).focus()
  await student.keyboard.press('ArrowRight')
  await expect(student.getByRole('tab', { name: /Left eye \(LE\)/ })).toHaveAttribute('aria-selected', 'true')
  await student.getByTestId('fundus-canvas').focus()
  await student.keyboard.press('d')
  await student.keyboard.press('Enter')
  for (let i = 0; i < 3; i++) await student.keyboard.press('Shift+ArrowLeft')
  await student.keyboard.press('f')
  await student.keyboard.press('Enter')
  for (let i = 0; i < 4; i++) await student.keyboard.press('Shift+ArrowRight')
  await student.keyboard.press('ArrowDown')
  await expect(student.getByTestId('fundus-angle')).toBeVisible()
  const leAngle = (await student.getByTestId('fundus-angle').textContent())!
  // wait for the save that carries the left eye's finding (an earlier save's "All changes saved" may still show)
  const findingSaved = student.waitForResponse(r => r.request().method() === 'PUT' && r.url().endsWith('/draft') && (r.request().postData() ?? '').includes('"excyclo"') && r.ok())
  await student.getByLabel('Excyclotorsion').check()
  await findingSaved
  await expect(student.getByTestId('save-state')).toContainText('All changes saved')

  // reload: the marks and findings come back from the server
  await student.reload()
  await expect(student.getByTestId('save-state')).toContainText('Saved work restored')
  await student.getByRole('tab', { name: /Left eye \(LE\)/ }).click()
  await expect(student.getByTestId('fundus-angle')).toHaveText(leAngle)
  await expect(student.getByLabel('Excyclotorsion')).toBeChecked()
  await student.screenshot({ path: 'test-results/screenshots/quiz-fundus-sitting.png', fullPage: true })

  await student.getByRole('button', { name: 'Hand in my measurement' }).click()
  await expect(student.getByText(/Submitted\. Marks and feedback come when your tutor releases the results\./)).toBeVisible()
  // no grading on the page before release
  await expect(student.getByTestId('fundus-result')).toHaveCount(0)
  const stored = await (await student.request.get(apiPath)).json() as StudentFundusItem
  expect(stored.attempts).toHaveLength(1)
  expect(JSON.stringify(stored)).not.toMatch(/referenceAngle|expectedFinding/)

  // the tutor's results link to the attempt's page, which shows the marks on the picture
  await tutor.goto(`/quizzes/${created.id}/results`)
  await tutor.getByRole('link', { name: /Adaeze Quillon, item 1:/ }).click()
  await expect(tutor).toHaveURL(/\/fundus-attempts\/\d+$/)
  await expect(tutor.getByRole('heading', { level: 1, name: /Adaeze Quillon · item 1/ })).toBeVisible()
  // the marks sheet names each criterion in words, as a row heading, once on the page
  await expect(tutor.getByRole('rowheader', { name: 'Disc–fovea angle', exact: true })).toHaveCount(1)
  await expect(tutor.getByTestId('marks-sheet')).toHaveCount(1)
})
