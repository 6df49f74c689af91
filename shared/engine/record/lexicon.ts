// Second pass of the record parser: recognise the trade's words and abbreviations
// (domain.md §5.1, clinical-facts §9) in the raw tokens. Each recogniser looks at
// the tokens from a position and says what it read and how many tokens it used.

import type { Direction, Distance, Eye, Gaze, PrismBase } from '../types'
import type { NotPerformedReason, TestName } from './types'
import type { RawToken } from './raw'

export type Sem
  = | { k: 'sep', and: boolean }
    | { k: 'colon' }
    | { k: 'test', v: TestName }
    | { k: 'dist', v: Distance }
    | { k: 'gaze', v: Gaze, degrees?: number }
    | { k: 'eye', v: Eye | 'both', each?: true }
    | { k: 'num', v: number, signed: boolean }
    | { k: 'range', from: number, to: number }
    | { k: 'dir', v: Direction }
    | { k: 'in', beforeEye: boolean }
    | { k: 'none' }
    | { k: 'total' }
    | { k: 'each' }
    | { k: 'prism', power: number, base: PrismBase | null, eye: Eye | null }
    | { k: 'note', text: string }
    | { k: 'notdone' }
    | { k: 'reason', v: NotPerformedReason }
    | { k: 'unread', text: string, at?: number }

export interface Hit {
  sem: Sem | null
  len: number
  text: string
}

type Rec = (t: RawToken[], i: number) => Hit | null

const w = (t: RawToken[], i: number): string => t[i]?.text ?? ''
const hit = (t: RawToken[], i: number, len: number, sem: Sem | null): Hit => ({
  sem,
  len,
  text: t.slice(i, i + len).map(x => x.text).join(' '),
})

/** Match a phrase of words (each slot a set of alternatives) from position i. */
function phrase(t: RawToken[], i: number, slots: ReadonlyArray<readonly string[] | string>): number {
  let j = i
  for (const slot of slots) {
    const x = w(t, j)
    if (typeof slot === 'string' ? slot !== x : !slot.includes(x)) return 0
    j++
  }
  return j - i
}

type Table<T> = ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, T]>
/** Each table's entries by the words they can start with: the parser runs on every keystroke and request. */
const BY_FIRST = new WeakMap<object, Map<string, Array<readonly [ReadonlyArray<readonly string[] | string>, unknown]>>>()
function byFirstWord<T>(table: Table<T>) {
  let index = BY_FIRST.get(table)
  if (!index) {
    index = new Map()
    for (const entry of table) {
      const first = entry[0][0]!
      for (const word of typeof first === 'string' ? [first] : first) {
        const list = index.get(word) ?? []
        list.push(entry)
        index.set(word, list)
      }
    }
    BY_FIRST.set(table, index)
  }
  return index as Map<string, Array<readonly [ReadonlyArray<readonly string[] | string>, T]>>
}

/** Try each phrase; return the longest match. */
function longest<T>(t: RawToken[], i: number, table: Table<T>): [number, T] | null {
  let best: [number, T] | null = null
  for (const [slots, value] of byFirstWord(table).get(w(t, i)) ?? []) {
    const n = phrase(t, i, slots)
    if (n > 0 && (!best || n > best[0])) best = [n, value]
  }
  return best
}

// ---- word tables -----------------------------------------------------------

const NUMBER_WORDS: Record<string, number> = {
  zero: 0, one: 1, two: 2, three: 3, four: 4, five: 5, six: 6, seven: 7, eight: 8, nine: 9, ten: 10,
  eleven: 11, twelve: 12, thirteen: 13, fourteen: 14, fifteen: 15, sixteen: 16, seventeen: 17,
  eighteen: 18, nineteen: 19, twenty: 20, thirty: 30,
}

/** An "amount" this large can only be a figure copied off the dial (the grader uses the same line). */
export const DIAL_FIGURE_FROM = 45

// ("dg" is not a unit here: clinicians write it for downgaze)
export const DEGREE_UNITS = ['°', 'deg', 'degs', 'degree', 'degrees']
const PRISM_UNITS = ['pd', 'prism', 'prisms', 'pdpt', 'dioptre', 'dioptres', 'diopter', 'diopters']

