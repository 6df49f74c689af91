// Contrast of Cyclodial's colour tokens, read from tailwind.config.ts, for every text
// token on every background token it is used on, and for the non-text indicators.
import { describe, expect, it } from 'vitest'
import config from '../../../tailwind.config'

type Shades = Record<string, string>
const colours = config.theme.extend.colors as Record<string, Shades>

/** A token as Tailwind names it: 'ink' is ink.DEFAULT, 'ink-faint' is ink.faint. */
function token(name: string): string {
  if (name === 'white') return '#ffffff'
  const [family, shade = 'DEFAULT'] = name.split('-') as [string, string?]
  const hex = colours[family]?.[shade]
  if (!hex) throw new Error(`no colour token ${name} in tailwind.config.ts`)
  return hex
}

function rgb(hex: string): [number, number, number] {
  const n = Number.parseInt(hex.slice(1), 16)
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255]
}

/** Relative luminance, WCAG 2.1 definition ("relative luminance", Understanding SC 1.4.3; sRGB threshold 0.04045 as in the sRGB standard). */
function luminance([r, g, b]: [number, number, number]): number {
  const lin = (c: number) => {
    const s = c / 255
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4
  }
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b)
}

/** Contrast ratio (L1 + 0.05) / (L2 + 0.05), WCAG 2.1 definition "contrast ratio". */
function contrast(a: [number, number, number], b: [number, number, number]): number {
  const [l1, l2] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number]
  return (l1 + 0.05) / (l2 + 0.05)
}

/** A background written as 'token' or 'token/alpha%' over the card colour (paper-raised). */
function background(name: string): [number, number, number] {
  const [base, alpha] = name.split('/') as [string, string?]
  const top = rgb(token(base))
  if (!alpha) return top
  const a = Number(alpha) / 100
  const under = rgb(token('paper-raised'))
  return top.map((c, i) => Math.round(c * a + under[i]! * (1 - a))) as [number, number, number]
}

// Light backgrounds in use (grep bg-… in pages/, components/, layouts/), with the
// translucent ones composited over a card.
const LIGHT = ['paper', 'paper-raised', 'paper-sunk', 'lens-light', 'brass-light', 'ok-light', 'warn-light', 'bad-light',
  'paper-sunk/60', 'bad-light/60', 'brass-light/60', 'lens-light/60', 'brass/20']
// Text tokens in use on those backgrounds (text-… classes).
const TEXT = ['ink', 'ink-soft', 'ink-faint', 'lens', 'lens-dark', 'brass-dark', 'ok', 'warn', 'bad']
// Solid fills that carry white text (primary and danger buttons, active marks).
const WHITE_ON = ['lens', 'lens-dark', 'bad']

describe('palette contrast (WCAG 2.1 AA)', () => {
  it('reproduces the ratios WCAG publishes for black and white', () => {
    // WCAG 2.1 "contrast ratio": ratios range from 1:1 to 21:1
    expect(contrast(rgb('#000000'), rgb('#ffffff'))).toBeCloseTo(21, 5)
    expect(contrast(rgb('#777777'), rgb('#777777'))).toBe(1)
    // from memory: #767676 on white is the lightest grey that meets 4.5:1 (4.54)
    expect(contrast(rgb('#767676'), rgb('#ffffff'))).toBeGreaterThanOrEqual(4.5)
    expect(contrast(rgb('#777777'), rgb('#ffffff'))).toBeLessThan(4.5)
  })

  for (const text of TEXT) {
    for (const bg of LIGHT) {
      it(`text-${text} on bg-${bg} meets 4.5:1`, () => {
        // WCAG 2.1 SC 1.4.3 Contrast (Minimum): 4.5:1 for normal text
        expect(contrast(rgb(token(text)), background(bg))).toBeGreaterThanOrEqual(4.5)
      })
    }
  }

  for (const bg of WHITE_ON) {
    it(`white text on bg-${bg} meets 4.5:1`, () => {
      // WCAG 2.1 SC 1.4.3
      expect(contrast(rgb('#ffffff'), background(bg))).toBeGreaterThanOrEqual(4.5)
    })
  }

  it('the focus ring (brass) meets 3:1 on every background it can sit on', () => {
    // WCAG 2.1 SC 1.4.11 Non-text Contrast: 3:1 for visual information needed to see state
    for (const bg of [...LIGHT, 'night', 'night-soft']) {
      expect(contrast(rgb(token('brass')), background(bg)), bg).toBeGreaterThanOrEqual(3)
    }
  })

  it('field borders (line-strong) meet 3:1 on the page and card backgrounds', () => {
    // WCAG 2.1 SC 1.4.11: boundaries needed to identify a form control
    for (const bg of ['paper', 'paper-raised', 'paper-sunk']) {
      expect(contrast(rgb(token('line-strong')), background(bg)), bg).toBeGreaterThanOrEqual(3)
    }
  })

  it('streaks meet 3:1 against the dark field', () => {
    // WCAG 2.1 SC 1.4.11: graphical objects needed to understand the content
    for (const streak of ['streak-red', 'streak-white']) {
      for (const bg of ['night', 'night-soft']) {
        expect(contrast(rgb(token(streak)), background(bg)), `${streak} on ${bg}`).toBeGreaterThanOrEqual(3)
      }
    }
  })

  it('chart marks meet 3:1 on a card', () => {
    // WCAG 2.1 SC 1.4.11; the charts draw bars and lines in these tokens on bg-paper-raised
    for (const mark of ['lens', 'lens-dark', 'brass', 'ok', 'warn', 'bad', 'ink-soft', 'ink-faint', 'line-strong']) {
      expect(contrast(rgb(token(mark)), background('paper-raised')), mark).toBeGreaterThanOrEqual(3)
    }
  })
})
