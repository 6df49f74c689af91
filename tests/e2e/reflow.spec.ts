// Reflow (WCAG 2.1 SC 1.4.10): every page of the accessibility run (pages.ts), at 320
// CSS pixels wide — 1280 px at 400 % zoom — reads without scrolling sideways. Wide data
// tables may scroll inside their own box (the criterion's exception for two-dimensional
// content); the page itself may not. The bench may stack its cards.
import { expect, test } from '@playwright/test'
import { signIn } from './helpers'
import { ACCOUNTS, PAGES } from './pages'

// 320 CSS px wide (WCAG 2.1 SC 1.4.10); the height is Cyclodial's choice (a small phone)
test.use({ viewport: { width: 320, height: 640 } })

const seen = new Set<string>()
for (const entry of PAGES) {
  const who = entry.account ?? (entry.as === 'signed-out' ? 'signed out' : entry.as)
  // one visit per page and person is enough here
  const key = `${entry.file}|${who}|${entry.name}`
  if (seen.has(key)) continue
  seen.add(key)
  test(`reflow at 320 px: ${entry.name} (${who})`, async ({ page }) => {
    if (entry.as !== 'signed-out') await signIn(page, entry.account ?? ACCOUNTS[entry.as])
    const path = typeof entry.path === 'string' ? entry.path : await entry.path(page)
    const here = new URL(page.url())
    if (here.pathname + here.search !== path) await page.goto(path)
    await page.waitForLoadState('networkidle')
    await expect(page.getByRole('heading', { level: 1 }).first()).toBeVisible()
    if (entry.ready) await entry.ready(page)
    const size = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }))
    if (size.scroll > size.client) {
      // name what sticks out, to make a failure quick to fix
      const wide = await page.evaluate((limit) => {
        const out: string[] = []
        for (const el of document.querySelectorAll<HTMLElement>('body *')) {
          const r = el.getBoundingClientRect()
          if (r.right > limit + 1 && r.width > 0 && !el.parentElement?.closest('.overflow-x-auto, .overflow-auto')) {
            out.push(`${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ''}.${[...el.classList].slice(0, 4).join('.')} right=${Math.round(r.right)}`)
          }
        }
        return out.slice(0, 8)
      }, size.client)
      expect(size.scroll, `${path} is ${size.scroll}px wide at ${size.client}px: ${wide.join(' | ')}`).toBeLessThanOrEqual(size.client)
    }
  })
}