export const EX_WORDS = new Set([
  'ex', 'exc', 'excyc', 'excyclo', 'excyclotorsion', 'excyclotorted', 'excyclotorsional', 'excyclotropia',
  'excyclophoria', 'excyclodeviation', 'excycloduction', 'excyclorotation', 'excycloversion', 'extorsion',
  'extorsional', 'extorted', 'extort', 'extorts', 'extortion', 'excyclotortion', 'extorsions',
  'excyclorotated', 'exrotated', 'exrotation', 'excyclotorsions', 'extorting', 'excycloposition',
])
export const IN_WORDS = new Set([
  'incyc', 'incyclo', 'incyclotorsion', 'incyclotorted', 'incyclotorsional', 'incyclotropia', 'incyclophoria',
  'incyclodeviation', 'incycloduction', 'incyclorotation', 'incycloversion', 'intorsion', 'intorsional',
  'intorted', 'intort', 'intorts', 'intortion', 'incyclotortion', 'intorsions',
  'incyclorotated', 'inrotated', 'inrotation', 'incyclotorsions', 'intorting', 'incycloposition',
])
const TORSION_NOUNS = ['torsion', 'cyclotorsion', 'cyclo', 'cyclodeviation', 'cyclotropia', 'cyclophoria', 'tilt', 'rotation']
/** Words after a hyphenated "in-"/"ex-" that make it a direction: "in-cyclotorsion", "in-rotated". */
const AFTER_IN = new Set([
  ...TORSION_NOUNS.filter(x => x !== 'tilt'), 'torted', 'torsional', 'rotated', 'cyclotorted', 'cyclorotated', 'cyclorotation', 'cycloduction',
  'cycloversion', 'cyclotorsional',
])
/** Qualifiers clinicians put between "no" and the torsion: "no measurable cyclotorsion". */
const NO_QUALIFIERS = new Set([
  'measurable', 'measureable', 'significant', 'detectable', 'appreciable', 'obvious', 'apparent', 'visible',
  'manifest', 'demonstrable', 'definite', 'discernible', 'discernable', 'clinically', 'subjective', 'real',
  'evident', 'relevant', 'notable', 'further', 'any', 'abnormal',
])
/** Past participles that make "not …" / "none …" a finding of no torsion: "not detected", "none seen". */
const NOT_FOUND = new Set(['detected', 'seen', 'found', 'present', 'noted', 'observed', 'evident', 'demonstrated', 'demonstrable', 'apparent', 'elicited', 'shown', 'appreciated'])

export const FILLERS = new Set([
  'the', 'a', 'an', 'at', 'of', 'with', 'for', 'on', 'by', 'to', 'from', 'position', 'eye', 'eyes', 'test',
  'tested', 'testing', 'measured', 'measurement', 'measures', 'shows', 'showed', 'shown', 'show', 'showing',
  'was', 'is', 'are', 'were', 'has', 'had', 'have', 'there', 'found', 'finding', 'findings', 'result',
  'results', 'reading', 'readings', 'about', 'approx', 'approximately', 'circa', 'ca', 'mean', 'average',
  'avg', 'torsion', 'torsional', 'cyclotorsion', 'cyclo', 'cyclodeviation', 'cyclotropia', 'cyclophoria',
  'deviation', 'degree', 'degrees', 'deg', 'patient', 'pt', 'also', 'then', 'gaze', 'looking', 'look',
  'seen', 'noted', 'recorded', 'record', 'torted', 'rotated', 'rotation', 'rod', 'rods', 'its', 'his', 'her',
  'their', 'amount', 'direction', 'value', 'so', 'ie', 'eg', 'roughly', 'around', 'some', 'slight',
  'slightly', 'mild', 'mildly', 'small', 'marked', 'markedly', 'which', 'that', 'this', 'result', 'obtained',
  'gives', 'given', 'equals', 'only', 'lines', 'line', 'streak', 'streaks', 'sees', 'saw', 'see',
  'perform', 'performed', 'attempt', 'attempted', 'possible', 'as', 'because', 'due', 'since', 'reason',
  'pos', 'either', 'detected', 'detectable', 'observed', 'present',
  '°', ':', '=', '~', '≈', '(', ')', '[', ']', '"', '\'', '?', '!', '*', '#', '@', '>', '<',
])

// ---- recognisers -----------------------------------------------------------

/** An eye name ends straight before position i ("RE", "right eye"), and no "(" opens before it. */
function eyeLabelBefore(t: RawToken[], i: number): boolean {
  for (const len of [1, 2]) {
    const from = i - len
    if (from < 0) continue
    const m = longest(t, from, EYE_TABLE)
    if (m && m[0] === len && m[1] !== 'both') return w(t, from - 1) !== '('
  }
  return false
}

