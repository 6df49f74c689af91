import { expect, test, type Page } from '@playwright/test'
import { discFoveaAngle } from '#shared/engine/fundus/geometry'
import { findingForAngle } from '#shared/engine/fundus/normals'
import type { FundusPicture } from '#shared/engine/fundus/picture'
import type { Eye } from '#shared/engine/types'
import type { CaseFundusView } from '#shared/types/fundus'
import { SYNTHETIC_PHOTO, syntheticPng } from '../support/fundus'
import { sameOrigin, signIn } from './helpers'

const LABEL: Record<string, string> = { 'excyclo': 'Excyclotorsion', 'incyclo': 'Incyclotorsion', 'within-normal': 'Within the normal range' }

async function canvasPoint(page: Page, p: { x: number, y: number }, width: number) {
  const box = (await page.getByTestId('fundus-canvas').boundingBox())!
  const scale = box.width / width
  return { x: box.x + p.x * scale, y: box.y + p.y * scale }
}

test.use({ hasTouch: true })

test('a student marks both eyes of a generated case precisely, by pointer, touch and keyboard, and agrees with the case within a degree', async ({ page }) => {
  await signIn(page, 'student@cyclodial.test')
  const started = await page.request.post('/api/practice', { headers: sameOrigin(page), data: { template: 'long-standing-so-palsy', difficulty: 'standard', seed: 'e2e-fundus-1' } })
  expect(started.status()).toBe(201)
  const caseId = (await started.json()).id as number
  // from the bench, beside the trial frame
  await page.goto(`/practice/${caseId}`)
  await page.getByRole('main').getByRole('link', { name: 'Drawn fundus' }).click()
  await expect(page).toHaveURL(new RegExp(`/fundus/cases/${caseId}$`))
  // a case's fundus is drawn by Cyclodial, never called a photograph (issue 13, point 10)
  await expect(page.getByRole('heading', { level: 1, name: 'Drawn fundus' })).toBeVisible()
  const view = await (await page.request.get(`/api/fundus/cases/${caseId}`)).json() as CaseFundusView

  for (const eye of ['RE', 'LE'] as Eye[]) {
    const pic: FundusPicture = view.presentation.eyes[eye]
    await page.getByRole('tab', { name: eye === 'RE' ? 'Right eye (RE)' : 'Left eye (LE)' }).click()
    const disc = await canvasPoint(page, pic.disc, pic.frame.width)
    const fovea = await canvasPoint(page, pic.fovea, pic.frame.width)
    if (eye === 'RE') {
      await page.mouse.click(disc.x, disc.y)
      // the fovea lands 6 screen pixels right and 3 low, then the arrow keys bring it home
      await page.mouse.click(fovea.x + 6, fovea.y + 3)
      await expect(page.getByRole('radio', { name: /Fovea/ })).toHaveAttribute('aria-checked', 'true')
      await page.keyboard.press('Shift+ArrowLeft') // ten pixels left …
      for (let i = 0; i < 4; i++) await page.keyboard.press('ArrowRight') // … and four back right
      for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowUp')
    }
    else {
      await page.touchscreen.tap(disc.x, disc.y)
      await page.touchscreen.tap(fovea.x, fovea.y)
    }
    const expected = discFoveaAngle(eye, pic.disc, pic.fovea)
    const shown = Number((await page.getByTestId('fundus-angle').textContent())!.replace('°', ''))
    expect(Math.abs(shown - expected)).toBeLessThanOrEqual(1)
    await page.getByRole('radio', { name: LABEL[findingForAngle(eye, shown)] }).check()
  }
  await page.screenshot({ path: 'test-results/screenshots/fundus-case-marked.png' })
  await page.getByRole('button', { name: 'Check my measurement' }).click()
  const result = page.getByTestId('fundus-result')
  await expect(result).toBeVisible()
  for (const eye of ['RE', 'LE'] as Eye[]) {
    const row = page.getByTestId(`fundus-result-${eye}`)
    const measured = Number((await row.getByTestId('measured-angle').textContent())!.replace('°', ''))
    const reference = Number((await row.getByTestId('reference-angle').textContent())!.replace('°', ''))
    const pic = view.presentation.eyes[eye]
    expect(reference).toBeCloseTo(discFoveaAngle(eye, pic.disc, pic.fovea), 0)
    expect(Math.abs(measured - reference)).toBeLessThanOrEqual(1)
  }
  await expect(result.getByText(/Normal range/)).toBeVisible()
  await expect(result.getByText(/1684-9/).first()).toBeVisible()
  await expect(result.getByText(/Record this patient's double Maddox rod result/)).toBeVisible()
  // the caution is said once, in the page's footer
  await expect(page.getByRole('note', { name: 'Educational simulation' })).toHaveCount(1)
  await expect(page.getByRole('contentinfo').getByRole('note', { name: 'Educational simulation' })).toContainText('drawn fundi are simulated')
  await page.screenshot({ path: 'test-results/screenshots/fundus-case-result.png', fullPage: true })
})

test('a tutor uploads and marks a photograph; a student of the cohort measures it; another cohort cannot fetch it', async ({ page, browser }) => {
  await signIn(page, 'tutor@cyclodial.test')
  await page.getByRole('navigation', { name: 'Main', exact: true }).getByRole('link', { name: 'Fundus photographs' }).click()
  await expect(page.getByText(/must be de-identified|De-identified and with consent only/).first()).toBeVisible()
  await page.getByLabel('Photograph (JPEG or PNG, at most 10 MB)').setInputFiles({ name: 'teaching-fundus.png', mimeType: 'image/png', buffer: await syntheticPng() })
  await page.getByLabel('Title').fill('Kestrel teaching fundus')
  await page.getByLabel('Eye').selectOption('RE')
  await page.getByRole('button', { name: 'Upload photograph' }).click()
  await expect(page.getByText('Confirm that the photograph is de-identified and used with consent.')).toBeVisible()
  await page.getByLabel(/I confirm this photograph is de-identified/).check()
  await page.getByRole('button', { name: 'Upload photograph' }).click()
  await expect(page).toHaveURL(/\/fundus\/photos\/\d+$/)
  const photoId = page.url().split('/').pop()!

  await page.getByTestId('fundus-canvas').waitFor()
  const d = await canvasPoint(page, SYNTHETIC_PHOTO.disc, SYNTHETIC_PHOTO.width)
  const f = await canvasPoint(page, SYNTHETIC_PHOTO.fovea, SYNTHETIC_PHOTO.width)
  await page.mouse.click(d.x, d.y)
  await page.mouse.click(f.x, f.y)
  await page.getByRole('button', { name: 'Save reference marks' }).click()
  // atan(25 / 200) = 7.1° (tan α = vertical / horizontal offset, clinical-facts R45)
  await expect(page.getByText(/Reference marks saved: 7\.\d°/)).toBeVisible()
  await page.screenshot({ path: 'test-results/screenshots/fundus-photo-reference.png' })
  // the marked photograph is in the tutor's casebook, ready to be a quiz item
  await page.getByRole('navigation', { name: 'Main', exact: true }).getByRole('link', { name: 'Casebook' }).click()
  const inCasebook = page.getByRole('region', { name: 'Your fundus photographs' }).getByRole('row', { name: /Kestrel teaching fundus/ })
  await expect(inCasebook).toContainText(/7\.\d°/)
  await expect(inCasebook.getByRole('link', { name: 'Open' })).toHaveAttribute('href', `/fundus/photos/${photoId}`)

  const kestrel = await browser.newPage({ hasTouch: true })
  await signIn(kestrel, 'student@cyclodial.test')
  await kestrel.goto('/fundus/photos')
  await kestrel.getByRole('listitem').filter({ hasText: 'Kestrel teaching fundus' }).getByRole('link', { name: 'Measure' }).click()
  await expect(kestrel.getByRole('heading', { level: 1, name: 'Kestrel teaching fundus' })).toBeVisible()
  const sd = await canvasPoint(kestrel, SYNTHETIC_PHOTO.disc, SYNTHETIC_PHOTO.width)
  const sf = await canvasPoint(kestrel, SYNTHETIC_PHOTO.fovea, SYNTHETIC_PHOTO.width)
  await kestrel.mouse.click(sd.x, sd.y)
  await kestrel.mouse.click(sf.x, sf.y)
  await kestrel.getByRole('radio', { name: 'Within the normal range' }).check()
  await kestrel.getByRole('button', { name: 'Check my measurement' }).click()
  const measured = Number((await kestrel.getByTestId('fundus-result-RE').getByTestId('measured-angle').textContent())!.replace('°', ''))
  const reference = Number((await kestrel.getByTestId('fundus-result-RE').getByTestId('reference-angle').textContent())!.replace('°', ''))
  expect(Math.abs(measured - reference)).toBeLessThanOrEqual(1)
  await kestrel.close()

  const heron = await browser.newPage()
  await signIn(heron, 'milo.strathearn@cyclodial.test')
  expect((await heron.request.get(`/api/fundus/photos/${photoId}/image`)).status()).toBe(404)
  await heron.goto(`/fundus/photos/${photoId}`)
  await expect(heron.getByText('This photograph was not found, or it is not shared with you.')).toBeVisible()
  await heron.close()
})
