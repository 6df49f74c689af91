// Second pass of the record parser: recognise the trade's words and abbreviations
// (domain.md §5.1, clinical-facts §9) in the raw tokens. Each recogniser looks at
// the tokens from a position and says what it read and how many tokens it used.

import type { Eye } from '../types'
import type { RawToken } from './raw'
import { hit, longest, numberAt, phrase, wordAt } from './matching'
import type { Hit, Recogniser, Sem } from './matching'
import { AFTER_IN, DEGREE_UNITS, DEVIATION_WORDS, DIAL_FIGURE_FROM, EX_WORDS, EYE_TABLE, EYE_WORDS, FILLERS, IN_WORDS, METRE, NONE_WORDS, NOTES, NOT_DONE, NOT_FOUND, NO_QUALIFIERS, PRISM_BASE_TABLE, PRISM_UNITS, REASONS, TESTS, TORSION_NOUNS } from './word-tables'
import { gazePhrase } from './gaze-phrase'

// ---- recognisers -----------------------------------------------------------

/** An eye name ends straight before position i ("RE", "right eye"), and no "(" opens before it. */
function eyeLabelBefore(t: RawToken[], i: number): boolean {
  for (const len of [1, 2]) {
    const from = i - len
    if (from < 0) continue
    const m = longest(t, from, EYE_TABLE)
    if (m && m[0] === len && m[1] !== 'both') return wordAt(t, from - 1) !== '('
  }
  return false
}

const readSeparator: Recogniser = (t, i) => {
  const x = wordAt(t, i)
  // "RE: 8 ex LE: nil", "R) 8 ex L) nil": a colon or bracket straight after an eye labels
  // the finding that follows it, so it must not split the eye from its finding
  if ((x === ':' || x === ')') && eyeLabelBefore(t, i)) return hit(t, i, 1, { k: 'colon' })
  if ([',', ';', '.', '/', '|', '·', '•', '&', '(', ')', '[', ']'].includes(x)) return hit(t, i, 1, { k: 'sep', and: x === '&' })
  if (x === 'and' || x === 'plus') return hit(t, i, 1, { k: 'sep', and: true })
  // a colon ends a heading ("1/3 m: RE…"); after an eye ("RE: 8 ex") the assembler joins the two again
  if (x === ':') return hit(t, i, 1, { k: 'sep', and: false })
  if ((x === '-' || x === '+') && t[i + 1]?.type !== 'num') return hit(t, i, 1, { k: 'sep', and: x === '+' })
  // a sign after a number or a closing bracket is a separator, not a sign
  if ((x === '-' || x === '+') && i > 0 && (t[i - 1]!.type === 'num' || wordAt(t, i - 1) === ')' || wordAt(t, i - 1) === '°')) {
    return hit(t, i, 1, { k: 'sep', and: x === '+' })
  }
  return null
}

const readNotDone: Recogniser = (t, i) => {
  const m = longest(t, i, NOT_DONE)
  return m ? hit(t, i, m[0], { k: 'notdone' }) : null
}

const readReason: Recogniser = (t, i) => {
  const m = longest(t, i, REASONS)
  return m ? hit(t, i, m[0], { k: 'reason', v: m[1] }) : null
}

const readTest: Recogniser = (t, i) => {
  const m = longest(t, i, TESTS)
  return m ? hit(t, i, m[0], { k: 'test', v: m[1] }) : null
}

/** "4Δ BD RE", "6 pd base down before the left eye". */
const readPrism: Recogniser = (t, i) => {
  const n = numberAt(t, i)
  if (n === null) return null
  let j = i + 1
  if (wordAt(t, j) === 'prism' && PRISM_UNITS.includes(wordAt(t, j + 1))) j++
  if (!PRISM_UNITS.includes(wordAt(t, j))) return null
  j++
  const base = longest(t, j, PRISM_BASE_TABLE)
  if (base) j += base[0]
  let eye: Eye | null = null
  const skip = ['before', 'over', 'in', 'the', 'to'].includes(wordAt(t, j)) ? 1 + (wordAt(t, j + 1) === 'the' ? 1 : 0) : 0
  const e = longest(t, j + skip, EYE_TABLE)
  if (base && e && e[1] !== 'both') {
    eye = e[1]
    j += skip + e[0]
  }
  if (!base) return hit(t, i, j - i, { k: 'note', text: t.slice(i, j).map(x => x.text).join(' ') })
  return hit(t, i, j - i, { k: 'prism', power: n, base: base[1], eye })
}