const separator: Rec = (t, i) => {
  const x = w(t, i)
  // "RE: 8 ex LE: nil", "R) 8 ex L) nil": a colon or bracket straight after an eye labels
  // the finding that follows it, so it must not split the eye from its finding
  if ((x === ':' || x === ')') && eyeLabelBefore(t, i)) return hit(t, i, 1, { k: 'colon' })
  if ([',', ';', '.', '/', '|', '·', '•', '&', '(', ')', '[', ']'].includes(x)) return hit(t, i, 1, { k: 'sep', and: x === '&' })
  if (x === 'and' || x === 'plus') return hit(t, i, 1, { k: 'sep', and: true })
  // a colon ends a heading ("1/3 m: RE…"); after an eye ("RE: 8 ex") the assembler joins the two again
  if (x === ':') return hit(t, i, 1, { k: 'sep', and: false })
  if ((x === '-' || x === '+') && t[i + 1]?.type !== 'num') return hit(t, i, 1, { k: 'sep', and: x === '+' })
  // a sign after a number or a closing bracket is a separator, not a sign
  if ((x === '-' || x === '+') && i > 0 && (t[i - 1]!.type === 'num' || w(t, i - 1) === ')' || w(t, i - 1) === '°')) {
    return hit(t, i, 1, { k: 'sep', and: x === '+' })
  }
  return null
}

const NOT_DONE: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, true]> = [
  [['not', ['performed', 'done', 'tested', 'possible', 'attempted', 'measured', 'measurable', 'valid', 'appropriate', 'completed']], true],
  [['not', 'carried', 'out'], true],
  [[['unable', 'cannot', 'can\'t', 'couldnt', 'couldn\'t']], true],
  [['could', 'not'], true],
  [['did', 'not'], true],
  [[['abandoned', 'stopped', 'untestable', 'invalid', 'notapplicable', 'unreliable', 'omitted', 'declined']], true],
  [['test', ['abandoned', 'stopped', 'invalid']], true],
  [['no', ['measurement', 'result', 'reading']], true],
]

const notDone: Rec = (t, i) => {
  const m = longest(t, i, NOT_DONE)
  return m ? hit(t, i, m[0], { k: 'notdone' }) : null
}

const SEE_WORDS = ['see', 'appreciate', 'perceive', 'make', 'distinguish']
const LINE_WORDS = ['streak', 'streaks', 'line', 'lines', 'light', 'lights']
const STREAK_COLOURS = ['red', 'white', 'one', 'single']

const REASONS: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, NotPerformedReason]> = [
  [[['suppression', 'suppresses', 'suppressing', 'suppressed', 'suppress', 'supp']], 'suppression'],
  [['arc'], 'abnormal-correspondence'],
  [['abnormal', 'retinal', 'correspondence'], 'abnormal-correspondence'],
  [['abnormal', 'correspondence'], 'abnormal-correspondence'],
  [['anomalous', 'retinal', 'correspondence'], 'abnormal-correspondence'],
  [['anomalous', 'correspondence'], 'abnormal-correspondence'],
  [[['one', 'single', '1'], ['streak', 'line', 'light']], 'one-streak'],
  [[['sees', 'saw', 'seeing'], 'only', ['one', '1', 'a', 'single']], 'one-streak'],
  [['only', ['one', '1', 'a', 'single'], ['streak', 'line', 'light']], 'one-streak'],
  [['only', 'sees', ['one', '1', 'a', 'single']], 'one-streak'],
  [['no', 'simultaneous', 'perception'], 'suppression'],
  [['cannot', 'see', 'both'], 'one-streak'],
  [['can\'t', 'see', 'both'], 'one-streak'],
  [[['could', 'did', 'does', 'do'], 'not', SEE_WORDS, ['both', 'two', '2']], 'one-streak'],
  [[['couldnt', 'couldn\'t', 'cannot', 'can\'t', 'didnt', 'didn\'t', 'doesnt', 'doesn\'t'], SEE_WORDS, ['both', 'two', '2']], 'one-streak'],
  [['unable', 'to', SEE_WORDS, ['both', 'two', '2']], 'one-streak'],
  [[['sees', 'saw', 'seeing', 'see'], STREAK_COLOURS, LINE_WORDS, 'only'], 'one-streak'],
  [[['sees', 'saw', 'seeing', 'see'], 'only', ['the', 'a', 'one'], STREAK_COLOURS, LINE_WORDS], 'one-streak'],
  [[['sees', 'saw', 'seeing', 'see'], 'only', STREAK_COLOURS, LINE_WORDS], 'one-streak'],
  [[['sees', 'saw', 'seeing', 'see'], ['one', '1', 'a', 'single'], LINE_WORDS, 'only'], 'one-streak'],
  [[STREAK_COLOURS, LINE_WORDS, 'only'], 'one-streak'],
]

const reason: Rec = (t, i) => {
  const m = longest(t, i, REASONS)
  return m ? hit(t, i, m[0], { k: 'reason', v: m[1] }) : null
}

