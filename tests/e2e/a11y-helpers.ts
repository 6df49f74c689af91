// Accessibility helpers for the end-to-end suite: axe-core at WCAG 2.1 A and AA, Tab-only
// movement, and the checks every open dialog must pass.
import AxeBuilder from '@axe-core/playwright'
import { expect } from '@playwright/test'
import type { Locator, Page } from '@playwright/test'

// axe-core tags for WCAG 2.0 and 2.1, levels A and AA (axe-core API documentation, "runOnly" tags)
export const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']

export async function expectNoViolations(page: Page, what: string) {
  const results = await new AxeBuilder({ page }).withTags(WCAG_TAGS).analyze()
  const found = results.violations.map(v => ({ rule: v.id, where: v.nodes.slice(0, 3).map(n => n.target.join(' ')) }))
  expect(found, what).toEqual([])
}

/** Press Tab (never click) until `target` has focus; fails if it is not reached in `max` presses. */
export async function tabTo(page: Page, target: Locator, max = 200) {
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab')
    if (await target.evaluate(el => el === document.activeElement).catch(() => false)) return
  }
  throw new Error(`Tab did not reach ${target} in ${max} presses`)
}

/** The open dialog: modal, named, focus inside and kept inside (WAI-ARIA APG dialog (modal) pattern), and clean under axe. */
export async function checkOpenDialog(page: Page, name: string | RegExp, what: string): Promise<Locator> {
  const dialog = page.getByRole('dialog', { name })
  await expect(dialog).toBeVisible()
  await expect(dialog).toHaveAttribute('aria-modal', 'true')
  expect(await dialog.evaluate(d => d.contains(document.activeElement))).toBe(true)
  for (let i = 0; i < 4; i++) {
    await page.keyboard.press('Tab')
    expect(await dialog.evaluate(d => d.contains(document.activeElement)), 'Tab stays in the dialog').toBe(true)
  }
  await page.keyboard.press('Shift+Tab')
  expect(await dialog.evaluate(d => d.contains(document.activeElement)), 'Shift+Tab stays in the dialog').toBe(true)
  await expectNoViolations(page, `${what} (dialog open)`)
  return dialog
}

/** Escape closes the dialog and focus goes back to what opened it. */
export async function escapeBackTo(page: Page, dialog: Locator, opener: Locator) {
  await page.keyboard.press('Escape')
  await expect(dialog).toBeHidden()
  await expect(opener).toBeFocused()
}
