import type { Config } from 'tailwindcss'

// Cyclodial's design tokens. Colours are named for what they mean on screen,
// not for a hue, so components never hard-code a hex value.
// Text tones are chosen to meet WCAG 2.1 AA contrast on every background token
// they sit on (tests/unit/a11y/palette.test.ts checks each pair).
export default {
  content: [
    './app.vue',
    './error.vue',
    './pages/**/*.vue',
    './components/**/*.vue',
    './layouts/**/*.vue',
    './composables/**/*.ts',
  ],
  theme: {
    extend: {
      colors: {
        ink: { DEFAULT: '#15232d', soft: '#3c4e5a', faint: '#58666f' },
        paper: { DEFAULT: '#f6f4ef', raised: '#ffffff', sunk: '#ebe7de' },
        line: { DEFAULT: '#d6d0c4', strong: '#8d816d' },
        lens: { DEFAULT: '#0d6a6f', dark: '#08494d', light: '#d4ecec' },
        brass: { DEFAULT: '#a8741a', light: '#f3e3c2', dark: '#6f4c0f' },
        streak: { red: '#d3263a', white: '#f4efe2', glow: '#ffd9de' },
        night: { DEFAULT: '#0c1116', soft: '#1b242c' },
        ok: { DEFAULT: '#1d7240', light: '#dcefe3' },
        warn: { DEFAULT: '#925600', light: '#fbecd2' },
        bad: { DEFAULT: '#b3261e', light: '#f9dedc' },
      },
      fontFamily: {
        sans: ['"Atkinson Hyperlegible"', 'system-ui', 'sans-serif'],
        mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace'],
      },
      borderRadius: { card: '0.75rem' },
      boxShadow: { card: '0 1px 2px rgb(21 35 45 / 0.08), 0 2px 8px rgb(21 35 45 / 0.06)' },
    },
  },
  plugins: [],
} satisfies Config
