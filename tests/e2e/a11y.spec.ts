// axe-core on every page each role can reach (the list is in pages.ts), with the
// WCAG 2.0 and 2.1 A and AA rules: no violations.
import { readdirSync, statSync } from 'node:fs'
import { join } from 'node:path'
import AxeBuilder from '@axe-core/playwright'
import { expect, test } from '@playwright/test'
import { WCAG_TAGS } from './a11y-helpers'
import { gotoReady, signIn } from './helpers'
import { ACCOUNTS, NOT_VISITED, PAGES } from './pages'

function vueFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    return statSync(path).isDirectory() ? vueFiles(path) : path.endsWith('.vue') ? [path] : []
  })
}

test('every page under pages/ is in the accessibility run or says why not', () => {
  const listed = new Set([...PAGES.map(p => p.file), ...Object.keys(NOT_VISITED)])
  const missing = vueFiles('pages').filter(f => !listed.has(f))
  expect(missing, 'add these pages to tests/e2e/pages.ts').toEqual([])
})

test('the axe run finds a violation when there is one', async ({ page }) => {
  // a check that could not fail proves nothing: grey #999 on white is 2.85:1, below 4.5:1 (WCAG 2.1 SC 1.4.3)
  await page.setContent('<html lang="en"><head><title>t</title></head><body><main><h1>Check</h1><p style="color:#999999;background:#ffffff">Too faint</p></main></body></html>')
  const results = await new AxeBuilder({ page }).withTags(WCAG_TAGS).analyze()
  expect(results.violations.map(v => v.id)).toContain('color-contrast')
})

for (const entry of PAGES) {
  const who = entry.account ?? (entry.as === 'signed-out' ? 'signed out' : entry.as)
  test(`axe: ${entry.name} (${who}) has no WCAG 2.1 A/AA violations`, async ({ page }) => {
    if (entry.as !== 'signed-out') await signIn(page, entry.account ?? ACCOUNTS[entry.as])
    const path = typeof entry.path === 'string' ? entry.path : await entry.path(page)
    const here = new URL(page.url())
    if (here.pathname + here.search !== path) await page.goto(path)
    await page.waitForLoadState('networkidle')
    await expect(page.getByRole('heading', { level: 1 }).first()).toBeVisible()
    // each page names itself in the title (WCAG 2.1 SC 2.4.2 Page Titled)
    await expect(page).toHaveTitle(/^.+ · Cyclodial$/)
    if (entry.ready) await entry.ready(page)

    const results = await new AxeBuilder({ page }).withTags(WCAG_TAGS).analyze()
    const found = results.violations.map(v => ({
      rule: v.id,
      impact: v.impact,
      count: v.nodes.length,
      where: v.nodes.slice(0, 3).map(n => `${n.target.join(' ')} — ${n.failureSummary?.split('\n').slice(1, 2).join('').trim()}`),
    }))
    expect(found, `${path}`).toEqual([])
  })
}

test('a refused sign-in moves focus to the first field in error', async ({ page }) => {
  await gotoReady(page, '/login')
  await page.getByRole('button', { name: 'Sign in' }).click()
  const invalid = page.locator('[aria-invalid="true"]')
  await expect(invalid.first()).toBeVisible()
  await expect(invalid.first()).toBeFocused()
  // the message is tied to the field (WCAG 2.1 SC 3.3.1 Error Identification)
  const described = await invalid.first().getAttribute('aria-describedby')
  expect(described).toBeTruthy()
  await expect(page.locator(`#${described!.split(' ')[0]}`)).toHaveClass(/field-error/)
})

test('a refused record check moves focus to the first field in error', async ({ page }) => {
  await signIn(page, 'tutor@cyclodial.test')
  await page.goto('/record-checker')
  await page.waitForLoadState('networkidle')
  await page.getByRole('button', { name: 'Check record' }).click()
  const invalid = page.locator('[aria-invalid="true"]')
  await expect(invalid.first()).toBeVisible()
  await expect(invalid.first()).toBeFocused()
  const described = await invalid.first().getAttribute('aria-describedby')
  expect(described).toBeTruthy()
  await expect(page.locator(`#${described!.split(' ')[0]}`)).toHaveClass(/field-error/)
})