const TESTS: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, TestName]> = [
  [['dmr'], 'double-maddox-rod'],
  [['double', 'maddox'], 'double-maddox-rod'],
  [['double', 'maddox', ['rod', 'rods']], 'double-maddox-rod'],
  [['double', 'maddox', 'rod', 'test'], 'double-maddox-rod'],
  [[['two', '2'], 'maddox', 'rods'], 'double-maddox-rod'],
  [['maddox', 'double', ['rod', 'rods']], 'double-maddox-rod'],
  [['smr'], 'single-maddox-rod'],
  [['single', 'maddox'], 'single-maddox-rod'],
  [['single', 'maddox', 'rod'], 'single-maddox-rod'],
  [['maddox'], 'maddox-rod'],
  [['maddox', ['rod', 'rods']], 'maddox-rod'],
  [['mr'], 'maddox-rod'],
]

const test: Rec = (t, i) => {
  const m = longest(t, i, TESTS)
  return m ? hit(t, i, m[0], { k: 'test', v: m[1] }) : null
}

const EYE_TABLE: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, Eye | 'both']> = [
  [[['re', 'od', 'rt', 'r', 'right']], 'RE'],
  [[['re', 'rt', 'r', 'right'], ['eye', 'e']], 'RE'],
  [['oculus', 'dexter'], 'RE'],
  [[['le', 'os', 'lt', 'l', 'left']], 'LE'],
  [[['le', 'lt', 'l', 'left'], ['eye', 'e']], 'LE'],
  [['oculus', 'sinister'], 'LE'],
  [[['be', 'ou', 'both', 'bilateral', 'bilaterally']], 'both'],
  [['both', 'eyes'], 'both'],
  [['each', 'eye'], 'both'],
  [['either', 'eye'], 'both'],
  // "RE/LE 0" — but never "R/L", which is the notation for a right hypertropia
  [[['re', 'od'], '/', ['le', 'os']], 'both'],
]

const PRISM_BASE_TABLE: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, PrismBase]> = [
  [['bu'], 'up'], [['bd'], 'down'], [['bi'], 'in'], [['bo'], 'out'],
  [['base', 'up'], 'up'], [['base', 'down'], 'down'], [['base', 'in'], 'in'], [['base', 'out'], 'out'],
  [['up'], 'up'], [['down'], 'down'],
]

function numberAt(t: RawToken[], i: number): number | null {
  const x = t[i]
  if (!x) return null
  if (x.type === 'num' && !x.text.includes('/')) return Number(x.text)
  if (x.type === 'word' && x.text in NUMBER_WORDS) return NUMBER_WORDS[x.text]!
  return null
}

/** "4Δ BD RE", "6 pd base down before the left eye". */
const prism: Rec = (t, i) => {
  const n = numberAt(t, i)
  if (n === null) return null
  let j = i + 1
  if (w(t, j) === 'prism' && PRISM_UNITS.includes(w(t, j + 1))) j++
  if (!PRISM_UNITS.includes(w(t, j))) return null
  j++
  const base = longest(t, j, PRISM_BASE_TABLE)
  if (base) j += base[0]
  let eye: Eye | null = null
  const skip = ['before', 'over', 'in', 'the', 'to'].includes(w(t, j)) ? 1 + (w(t, j + 1) === 'the' ? 1 : 0) : 0
  const e = longest(t, j + skip, EYE_TABLE)
  if (base && e && e[1] !== 'both') {
    eye = e[1]
    j += skip + e[0]
  }
  if (!base) return hit(t, i, j - i, { k: 'note', text: t.slice(i, j).map(x => x.text).join(' ') })
  return hit(t, i, j - i, { k: 'prism', power: n, base: base[1], eye })
}

const DEVIATION_WORDS = new Set([
  'rhyperl', 'lhyperr', 'rht', 'lht', 'hypertropia', 'hypotropia', 'hyper', 'hypo', 'hyperphoria',
  'eso', 'exo', 'esotropia', 'exotropia', 'esophoria', 'exophoria', 'et', 'xt', 'ortho', 'orthophoria', 'rhypo', 'lhypo',
])

/** "R/L 6Δ", "RHT 8", "exophoria" — noted, not graded. */
const deviationNote: Rec = (t, i) => {
  let j = i
  if (['right', 'left'].includes(w(t, j)) && DEVIATION_WORDS.has(w(t, j + 1))) j++
  if (!DEVIATION_WORDS.has(w(t, j))) return null
  j++
  if (numberAt(t, j) !== null) {
    j++
    if (PRISM_UNITS.includes(w(t, j))) j++
  }
  return hit(t, i, j - i, { k: 'note', text: t.slice(i, j).map(x => x.text).join(' ') })
}

