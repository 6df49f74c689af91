// First pass of the record parser: normalise a written record and split it into
// raw tokens (numbers, words, symbols). Only spelling is touched here, never meaning.

export interface RawToken {
  text: string
  type: 'num' | 'word' | 'sym'
}

const DOTTED_ABBREVIATIONS = /\b(r\.\s?e|l\.\s?e|b\.\s?e|o\.\s?d|o\.\s?s|o\.\s?u|p\.\s?p|d\.\s?m\.\s?r|s\.\s?m\.\s?r)\.?/g

export function normaliseRecordText(text: string): string {
  return (
    text
      .replace(/[º˚ᵒ⁰]/g, '°')
      .replace(/⅓/g, '1/3')
      .replace(/⁄/g, '/')
      .replace(/[’‘`]/g, '\'')
      .toLowerCase()
      .replace(/[δ∆△]/g, ' pd ')
      .replace(/[−–—]/g, '-')
      .replace(/\r?\n/g, ' ; ')
      .replace(DOTTED_ABBREVIATIONS, m => m.replace(/[.\s]/g, ''))
      .replace(/\bn\s*\/\s*a\b/g, ' notapplicable ')
      // clinic shorthand for positions of gaze: d/g = downgaze, u/g = upgaze, p/p = primary position
      .replace(/\b([dup])\s*\/\s*([gp])\b/g, (m, a: string, b: string) => (b === 'g' && a !== 'p' ? (a === 'd' ? ' downgaze ' : ' upgaze ') : a === 'p' && b === 'p' ? ' primary ' : m))
      // vertical-deviation notation: R/L = right hyper, L/R = left hyper
      .replace(/\b([rl])\s*\/\s*([rl])\b/g, (_m, a: string, b: string) => (a === b ? ` ${a} / ${b} ` : ` ${a}hyper${b} `))
      .replace(/(\d)([a-z°])/g, '$1 $2')
      .replace(/([a-z°])(\d)/g, '$1 $2')
      .replace(/([a-z])-(?=[a-z])/g, '$1 ')
  )
}

const TOKEN = /\d+\/\d+|\d+(?:\.\d+)?|[a-z]+(?:'[a-z]+)?|[^\sa-z0-9]/g

export function rawTokens(text: string): RawToken[] {
  const out: RawToken[] = []
  for (const m of normaliseRecordText(text).matchAll(TOKEN)) {
    const t = m[0]
    out.push({ text: t, type: /^\d/.test(t) ? 'num' : /^[a-z]/.test(t) ? 'word' : 'sym' })
  }
  return out
}