/** "R/L 6Δ", "RHT 8", "exophoria" — noted, not graded. */
const readDeviationNote: Recogniser = (t, i) => {
  let j = i
  if (['right', 'left'].includes(wordAt(t, j)) && DEVIATION_WORDS.has(wordAt(t, j + 1))) j++
  if (!DEVIATION_WORDS.has(wordAt(t, j))) return null
  j++
  if (numberAt(t, j) !== null) {
    j++
    if (PRISM_UNITS.includes(wordAt(t, j))) j++
  }
  return hit(t, i, j - i, { k: 'note', text: t.slice(i, j).map(x => x.text).join(' ') })
}

const readNote: Recogniser = (t, i) => {
  const m = longest(t, i, NOTES)
  return m ? hit(t, i, m[0], { k: 'note', text: t.slice(i, i + m[0]).map(x => x.text).join(' ') }) : null
}

/** "→", "->", "=>": a conversion written out ("RE 98 → 8° ex"). */
function arrowAt(t: RawToken[], i: number): number {
  if (wordAt(t, i) === '→' || wordAt(t, i) === '⇒') return 1
  if ((wordAt(t, i) === '-' || wordAt(t, i) === '=') && wordAt(t, i + 1) === '>') return 2
  return 0
}

/**
 * "dial 98°", "reading 98", "rod at 98°", "(dial: RE 98, LE 90)" — dial figures beside a finding
 * are noted, not read as amounts; so is a figure converted with an arrow ("98 → 8° ex").
 */
const readDialNote: Recogniser = (t, i) => {
  let j = i
  if (t[i]?.type === 'num') {
    const n = Number(t[i]!.text)
    const k = i + 1 + (DEGREE_UNITS.includes(wordAt(t, i + 1)) ? 1 : 0)
    const arrow = arrowAt(t, k)
    if (!arrow || n < DIAL_FIGURE_FROM || n > 180) return null
    return hit(t, i, k - i + arrow, { k: 'note', text: t.slice(i, k + arrow).map(x => x.text).join(' ') })
  }
  if (['dial', 'dials', 'reading', 'readings', 'scale', 'read'].includes(wordAt(t, j))) j++
  else if (['rod', 'axis'].includes(wordAt(t, j)) && ['at', '='].includes(wordAt(t, j + 1))) j += 2
  else return null
  if (['at', 'of', '=', 'was', ':', 'were'].includes(wordAt(t, j))) j++
  // one figure, or one per eye: "RE 98, LE 90"
  let figures = 0
  for (;;) {
    let k = j
    const e = longest(t, k, EYE_TABLE)
    if (e && e[1] !== 'both') k += e[0]
    if (['at', '=', ':'].includes(wordAt(t, k))) k++
    if (t[k]?.type !== 'num') break
    k++
    if (DEGREE_UNITS.includes(wordAt(t, k))) k++
    figures++
    j = k
    if (!e || ![',', 'and', '&', ';'].includes(wordAt(t, j))) break
    const next = longest(t, j + 1, EYE_TABLE)
    if (!next) break
    j++
  }
  if (figures === 0) return null
  return hit(t, i, j - i, { k: 'note', text: t.slice(i, j).map(x => x.text).join(' ') })
}

const readDistance: Recogniser = (t, i) => {
  const x = wordAt(t, i)
  // "Distance: near" — the word is a label for what follows
  if (x === 'distance' && wordAt(t, i + 1) === ':') return hit(t, i, 1, null)
  if (['near', 'n', 'nr'].includes(x)) return hit(t, i, 1, { k: 'dist', v: 'near' })
  if (['distance', 'dist', 'd', 'far', 'f', 'distant', 'distances'].includes(x)) {
    return hit(t, i, 1, { k: 'dist', v: 'distance' })
  }
  if (phrase(t, i, ['reading', 'distance'])) return hit(t, i, 2, { k: 'dist', v: 'near' })
  if (x === '1/3' || x === '1/3rd') return hit(t, i, METRE.includes(wordAt(t, i + 1)) ? 2 : 1, { k: 'dist', v: 'near' })
  const n = numberAt(t, i)
  if (n === null || t[i]!.type !== 'num') return null
  const unit = wordAt(t, i + 1)
  if (['cm', 'cms', 'centimetres', 'centimeters'].includes(unit) && n >= 20 && n <= 60) {
    return hit(t, i, 2, { k: 'dist', v: 'near' })
  }
  if (METRE.includes(unit) && n >= 3 && n <= 6) return hit(t, i, 2, { k: 'dist', v: 'distance' })
  if (['ft', 'feet'].includes(unit) && n >= 10 && n <= 20) return hit(t, i, 2, { k: 'dist', v: 'distance' })
  return null
}