const SIDE = ['right', 'left', 'r', 'l', 'rt', 'lt']
const NOTES: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, true]> = [
  [['head', 'tilt', SIDE], true],
  [['head', 'tilt', 'to', 'the', SIDE], true],
  [['head', 'tilt', 'to', SIDE], true],
  [['tilt', SIDE], true],
  [['tilt', 'to', 'the', SIDE], true],
  [[SIDE, 'head', 'tilt'], true],
  [[SIDE, 'tilt'], true],
  [[['cc', 'sc']], true],
  [[['with', 'without'], ['glasses', 'specs', 'correction']], true],
  [['aware', 'of', ['tilt', 'torsion', 'diplopia']], true],
  [[['aware', 'symptomatic', 'asymptomatic', 'unaware']], true],
  [[['fr', 'fl']], true],
  [['fixing', SIDE], true],
  [[SIDE, 'fixing'], true],
  [[['upright', 'supine', 'sitting', 'lying', 'dim', 'dimmed', 'room', 'lights', 'light']], true],
  [['torsional', 'diplopia'], true],
  [[['in', 'at', 'for'], ['any', 'all', 'every', 'each'], ['position', 'positions', 'gaze', 'gazes', 'direction', 'directions']], true],
  [[['any', 'all', 'every'], ['position', 'positions', 'gazes']], true],
]

const note: Rec = (t, i) => {
  const m = longest(t, i, NOTES)
  return m ? hit(t, i, m[0], { k: 'note', text: t.slice(i, i + m[0]).map(x => x.text).join(' ') }) : null
}

/** "→", "->", "=>": a conversion written out ("RE 98 → 8° ex"). */
function arrowAt(t: RawToken[], i: number): number {
  if (w(t, i) === '→' || w(t, i) === '⇒') return 1
  if ((w(t, i) === '-' || w(t, i) === '=') && w(t, i + 1) === '>') return 2
  return 0
}

/**
 * "dial 98°", "reading 98", "rod at 98°", "(dial: RE 98, LE 90)" — dial figures beside a finding
 * are noted, not read as amounts; so is a figure converted with an arrow ("98 → 8° ex").
 */
const dialNote: Rec = (t, i) => {
  let j = i
  if (t[i]?.type === 'num') {
    const n = Number(t[i]!.text)
    const k = i + 1 + (DEGREE_UNITS.includes(w(t, i + 1)) ? 1 : 0)
    const arrow = arrowAt(t, k)
    if (!arrow || n < DIAL_FIGURE_FROM || n > 180) return null
    return hit(t, i, k - i + arrow, { k: 'note', text: t.slice(i, k + arrow).map(x => x.text).join(' ') })
  }
  if (['dial', 'dials', 'reading', 'readings', 'scale', 'read'].includes(w(t, j))) j++
  else if (['rod', 'axis'].includes(w(t, j)) && ['at', '='].includes(w(t, j + 1))) j += 2
  else return null
  if (['at', 'of', '=', 'was', ':', 'were'].includes(w(t, j))) j++
  // one figure, or one per eye: "RE 98, LE 90"
  let figures = 0
  for (;;) {
    let k = j
    const e = longest(t, k, EYE_TABLE)
    if (e && e[1] !== 'both') k += e[0]
    if (['at', '=', ':'].includes(w(t, k))) k++
    if (t[k]?.type !== 'num') break
    k++
    if (DEGREE_UNITS.includes(w(t, k))) k++
    figures++
    j = k
    if (!e || ![',', 'and', '&', ';'].includes(w(t, j))) break
    const next = longest(t, j + 1, EYE_TABLE)
    if (!next) break
    j++
  }
  if (figures === 0) return null
  return hit(t, i, j - i, { k: 'note', text: t.slice(i, j).map(x => x.text).join(' ') })
}

const METRE = ['m', 'metre', 'metres', 'meter', 'meters']

