// Record parser, third pass, first step: cut the recognised words into clauses
// (an owner — an eye, both eyes or the total — and what was said of it) and
// position-of-gaze headings, then read each clause as one eye's finding.

import type { Eye, Gaze } from '../types'
import type { Sem } from './matching'
import type { EyeRecord, RecordProblem } from './types'

export type Tok = Sem & { text: string }
export type Owner = Eye | 'both' | 'total' | null

interface Clause {
  owner: Owner
  toks: Tok[]
  /** Index in the token stream, for ordering against positions of gaze. */
  at: number
  /** Separator before the next chunk was "and". */
  andFollows: boolean
  eyeLast: boolean
  each: boolean
  /** Eye-first clause with nothing in it, straight before another eye ("RE LE 5 ex"). */
  emptyBeforeOwner?: boolean
}

export type Item = { kind: 'clause', clause: Clause } | { kind: 'gaze', gaze: Gaze, degrees?: number, at: number, text: string }

export const CONTENT = new Set(['num', 'range', 'dir', 'in', 'none'])
const isOwner = (t: Tok): boolean => t.k === 'eye' || t.k === 'total'
const ownerOf = (t: Tok): Owner => (t.k === 'eye' ? t.v : t.k === 'total' ? 'total' : null)
export const clauseText = (c: Clause): string => c.toks.map(t => t.text).join(' ')

/** Split the stream at separators and cut each chunk into clauses, one per eye (or total). */
export function clausesAndGazes(tokens: Tok[]): Item[] {
  const items: Item[] = []
  let chunk: Array<{ t: Tok, at: number }> = []
  const flush = (andFollows: boolean) => {
    const relevant = chunk.filter(({ t }) => isOwner(t) || CONTENT.has(t.k) || t.k === 'each')
    for (const { t, at } of chunk) {
      if (t.k === 'gaze') items.push({ kind: 'gaze', gaze: t.v, degrees: t.degrees, at, text: t.text })
    }
    if (relevant.length > 0) {
      const each = relevant.some(({ t }) => t.k === 'each' || (t.k === 'eye' && t.each === true))
      const rel = relevant.filter(({ t }) => t.k !== 'each')
      const owners = rel.map((x, idx) => ({ ...x, idx })).filter(({ t }) => isOwner(t))
      if (owners.length === 0) {
        items.push({ kind: 'clause', clause: { owner: null, toks: rel.map(x => x.t), at: rel[0]?.at ?? 0, andFollows, eyeLast: false, each } })
      }
      else {
        const eyeFirst = owners[0]!.idx === 0
        owners.forEach((o, k) => {
          const from = eyeFirst ? o.idx + 1 : k === 0 ? 0 : owners[k - 1]!.idx + 1
          const to = eyeFirst ? (owners[k + 1]?.idx ?? rel.length) : o.idx
          items.push({
            kind: 'clause',
            clause: {
              owner: ownerOf(o.t),
              toks: rel.slice(from, to).map(x => x.t),
              at: o.at,
              andFollows: andFollows && k === owners.length - 1,
              eyeLast: !eyeFirst,
              each,
              emptyBeforeOwner: eyeFirst && from === to && k < owners.length - 1,
            },
          })
        })
        if (!eyeFirst) {
          const rest = rel.slice(owners[owners.length - 1]!.idx + 1)
          if (rest.length > 0) {
            items.push({ kind: 'clause', clause: { owner: null, toks: rest.map(x => x.t), at: rest[0]!.at, andFollows, eyeLast: false, each } })
          }
        }
      }
    }
    chunk = []
  }
  tokens.forEach((t, at) => {
    if (t.k === 'sep') flush(t.and)
    else chunk.push({ t, at })
  })
  flush(false)
  items.sort((a, b) => (a.kind === 'clause' ? a.clause.at : a.at) - (b.kind === 'clause' ? b.clause.at : b.at))
  return joinHeadings(items)
}

/** "RE: 8° ex", "total: 12 ex" — an eye (or total) on its own, then its finding after the colon. */
function joinHeadings(items: Item[]): Item[] {
  const out: Item[] = []
  for (const item of items) {
    const prev = out[out.length - 1]
    if (
      item.kind === 'clause'
      && item.clause.owner === null
      && prev?.kind === 'clause'
      && prev.clause.owner !== null
      && prev.clause.toks.length === 0
      && !prev.clause.emptyBeforeOwner
    ) {
      prev.clause.toks = item.clause.toks
      prev.clause.andFollows = item.clause.andFollows
      prev.clause.each ||= item.clause.each
      continue
    }
    out.push(item)
  }
  return out
}

/** Read one clause's amount and direction, or report why it cannot be read. */
export function readClause(c: Clause, problems: RecordProblem[], eye?: Eye): EyeRecord | null {
  const text = clauseText(c)
  const nums = c.toks.filter((t): t is Tok & { k: 'num' } => t.k === 'num')
  const dirs = new Set(c.toks.filter((t): t is Tok & { k: 'dir' } => t.k === 'dir').map(t => t.v))
  const nones = c.toks.some(t => t.k === 'none')
  const ins = c.toks.filter((t): t is Tok & { k: 'in' } => t.k === 'in')
  const ranges = c.toks.filter(t => t.k === 'range')
  if (nums.length === 0 && dirs.size === 0 && !nones && ins.length === 0 && ranges.length === 0) return null
  if (ranges.length > 0) {
    problems.push({ code: 'two-amounts', eye, text, message: `"${text}" gives a range: write the one amount you measured (or the mean of your readings).` })
    return { amount: null, direction: dirs.size === 1 ? [...dirs][0]! : null }
  }

  for (const t of ins) {
    const i = c.toks.indexOf(t)
    const afterAmount = c.toks.slice(0, i).some(x => x.k === 'num')
    if (dirs.size > 0) continue // "8° excyclo in" — the word is not needed
    if (t.beforeEye && c.eyeLast) continue // "8° ex in RE"
    if (afterAmount && !t.beforeEye) {
      dirs.add('incyclo')
      continue
    }
    problems.push({ code: 'ambiguous-in', eye, text, message: `"${text}": "in" could mean incyclo or be a linking word — write "incyclo".` })
    return { amount: nums.length === 1 ? Math.abs(nums[0]!.v) : null, direction: null }
  }

  const amounts = [...new Set(nums.map(n => Math.abs(n.v)))]
  let amount: number | null = null
  if (amounts.length > 1) {
    problems.push({ code: 'two-amounts', eye, text, message: `"${text}" gives more than one amount.` })
  }
  else if (amounts.length === 1) {
    amount = amounts[0]!
  }
  if (nones && amount !== null && amount !== 0) {
    problems.push({ code: 'amount-and-no-torsion', eye, text, message: `"${text}" says both "no torsion" and ${amount}°.` })
    return { amount: null, direction: null }
  }
  if (dirs.size > 1) {
    problems.push({ code: 'two-directions', eye, text, message: `"${text}" says both excyclo and incyclo.` })
    return { amount, direction: null }
  }
  if (nones || amount === 0) return { amount: 0, direction: 'none' }
  const dir = dirs.size === 1 ? [...dirs][0]! : null
  if (dir === null && nums.some(n => n.signed)) {
    problems.push({
      code: 'signed-amount',
      eye,
      text,
      message: `"${text}": a + or − sign is not read as a direction (papers disagree on the sign) — write excyclo or incyclo.`,
    })
  }
  return { amount, direction: dir }
}