const readGaze: Recogniser = (t, i) => {
  // "reading position": the trade's name for the downgaze of near work
  if (wordAt(t, i) === 'reading' && ['position', 'posn', 'pos'].includes(wordAt(t, i + 1))) return hit(t, i, 2, { k: 'gaze', v: 'down' })
  // "20° downgaze", "20 degrees of downgaze"
  const n = numberAt(t, i)
  if (n !== null && t[i]!.type === 'num') {
    // after an eye word the number is that eye's amount: "RE 8° downgaze" is not 8° of downgaze
    if (i > 0 && EYE_WORDS.has(wordAt(t, i - 1))) return null
    let j = i + 1
    if (DEGREE_UNITS.includes(wordAt(t, j))) j++
    // "1° position" / "1° pos" is the clinic's shorthand for the primary position
    if (n === 1 && j === i + 2 && ['pos', 'position', 'posn'].includes(wordAt(t, j))) return hit(t, i, 3, { k: 'gaze', v: 'primary' })
    if (wordAt(t, j) === 'of' || wordAt(t, j) === 'into') j++
    const g = gazePhrase(t, j)
    if (g && g.gaze !== 'primary' && j > i + 1) return hit(t, i, j - i + g.len, { k: 'gaze', v: g.gaze, degrees: n })
    return null
  }
  const g = gazePhrase(t, i)
  if (!g) return null
  // "downgaze (20°)" or "downgaze 20°:"
  let j = i + g.len
  let degrees: number | undefined
  const open = wordAt(t, j) === '(' ? 1 : 0
  const d = numberAt(t, j + open)
  if (d !== null && t[j + open]!.type === 'num') {
    let k = j + open + 1
    if (DEGREE_UNITS.includes(wordAt(t, k))) k++
    if (open ? wordAt(t, k) === ')' : wordAt(t, k) === ':' || wordAt(t, k) === ')') {
      degrees = d
      j = k + (open ? 1 : 0)
    }
  }
  return hit(t, i, j - i, degrees === undefined ? { k: 'gaze', v: g.gaze } : { k: 'gaze', v: g.gaze, degrees })
}

const readEye: Recogniser = (t, i) => {
  const m = longest(t, i, EYE_TABLE)
  if (!m) return null
  // "each eye" / "either eye" say the finding is per eye, never a total
  if (m[1] === 'both' && ['each', 'either'].includes(wordAt(t, i))) return hit(t, i, m[0], { k: 'eye', v: 'both', each: true })
  return hit(t, i, m[0], { k: 'eye', v: m[1] })
}

const isTorsionWord = (x: string): boolean => TORSION_NOUNS.includes(x) || EX_WORDS.has(x) || IN_WORDS.has(x) || x === 'torted'

const readNoTorsion: Recogniser = (t, i) => {
  const x = wordAt(t, i)
  // "within normal limits", "within normal range", "within normal"
  if (x === 'within' && wordAt(t, i + 1) === 'normal') {
    const j = ['limits', 'limit', 'range', 'values'].includes(wordAt(t, i + 2)) ? i + 3 : i + 2
    return hit(t, i, j - i, { k: 'none' })
  }
  if (NONE_WORDS.includes(x)) {
    // "nil torsion", "zero degrees", "none seen", "none detected"
    let j = i + 1
    if (DEGREE_UNITS.includes(wordAt(t, j)) || TORSION_NOUNS.includes(wordAt(t, j))) j++
    if (NOT_FOUND.has(wordAt(t, j))) j++
    return hit(t, i, j - i, { k: 'none' })
  }
  if (x === 'no' || x === 'not') {
    // "no torsion", "no measurable cyclotorsion", "no significant excyclo", "not torted"
    let j = i + 1
    while (NO_QUALIFIERS.has(wordAt(t, j))) j++
    if (isTorsionWord(wordAt(t, j))) {
      j++
      if (NOT_FOUND.has(wordAt(t, j))) j++
      return hit(t, i, j - i, { k: 'none' })
    }
    // "not detected", "not seen" (after a torsion word or an eye: "torsion not detected")
    if (x === 'not' && NOT_FOUND.has(wordAt(t, i + 1))) return hit(t, i, 2, { k: 'none' })
  }
  if (x === 'neither') {
    // "neither eye torted", "neither eye shows torsion": no torsion in both eyes
    let j = i + 1
    if (['eye', 'eyes'].includes(wordAt(t, j))) j++
    if (['is', 'was', 'shows', 'showed', 'has', 'had'].includes(wordAt(t, j))) j++
    while (NO_QUALIFIERS.has(wordAt(t, j))) j++
    if (j > i + 1 && isTorsionWord(wordAt(t, j))) return hit(t, i, j - i + 1, { k: 'none' })
  }
  return null
}

