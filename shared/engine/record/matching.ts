// Phrase matching for the record parser's recognisers (lexicon.ts): what a
// recogniser reads (Sem), how many tokens it used (Hit), and matching a phrase
// table from a position, longest phrase first.

import type { Direction, Distance, Eye, Gaze, PrismBase } from '../types'
import type { NotPerformedReason, TestName } from './types'
import type { RawToken } from './raw'
import { NUMBER_WORDS } from './word-tables'

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

export type Recogniser = (t: RawToken[], i: number) => Hit | null

export const wordAt = (t: RawToken[], i: number): string => t[i]?.text ?? ''
export const hit = (t: RawToken[], i: number, len: number, sem: Sem | null): Hit => ({
  sem,
  len,
  text: t.slice(i, i + len).map(x => x.text).join(' '),
})

/** Match a phrase of words (each slot a set of alternatives) from position i. */
export function phrase(t: RawToken[], i: number, slots: ReadonlyArray<readonly string[] | string>): number {
  let j = i
  for (const slot of slots) {
    const x = wordAt(t, j)
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
export function longest<T>(t: RawToken[], i: number, table: Table<T>): [number, T] | null {
  let best: [number, T] | null = null
  for (const [slots, value] of byFirstWord(table).get(wordAt(t, i)) ?? []) {
    const n = phrase(t, i, slots)
    if (n > 0 && (!best || n > best[0])) best = [n, value]
  }
  return best
}

export function numberAt(t: RawToken[], i: number): number | null {
  const x = t[i]
  if (!x) return null
  if (x.type === 'num' && !x.text.includes('/')) return Number(x.text)
  if (x.type === 'word' && x.text in NUMBER_WORDS) return NUMBER_WORDS[x.text]!
  return null
}
