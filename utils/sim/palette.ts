// Canvas colours, taken from the design tokens so the drawn instrument and the
// Tailwind-styled page never drift apart (canvas cannot read Tailwind classes).
import tokens from '~~/tailwind.config'

const c = tokens.theme.extend.colors

export const PALETTE = {
  ink: c.ink.DEFAULT,
  inkSoft: c.ink.soft,
  inkFaint: c.ink.faint,
  paper: c.paper.DEFAULT,
  paperRaised: c.paper.raised,
  paperSunk: c.paper.sunk,
  line: c.line.DEFAULT,
  lineStrong: c.line.strong,
  lens: c.lens.DEFAULT,
  lensDark: c.lens.dark,
  lensLight: c.lens.light,
  brass: c.brass.DEFAULT,
  brassLight: c.brass.light,
  brassDark: c.brass.dark,
  red: c.streak.red,
  white: c.streak.white,
  glow: c.streak.glow,
  night: c.night.DEFAULT,
  nightSoft: c.night.soft,
  ok: c.ok.DEFAULT,
  bad: c.bad.DEFAULT,
} as const

/** `#rrggbb` → `rgba(r, g, b, a)` for translucent glass and glows. */
export function withAlpha(hex: string, alpha: number): string {
  const n = Number.parseInt(hex.slice(1), 16)
  return `rgba(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255}, ${alpha})`
}
