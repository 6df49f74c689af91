// Scripts honour the prefers-reduced-motion media feature (Media Queries Level 5; WCAG 2.1 SC 2.3.3).
import { afterEach, describe, expect, it, vi } from 'vitest'
import { prefersReducedMotion, scrollBehaviour } from '~/utils/motion'

function systemAsks(reduce: boolean) {
  vi.spyOn(window, 'matchMedia').mockImplementation(query => ({
    matches: reduce && query === '(prefers-reduced-motion: reduce)',
    media: query,
    onchange: null,
    addListener: () => {},
    removeListener: () => {},
    addEventListener: () => {},
    removeEventListener: () => {},
    dispatchEvent: () => false,
  }) as MediaQueryList)
}

afterEach(() => vi.restoreAllMocks())

describe('motion in scripts', () => {
  it('scrolls smoothly when nothing is asked', () => {
    systemAsks(false)
    expect(prefersReducedMotion()).toBe(false)
    expect(scrollBehaviour()).toBe('smooth')
  })

  it('jumps instead when the system asks for less motion', () => {
    systemAsks(true)
    expect(prefersReducedMotion()).toBe(true)
    expect(scrollBehaviour()).toBe('auto')
  })
})