const distance: Rec = (t, i) => {
  const x = w(t, i)
  // "Distance: near" — the word is a label for what follows
  if (x === 'distance' && w(t, i + 1) === ':') return hit(t, i, 1, null)
  if (['near', 'n', 'nr'].includes(x)) return hit(t, i, 1, { k: 'dist', v: 'near' })
  if (['distance', 'dist', 'd', 'far', 'f', 'distant', 'distances'].includes(x)) {
    return hit(t, i, 1, { k: 'dist', v: 'distance' })
  }
  if (phrase(t, i, ['reading', 'distance'])) return hit(t, i, 2, { k: 'dist', v: 'near' })
  if (x === '1/3' || x === '1/3rd') return hit(t, i, METRE.includes(w(t, i + 1)) ? 2 : 1, { k: 'dist', v: 'near' })
  const n = numberAt(t, i)
  if (n === null || t[i]!.type !== 'num') return null
  const unit = w(t, i + 1)
  if (['cm', 'cms', 'centimetres', 'centimeters'].includes(unit) && n >= 20 && n <= 60) {
    return hit(t, i, 2, { k: 'dist', v: 'near' })
  }
  if (METRE.includes(unit) && n >= 3 && n <= 6) return hit(t, i, 2, { k: 'dist', v: 'distance' })
  if (['ft', 'feet'].includes(unit) && n >= 10 && n <= 20) return hit(t, i, 2, { k: 'dist', v: 'distance' })
  return null
}

// ---- positions of gaze -----------------------------------------------------

const VERSIONS: Record<string, Gaze> = {
  dextroversion: 'right', laevoversion: 'left', levoversion: 'left', supraversion: 'up', infraversion: 'down',
  dextroelevation: 'up-right', laevoelevation: 'up-left', levoelevation: 'up-left',
  dextrodepression: 'down-right', laevodepression: 'down-left', levodepression: 'down-left',
  elevation: 'up', depression: 'down', upgaze: 'up', downgaze: 'down', sursumversion: 'up', deorsumversion: 'down',
}
const UP = ['up', 'upward', 'upwards', 'upgaze', 'upper', 'elevation', 'supraversion', 'ug', 'superior']
const DOWN = ['down', 'downward', 'downwards', 'downgaze', 'lower', 'depression', 'infraversion', 'dg', 'inferior']
/** Words that name a vertical position of gaze only with "gaze" after them ("inferior gaze", not "superior oblique"). */
const NEEDS_GAZE = ['superior', 'inferior']
const RIGHT = ['right', 'rt', 'r', 'dextroversion']
const LEFT = ['left', 'lt', 'l', 'laevoversion', 'levoversion']
const SINGLE_LETTER_SIDES = ['r', 'l', 'rt', 'lt']
const SIDES_AND_LEVELS = new Set([...UP, ...DOWN, ...RIGHT, ...LEFT])
const INDICATORS = ['gaze', 'looking', 'look', 'looks', 'version']
const DIRECTION_LIKE = (x: string): boolean =>
  EX_WORDS.has(x) || IN_WORDS.has(x) || ['in', 'nil', 'none', 'no', 'normal'].includes(x)

const PRIMARY: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, true]> = [
  [['primary'], true], [['primary', ['position', 'gaze']], true], [['pp'], true], [['prim'], true],
  [['straight', 'ahead'], true], [['looking', 'straight', 'ahead'], true], [['ahead'], true],
  [['pos', '1'], true], [['central', 'gaze'], true], [[['prim', 'primary'], 'pos'], true],
]

function combine(v: 'up' | 'down' | null, h: 'right' | 'left' | null): Gaze | null {
  if (v && h) return `${v}-${h}`
  return v ?? h ?? null
}

/** A position of gaze phrase from position i, e.g. "down and right", "right gaze", "looking up". */
function gazePhrase(t: RawToken[], i: number): { len: number, gaze: Gaze } | null {
  const p = longest(t, i, PRIMARY)
  if (p) return { len: p[0], gaze: 'primary' }
  let v: 'up' | 'down' | null = null
  let h: 'right' | 'left' | null = null
  let indicated = false
  let end = i
  for (let j = i; j < t.length; j++) {
    const x = w(t, j)
    const next = w(t, j + 1)
    const combined = VERSIONS[x]
    if (combined && combined.includes('-')) {
      if (v || h) break
      const [vv, hh] = combined.split('-') as ['up' | 'down', 'right' | 'left']
      v = vv
      h = hh
      indicated = true
      end = j + 1
    }
    else if (UP.includes(x) || DOWN.includes(x)) {
      if (v) break
      if (NEEDS_GAZE.includes(x) && !INDICATORS.includes(next)) break
      v = UP.includes(x) ? 'up' : 'down'
      indicated = true
      end = j + 1
    }
    else if (RIGHT.includes(x) || LEFT.includes(x)) {
      if (h) break
      // "R"/"L" mean a side of gaze only right before "gaze"; a side word just before
      // an eye word, an amount or a direction word is an eye ("downgaze right 8° ex")
      if (SINGLE_LETTER_SIDES.includes(x) && next !== 'gaze') break
      if (['eye', 'eyes', 'e'].includes(next)) break
      if (numberAt(t, j + 1) !== null || DIRECTION_LIKE(next)) break
      if (x === 'dextroversion' || x === 'laevoversion' || x === 'levoversion') indicated = true
      h = RIGHT.includes(x) ? 'right' : 'left'
      end = j + 1
    }
    else if (INDICATORS.includes(x)) {
      indicated = true
      if (v || h) end = j + 1
    }
    else if ((x === 'and' || x === '&' || x === 'to') && (v || h || indicated)) {
      // joins "up and right", "up to the right", "gaze to the left"
      if (next === 'the') j++
      if (!SIDES_AND_LEVELS.has(w(t, j + 1))) break
      if (x === 'to') indicated = true
    }
    else if (x === 'to' && next === 'the' && (RIGHT.includes(w(t, j + 2)) || LEFT.includes(w(t, j + 2)))) {
      // "to the right" on its own
      indicated = true
      j++
    }
    else {
      break
    }
  }
  const g = combine(v, h)
  if (!g || !indicated || end === i) return null
  return { len: end - i, gaze: g }
}

