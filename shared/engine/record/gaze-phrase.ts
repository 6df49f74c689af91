// Positions of gaze as clinicians write them ("down and right", "right gaze",
// "looking up", "dextroversion"): one phrase read from a position in the tokens.

import type { Gaze } from '../types'
import type { RawToken } from './raw'
import { longest, numberAt, wordAt } from './matching'
import { EX_WORDS, IN_WORDS } from './word-tables'

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
export function gazePhrase(t: RawToken[], i: number): { len: number, gaze: Gaze } | null {
  const p = longest(t, i, PRIMARY)
  if (p) return { len: p[0], gaze: 'primary' }
  let v: 'up' | 'down' | null = null
  let h: 'right' | 'left' | null = null
  let indicated = false
  let end = i
  for (let j = i; j < t.length; j++) {
    const x = wordAt(t, j)
    const next = wordAt(t, j + 1)
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
      if (!SIDES_AND_LEVELS.has(wordAt(t, j + 1))) break
      if (x === 'to') indicated = true
    }
    else if (x === 'to' && next === 'the' && (RIGHT.includes(wordAt(t, j + 2)) || LEFT.includes(wordAt(t, j + 2)))) {
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
