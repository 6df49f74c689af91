// Record parser, third pass: what a record says once for all its sections (the
// test, the distance, prisms, notes, a reason the test was not done), and the
// rewrite of an eye-major record ("RE: up 4 ex, down nil") into gaze-major order.

import type { Distance, Prism } from '../types'
import type { NotPerformedReason, RecordProblem, TestName } from './types'
import { CONTENT } from './clauses'
import type { Tok } from './clauses'

export interface Globals {
  test: TestName | null
  distance: Distance | null
  prisms: Prism[]
  notes: string[]
  unread: string[]
  notPerformed: { reasons: NotPerformedReason[] } | null
}

export function globals(tokens: Tok[], problems: RecordProblem[]): Globals {
  const tests = new Set<TestName>()
  const distances = new Set<Distance>()
  const prisms: Prism[] = []
  const notes: string[] = []
  const unread: string[] = []
  const reasons = new Set<NotPerformedReason>()
  let notDone = false
  for (const t of tokens) {
    if (t.k === 'test') tests.add(t.v)
    else if (t.k === 'dist') distances.add(t.v)
    else if (t.k === 'prism') {
      if (t.eye && t.base) prisms.push({ eye: t.eye, power: t.power, base: t.base })
      else notes.push(t.text)
    }
    else if (t.k === 'note') notes.push(t.text)
    else if (t.k === 'unread') unread.push(t.text)
    else if (t.k === 'notdone') notDone = true
    else if (t.k === 'reason') reasons.add(t.v)
  }
  // a generic "Maddox rod" is compatible with either specific test
  const specific = [...tests].filter(x => x !== 'maddox-rod')
  let test: TestName | null = null
  if (specific.length > 1) {
    problems.push({ code: 'two-tests', message: 'The record names both the double and the single Maddox rod test.' })
  }
  else {
    test = specific[0] ?? (tests.has('maddox-rod') ? 'maddox-rod' : null)
  }
  let distance: Distance | null = null
  if (distances.size > 1) {
    problems.push({ code: 'two-distances', message: 'The record names both near and distance fixation.' })
  }
  else {
    distance = [...distances][0] ?? null
  }
  const notPerformed = notDone || reasons.size > 0 ? { reasons: reasons.size > 0 ? [...reasons] : (['unstated'] as NotPerformedReason[]) } : null
  return { test, distance, prisms, notes, unread, notPerformed }
}

/**
 * "RE: PP 4 ex, DG 9 ex / LE: PP 0, DG 0" — eye headings with the positions of gaze under
 * them. Rewritten position by position ("PP: RE 4 ex, LE 0 / DG: RE 9 ex, LE 0") so the
 * rest of the assembler reads one layout. An eye with findings but no position under it
 * ("LE no torsion in any position") gives them for every position.
 */
export function eyeMajorToGazeMajor(tokens: Tok[]): Tok[] {
  const isEye = (t: Tok | undefined) => t?.k === 'eye' && t.v !== 'both'
  const skipSeps = (i: number) => {
    let j = i
    while (tokens[j] && (tokens[j]!.k === 'sep' || tokens[j]!.k === 'colon')) j++
    return j
  }
  const firstEye = tokens.findIndex(t => isEye(t))
  const firstGaze = tokens.findIndex(t => t.k === 'gaze')
  if (firstEye === -1 || firstGaze === -1 || firstGaze < firstEye) return tokens
  const eyeAt = tokens.flatMap((t, i) => (isEye(t) ? [i] : []))
  type GazeTok = Extract<Tok, { k: 'gaze' }>
  interface Block { eye: Tok, lead: Tok[], byGaze: Array<{ gaze: GazeTok, toks: Tok[] }> }
  const blocks: Block[] = []
  for (const [k, at] of eyeAt.entries()) {
    const body = tokens.slice(at + 1, eyeAt[k + 1] ?? tokens.length)
    const block: Block = { eye: tokens[at]!, lead: [], byGaze: [] }
    for (const t of body) {
      if (t.k === 'gaze') block.byGaze.push({ gaze: t, toks: [] })
      else if (block.byGaze.length) block.byGaze.at(-1)!.toks.push(t)
      else block.lead.push(t)
    }
    blocks.push(block)
  }
  const content = (ts: Tok[]) => ts.some(t => CONTENT.has(t.k))
  // only the heading layout: each eye straight followed by its first position, or with no position at all
  const headed = blocks.filter(b => b.byGaze.length > 0)
  if (headed.length === 0) return tokens
  for (const [k, b] of blocks.entries()) {
    if (b.byGaze.length === 0) continue
    if (tokens[skipSeps(eyeAt[k]! + 1)]?.k !== 'gaze' || content(b.lead)) return tokens
  }
  const sep = (text: string): Tok => ({ k: 'sep', and: false, text })
  const gazes: GazeTok[] = []
  for (const b of headed) {
    for (const g of b.byGaze) {
      if (!gazes.some(x => x.v === g.gaze.v)) gazes.push(g.gaze)
    }
  }
  const out: Tok[] = tokens.slice(0, firstEye)
  for (const g of gazes) {
    out.push(sep(';'), g, sep(':'))
    for (const b of blocks) {
      const toks = b.byGaze.length
        ? b.byGaze.filter(x => x.gaze.v === g.v).flatMap(x => x.toks)
        : b.lead
      const findings = toks.filter(t => t.k !== 'sep' && t.k !== 'colon')
      if (!content(findings)) continue
      out.push(b.eye, ...findings, sep(','))
    }
  }
  return out
}