const EYE_WORDS = new Set(['re', 'le', 'r', 'l', 'od', 'os', 'rt', 'lt', 'right', 'left', 'eye', 'be', 'ou'])

const gaze: Rec = (t, i) => {
  // "reading position": the trade's name for the downgaze of near work
  if (w(t, i) === 'reading' && ['position', 'posn', 'pos'].includes(w(t, i + 1))) return hit(t, i, 2, { k: 'gaze', v: 'down' })
  // "20° downgaze", "20 degrees of downgaze"
  const n = numberAt(t, i)
  if (n !== null && t[i]!.type === 'num') {
    // after an eye word the number is that eye's amount: "RE 8° downgaze" is not 8° of downgaze
    if (i > 0 && EYE_WORDS.has(w(t, i - 1))) return null
    let j = i + 1
    if (DEGREE_UNITS.includes(w(t, j))) j++
    // "1° position" / "1° pos" is the clinic's shorthand for the primary position
    if (n === 1 && j === i + 2 && ['pos', 'position', 'posn'].includes(w(t, j))) return hit(t, i, 3, { k: 'gaze', v: 'primary' })
    if (w(t, j) === 'of' || w(t, j) === 'into') j++
    const g = gazePhrase(t, j)
    if (g && g.gaze !== 'primary' && j > i + 1) return hit(t, i, j - i + g.len, { k: 'gaze', v: g.gaze, degrees: n })
    return null
  }
  const g = gazePhrase(t, i)
  if (!g) return null
  // "downgaze (20°)" or "downgaze 20°:"
  let j = i + g.len
  let degrees: number | undefined
  const open = w(t, j) === '(' ? 1 : 0
  const d = numberAt(t, j + open)
  if (d !== null && t[j + open]!.type === 'num') {
    let k = j + open + 1
    if (DEGREE_UNITS.includes(w(t, k))) k++
    if (open ? w(t, k) === ')' : w(t, k) === ':' || w(t, k) === ')') {
      degrees = d
      j = k + (open ? 1 : 0)
    }
  }
  return hit(t, i, j - i, degrees === undefined ? { k: 'gaze', v: g.gaze } : { k: 'gaze', v: g.gaze, degrees })
}

const eye: Rec = (t, i) => {
  const m = longest(t, i, EYE_TABLE)
  if (!m) return null
  // "each eye" / "either eye" say the finding is per eye, never a total
  if (m[1] === 'both' && ['each', 'either'].includes(w(t, i))) return hit(t, i, m[0], { k: 'eye', v: 'both', each: true })
  return hit(t, i, m[0], { k: 'eye', v: m[1] })
}

const isTorsionWord = (x: string): boolean => TORSION_NOUNS.includes(x) || EX_WORDS.has(x) || IN_WORDS.has(x) || x === 'torted'

const NONE_WORDS = ['nil', 'none', 'normal', 'nad', 'zero', 'nothing', 'wnl', 'absent', 'untorted', 'neg', 'negative']

