// Misspellings one or two letters off a word the record parser knows are read as
// that word, and said so in "read as". Only words nothing else could read are
// tried, only against the trade's longer words, and never when two readings with
// different meanings are equally close: the parser still declines to guess.

import damerauLevenshtein from 'damerau-levenshtein'
import { EX_WORDS, IN_WORDS } from './word-tables'
import type { RawToken } from './raw'

export interface SpellingCorrection {
  /** The word as written (lower-cased). */
  written: string
  /** The word it was read as. */
  readAs: string
}

/** Words of the trade a misspelling may be read as, grouped by what they mean. */
const TARGETS: ReadonlyArray<readonly [string, string]> = [
  ...[...EX_WORDS].filter(x => x.length >= 7).map(x => [x, 'excyclo'] as const),
  ...[...IN_WORDS].filter(x => x.length >= 7).map(x => [x, 'incyclo'] as const),
  ...['torsion', 'cyclotorsion', 'downgaze', 'upgaze', 'primary', 'position', 'maddox', 'double', 'suppression']
    .map(x => [x, x] as const),
]

/** Everyday words close to a trade word that must keep their own meaning (and stay unread). */
const REAL_WORDS = new Set([
  'extension', 'extensions', 'export', 'exports', 'exported', 'expert', 'expected', 'extended', 'exerted', 'exertion',
  'excursion', 'excursions', 'exclusion', 'inclusion', 'intrusion', 'extrusion', 'insertion', 'inversion', 'intention',
  'intended', 'inverted', 'inserted', 'invented', 'instead', 'interior', 'exterior', 'inclined', 'incision', 'excision',
  'distorted', 'contorted', 'distortion', 'contortion', 'intact', 'intake', 'effort', 'escort', 'import', 'imported',
  'insert', 'invert', 'intent', 'extract', 'exact', 'inner', 'incline', 'portion', 'motion', 'notion', 'potion',
  'version', 'torsions', 'primarily', 'privacy', 'positive', 'positions', 'trouble', 'doubled', 'doubles',
  'extortions', 'situation', 'rotation', 'station', 'toxin', 'expression', 'session', 'tension', 'torpor',
])

const MIN_LENGTH = 5

/** How many letters off a word may be: one for short words, two from seven letters. */
export const allowedEdits = (word: string): number => (word.length >= 7 ? 2 : 1)

const DIRECTIONS = ['excyclo', 'incyclo']
const sharedStart = (a: string, b: string): number => {
  let n = 0
  while (n < a.length && a[n] === b[n]) n++
  return n
}

export type SpellingReading = { kind: 'read', target: string } | { kind: 'unclear', meanings: string[] } | null

/**
 * What a misspelt word is read as: the nearest trade word within the allowed edits.
 * Between a direction and another word equally near, the one the word starts like wins
 * ("exclotorsion" is excyclotorsion, not cyclotorsion); between excyclo and incyclo
 * equally near there is no reading ("encyclo"), and the record says so.
 */
export function readMisspelling(word: string): SpellingReading {
  if (word.length < MIN_LENGTH || !/^[a-z]+$/.test(word) || REAL_WORDS.has(word)) return null
  const limit = allowedEdits(word)
  const near: Array<{ target: string, meaning: string, steps: number }> = []
  for (const [target, meaning] of TARGETS) {
    if (Math.abs(target.length - word.length) > limit) continue
    const steps = damerauLevenshtein(word, target).steps
    if (steps === 0 || steps > limit) continue
    near.push({ target, meaning, steps })
  }
  if (near.length === 0) return null
  const fewest = Math.min(...near.map(x => x.steps))
  const closest = near.filter(x => x.steps === fewest)
  const meanings = [...new Set(closest.map(x => x.meaning))]
  if (meanings.length === 1) return { kind: 'read', target: closest[0]!.target }
  const directions = meanings.filter(m => DIRECTIONS.includes(m))
  if (directions.length > 1) return { kind: 'unclear', meanings: directions }
  const byStart = [...closest].sort((a, b) => sharedStart(word, b.target) - sharedStart(word, a.target))
  if (sharedStart(word, byStart[0]!.target) === sharedStart(word, byStart[1]!.target)) return { kind: 'unclear', meanings }
  return { kind: 'read', target: byStart[0]!.target }
}

/** Replace the tokens at `unread` that are misspellings of trade words; report each replacement. */
export function correctSpellings(tokens: RawToken[], unread: number[]): { tokens: RawToken[], corrections: SpellingCorrection[], unclear: Array<{ written: string, meanings: string[] }> } {
  const corrections: SpellingCorrection[] = []
  const unclear: Array<{ written: string, meanings: string[] }> = []
  const out = tokens.slice()
  for (const i of unread) {
    const t = tokens[i]
    if (!t || t.type !== 'word') continue
    const reading = readMisspelling(t.text)
    if (reading === null) continue
    if (reading.kind === 'unclear') {
      unclear.push({ written: t.text, meanings: reading.meanings })
      continue
    }
    out[i] = { ...t, text: reading.target }
    corrections.push({ written: t.text, readAs: reading.target })
  }
  return { tokens: out, corrections, unclear }
}