const readNumber: Recogniser = (t, i) => {
  let sign = 0
  let j = i
  if ((wordAt(t, j) === '-' || wordAt(t, j) === '+') && t[j + 1]?.type === 'num') {
    sign = wordAt(t, j) === '-' ? -1 : 1
    j++
  }
  const n = numberAt(t, j)
  if (n === null) return null
  j++
  if (DEGREE_UNITS.includes(wordAt(t, j))) j++
  // "7-8°", "7 to 8 degrees": a range stays a range, never two findings
  if ((wordAt(t, j) === '-' || wordAt(t, j) === 'to') && t[j + 1]?.type === 'num') {
    const m = numberAt(t, j + 1)!
    let k = j + 2
    if (DEGREE_UNITS.includes(wordAt(t, k))) k++
    return hit(t, i, k - i, { k: 'range', from: sign < 0 ? -n : n, to: m })
  }
  return hit(t, i, j - i, { k: 'num', v: sign < 0 ? -n : n, signed: sign !== 0 })
}

const readDirection: Recogniser = (t, i) => {
  const x = wordAt(t, i)
  if (EX_WORDS.has(x)) return hit(t, i, 1, { k: 'dir', v: 'excyclo' })
  if (IN_WORDS.has(x) || x === 'inc') return hit(t, i, 1, { k: 'dir', v: 'incyclo' })
  if (x === 'in' && AFTER_IN.has(wordAt(t, i + 1))) return hit(t, i, 2, { k: 'dir', v: 'incyclo' })
  if (x === 'ex' && AFTER_IN.has(wordAt(t, i + 1))) return hit(t, i, 2, { k: 'dir', v: 'excyclo' })
  if (x === 'in') {
    // "in" is a preposition before a position of gaze, a distance or "the"
    const next = i + 1
    const n = wordAt(t, next)
    if (['the', 'a', 'an', 'each', 'both', 'either', 'neither', 'this', 'that', 'primary', 'dim', 'dimmed', 'room', 'trial', 'all', 'any', 'every'].includes(n)) {
      return hit(t, i, 1, null)
    }
    if (readGaze(t, next) || readDistance(t, next)) return hit(t, i, 1, null)
    const e = readEye(t, next)
    // "OD 3 in OS 6 ex": the next eye's finding names its direction, so this "in" is one too
    if (e && numberAt(t, next + e.len) !== null) {
      let k = next + e.len + 1
      if (DEGREE_UNITS.includes(wordAt(t, k))) k++
      if (EX_WORDS.has(wordAt(t, k)) || IN_WORDS.has(wordAt(t, k))) return hit(t, i, 1, { k: 'dir', v: 'incyclo' })
    }
    return hit(t, i, 1, { k: 'in', beforeEye: e !== null })
  }
  return null
}

const readTotalWord: Recogniser = (t, i) => {
  const x = wordAt(t, i)
  if (['total', 'tot', 'overall', 'combined', 'sum', 'net', 'summed'].includes(x)) return hit(t, i, 1, { k: 'total' })
  if (x === 'each' || x === 'respectively') return hit(t, i, 1, { k: 'each' })
  return null
}

const readFiller: Recogniser = (t, i) => (FILLERS.has(wordAt(t, i)) ? hit(t, i, 1, null) : null)

/** Recognisers in priority order: longer, more specific phrases first. */
const RECOGNISERS: Recogniser[] = [
  readSeparator,
  // a reason phrase may start like "not done" ("could not see both lines"): the longer reading wins
  readReason,
  readNotDone,
  readTest,
  readPrism,
  readDeviationNote,
  readDialNote,
  readNote,
  readDistance,
  readGaze,
  readNoTorsion,
  readEye,
  readNumber,
  readDirection,
  readTotalWord,
  readFiller,
]

export function lex(tokens: RawToken[]): Array<Sem & { text: string }> {
  const out: Array<Sem & { text: string }> = []
  let i = 0
  while (i < tokens.length) {
    let h: Hit | null = null
    for (const r of RECOGNISERS) {
      h = r(tokens, i)
      if (h) break
    }
    if (!h) {
      out.push({ k: 'unread', text: tokens[i]!.text, at: i })
      i++
      continue
    }
    if (h.sem) out.push({ ...h.sem, text: h.text })
    i += Math.max(1, h.len)
  }
  return out
}