const noTorsion: Rec = (t, i) => {
  const x = w(t, i)
  // "within normal limits", "within normal range", "within normal"
  if (x === 'within' && w(t, i + 1) === 'normal') {
    const j = ['limits', 'limit', 'range', 'values'].includes(w(t, i + 2)) ? i + 3 : i + 2
    return hit(t, i, j - i, { k: 'none' })
  }
  if (NONE_WORDS.includes(x)) {
    // "nil torsion", "zero degrees", "none seen", "none detected"
    let j = i + 1
    if (DEGREE_UNITS.includes(w(t, j)) || TORSION_NOUNS.includes(w(t, j))) j++
    if (NOT_FOUND.has(w(t, j))) j++
    return hit(t, i, j - i, { k: 'none' })
  }
  if (x === 'no' || x === 'not') {
    // "no torsion", "no measurable cyclotorsion", "no significant excyclo", "not torted"
    let j = i + 1
    while (NO_QUALIFIERS.has(w(t, j))) j++
    if (isTorsionWord(w(t, j))) {
      j++
      if (NOT_FOUND.has(w(t, j))) j++
      return hit(t, i, j - i, { k: 'none' })
    }
    // "not detected", "not seen" (after a torsion word or an eye: "torsion not detected")
    if (x === 'not' && NOT_FOUND.has(w(t, i + 1))) return hit(t, i, 2, { k: 'none' })
  }
  if (x === 'neither') {
    // "neither eye torted", "neither eye shows torsion": no torsion in both eyes
    let j = i + 1
    if (['eye', 'eyes'].includes(w(t, j))) j++
    if (['is', 'was', 'shows', 'showed', 'has', 'had'].includes(w(t, j))) j++
    while (NO_QUALIFIERS.has(w(t, j))) j++
    if (j > i + 1 && isTorsionWord(w(t, j))) return hit(t, i, j - i + 1, { k: 'none' })
  }
  return null
}

const number: Rec = (t, i) => {
  let sign = 0
  let j = i
  if ((w(t, j) === '-' || w(t, j) === '+') && t[j + 1]?.type === 'num') {
    sign = w(t, j) === '-' ? -1 : 1
    j++
  }
  const n = numberAt(t, j)
  if (n === null) return null
  j++
  if (DEGREE_UNITS.includes(w(t, j))) j++
  // "7-8°", "7 to 8 degrees": a range stays a range, never two findings
  if ((w(t, j) === '-' || w(t, j) === 'to') && t[j + 1]?.type === 'num') {
    const m = numberAt(t, j + 1)!
    let k = j + 2
    if (DEGREE_UNITS.includes(w(t, k))) k++
    return hit(t, i, k - i, { k: 'range', from: sign < 0 ? -n : n, to: m })
  }
  return hit(t, i, j - i, { k: 'num', v: sign < 0 ? -n : n, signed: sign !== 0 })
}

const direction: Rec = (t, i) => {
  const x = w(t, i)
  if (EX_WORDS.has(x)) return hit(t, i, 1, { k: 'dir', v: 'excyclo' })
  if (IN_WORDS.has(x) || x === 'inc') return hit(t, i, 1, { k: 'dir', v: 'incyclo' })
  if (x === 'in' && AFTER_IN.has(w(t, i + 1))) return hit(t, i, 2, { k: 'dir', v: 'incyclo' })
  if (x === 'ex' && AFTER_IN.has(w(t, i + 1))) return hit(t, i, 2, { k: 'dir', v: 'excyclo' })
  if (x === 'in') {
    // "in" is a preposition before a position of gaze, a distance or "the"
    const next = i + 1
    const n = w(t, next)
    if (['the', 'a', 'an', 'each', 'both', 'either', 'neither', 'this', 'that', 'primary', 'dim', 'dimmed', 'room', 'trial', 'all', 'any', 'every'].includes(n)) {
      return hit(t, i, 1, null)
    }
    if (gaze(t, next) || distance(t, next)) return hit(t, i, 1, null)
    const e = eye(t, next)
    // "OD 3 in OS 6 ex": the next eye's finding names its direction, so this "in" is one too
    if (e && numberAt(t, next + e.len) !== null) {
      let k = next + e.len + 1
      if (DEGREE_UNITS.includes(w(t, k))) k++
      if (EX_WORDS.has(w(t, k)) || IN_WORDS.has(w(t, k))) return hit(t, i, 1, { k: 'dir', v: 'incyclo' })
    }
    return hit(t, i, 1, { k: 'in', beforeEye: e !== null })
  }
  return null
}

const totalWord: Rec = (t, i) => {
  const x = w(t, i)
  if (['total', 'tot', 'overall', 'combined', 'sum', 'net', 'summed'].includes(x)) return hit(t, i, 1, { k: 'total' })
  if (x === 'each' || x === 'respectively') return hit(t, i, 1, { k: 'each' })
  return null
}

const filler: Rec = (t, i) => (FILLERS.has(w(t, i)) ? hit(t, i, 1, null) : null)

/** Recognisers in priority order: longer, more specific phrases first. */
const RECOGNISERS: Rec[] = [
  separator,
  // a reason phrase may start like "not done" ("could not see both lines"): the longer reading wins
  reason,
  notDone,
  test,
  prism,
  deviationNote,
  dialNote,
  note,
  distance,
  gaze,
  noTorsion,
  eye,
  number,
  direction,
  totalWord,
  filler,
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
