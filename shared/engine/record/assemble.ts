// Third pass of the record parser: put the recognised words together into
// findings per eye and per position of gaze. Whenever two readings are possible
// the parser reports a problem instead of choosing one.

import type { Distance, Eye, Gaze, Prism } from '../types'
import type { Sem } from './matching'
import type { EyeRecord, GazeSection, NotPerformedReason, RecordProblem, TestName } from './types'

type Tok = Sem & { text: string }
type Owner = Eye | 'both' | 'total' | null

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

type Item = { kind: 'clause', clause: Clause } | { kind: 'gaze', gaze: Gaze, degrees?: number, at: number, text: string }

const CONTENT = new Set(['num', 'range', 'dir', 'in', 'none'])
const isOwner = (t: Tok): boolean => t.k === 'eye' || t.k === 'total'
const ownerOf = (t: Tok): Owner => (t.k === 'eye' ? t.v : t.k === 'total' ? 'total' : null)
const clauseText = (c: Clause): string => c.toks.map(t => t.text).join(' ')

/** Split the stream at separators and cut each chunk into clauses, one per eye (or total). */
function clausesAndGazes(tokens: Tok[]): Item[] {
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
function readClause(c: Clause, problems: RecordProblem[], eye?: Eye): EyeRecord | null {
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

const same = (a: EyeRecord, b: EyeRecord): boolean => a.amount === b.amount && a.direction === b.direction

interface SectionBuilder extends GazeSection {
  hasFindings: boolean
  lastOwner: Owner
  noneForBoth: boolean
  /** The one eye the previous position of gaze recorded: "LE 4° ex primary, 7° ex downgaze" names it once. */
  carryEye?: Eye
}

function newSection(previous?: SectionBuilder): SectionBuilder {
  const s: SectionBuilder = { gaze: null, eyes: {}, hasFindings: false, lastOwner: null, noneForBoth: false }
  if (previous && !previous.total) {
    // the eye written once: the only eye named, or the only eye given torsion ("RE nil. LE 4 ex …")
    const named = (['RE', 'LE'] as const).filter(e => previous.eyes[e])
    const torted = named.filter((e) => {
      const r = previous.eyes[e]!
      return r.direction === 'excyclo' || r.direction === 'incyclo' || (r.direction === null && (r.amount ?? 0) > 0)
    })
    if (torted.length === 1) s.carryEye = torted[0]
    else if (named.length === 1) s.carryEye = named[0]
    else if (named.length === 0 && previous.carryEye) s.carryEye = previous.carryEye
  }
  return s
}

function putEye(s: SectionBuilder, eye: Eye, rec: EyeRecord, problems: RecordProblem[], text: string) {
  const prev = s.eyes[eye]
  if (prev && (prev.amount !== null || prev.direction !== null) && !same(prev, rec)) {
    problems.push({ code: 'eye-twice', eye, text, message: `The ${eye === 'RE' ? 'right' : 'left'} eye is given two different findings.` })
    s.eyes[eye] = { amount: null, direction: null }
  }
  else {
    s.eyes[eye] = rec
  }
  s.hasFindings = true
  s.lastOwner = eye
}

export interface Globals {
  test: TestName | null
  distance: Distance | null
  prisms: Prism[]
  notes: string[]
  unread: string[]
  notPerformed: { reasons: NotPerformedReason[] } | null
}

function globals(tokens: Tok[], problems: RecordProblem[]): Globals {
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
function eyeMajorToGazeMajor(tokens: Tok[]): Tok[] {
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

export function assemble(tokens: Tok[]): { sections: GazeSection[], globals: Globals, problems: RecordProblem[] } {
  const problems: RecordProblem[] = []
  const g = globals(tokens, problems)
  const items = clausesAndGazes(eyeMajorToGazeMajor(tokens))
  const firstGaze = items.findIndex(x => x.kind === 'gaze')
  const firstFinding = items.findIndex(x => x.kind === 'clause')
  const gazeFirst = firstGaze !== -1 && (firstFinding === -1 || firstGaze < firstFinding)

  const sections: SectionBuilder[] = [newSection()]
  let current = sections[0]!
  let closed = false // gaze-last style: the current section already has its gaze
  let pending: Eye[] = []

  const setGaze = (item: Extract<Item, { kind: 'gaze' }>) => {
    if (current.gaze !== null && current.gaze !== item.gaze) {
      problems.push({ code: 'two-gazes', text: item.text, message: `Two positions of gaze given together ("${item.text}").` })
      current.gaze = null
      return
    }
    current.gaze = item.gaze
    if (item.degrees !== undefined) current.gazeDegrees = item.degrees
  }

  for (const item of items) {
    if (item.kind === 'gaze') {
      if (gazeFirst) {
        if (current.hasFindings) {
          current = newSection(current)
          sections.push(current)
        }
        setGaze(item)
      }
      else if (closed && !current.hasFindings) {
        setGaze(item)
      }
      else {
        if (closed) {
          current = newSection(current)
          sections.push(current)
        }
        setGaze(item)
        closed = true
      }
      continue
    }
    const c = item.clause
    const ownerlessFinding = c.owner === null && c.toks.some(t => t.k === 'num' || t.k === 'range')
    if (!gazeFirst && closed && (c.owner !== null || ownerlessFinding)) {
      // findings after a closing position of gaze start the next section —
      // unless no further position of gaze follows, then they belong to the last one
      const moreGazes = items.slice(items.indexOf(item)).some(x => x.kind === 'gaze')
      if (moreGazes) {
        current = newSection(current)
        sections.push(current)
        closed = false
      }
    }
    const eyeHint = c.owner === 'RE' || c.owner === 'LE' ? c.owner : undefined
    const rec = readClause(c, problems, eyeHint)
    const text = clauseText(c) || (c.owner ?? '')
    if (c.owner === 'RE' || c.owner === 'LE') {
      if (rec === null) {
        if (c.emptyBeforeOwner) {
          problems.push({ code: 'unclear-eye', eye: c.owner, text, message: `"${c.owner}" is followed straight by another eye: say each eye's finding.` })
          continue
        }
        if (c.andFollows) pending.push(c.owner)
        else if (!current.eyes[c.owner]) {
          current.eyes[c.owner] = { amount: null, direction: null }
          current.lastOwner = c.owner
        }
        continue
      }
      putEye(current, c.owner, rec, problems, text)
      for (const p of pending) putEye(current, p, rec, problems, text)
      pending = []
    }
    else if (c.owner === 'both') {
      if (rec === null) {
        if (c.andFollows) pending.push('RE', 'LE')
        continue
      }
      if (rec.direction === 'none' || c.each) {
        putEye(current, 'RE', rec, problems, text)
        putEye(current, 'LE', rec, problems, text)
      }
      else {
        problems.push({
          code: 'both-eyes-amount',
          text,
          message: `"both eyes ${text}": is that each eye or the total? Write each eye, or "total".`,
        })
      }
    }
    else if (c.owner === 'total') {
      if (rec === null) continue
      if (current.total && !same(current.total, rec)) {
        problems.push({ code: 'unclear-total', text, message: 'Two different totals are given.' })
        current.total = { amount: null, direction: null }
      }
      else {
        current.total = rec
      }
      current.hasFindings = true
      current.lastOwner = 'total'
    }
    else if (rec !== null) {
      attachOwnerless(current, rec, problems, clauseText(c))
    }
  }
  for (const p of pending) {
    if (!current.eyes[p]) current.eyes[p] = { amount: null, direction: null }
  }

  const out: GazeSection[] = sections
    .filter((s, i) => i === 0 || s.hasFindings || s.gaze !== null)
    .map(s => finishSection(s, problems))
  if (g.notPerformed && out.some(s => hasAmounts(s))) {
    problems.push({
      code: 'not-performed-with-findings',
      message: 'The record says the test was not performed but also gives torsion findings.',
    })
  }
  return { sections: out, globals: g, problems }
}

/** "RE 8°, excyclo" — a clause with no eye fills what the previous eye lacks; otherwise it is unplaced. */
function attachOwnerless(s: SectionBuilder, rec: EyeRecord, problems: RecordProblem[], text: string) {
  const last = s.lastOwner
  const prev = last === 'RE' || last === 'LE' ? s.eyes[last] : last === 'total' ? s.total : undefined
  if (prev) {
    const fillsAmount = prev.amount === null && rec.amount !== null && (rec.direction === null || prev.direction === null)
    const fillsDirection = prev.direction === null && rec.direction !== null && rec.amount === null
    if (fillsAmount || fillsDirection) {
      if (rec.amount !== null) prev.amount = rec.amount
      if (rec.direction !== null) prev.direction = rec.direction
      return
    }
  }
  if (last === null && s.carryEye && !s.eyes.RE && !s.eyes.LE && !s.total) {
    putEye(s, s.carryEye, rec, problems, text)
    return
  }
  if (rec.direction === 'none' && !s.hasFindings) {
    s.noneForBoth = true
    return
  }
  s.unplaced = [...(s.unplaced ?? []), rec]
  problems.push({
    code: 'amount-without-eye',
    text,
    message: `"${text}" does not say which eye (or "total") it belongs to.`,
  })
}

function hasAmounts(s: GazeSection): boolean {
  return [s.eyes.RE, s.eyes.LE, s.total].some(r => r && r.amount !== null && r.amount > 0)
}

function finishSection(s: SectionBuilder, problems: RecordProblem[]): GazeSection {
  if (s.noneForBoth) {
    if (s.eyes.RE || s.eyes.LE || s.total) {
      problems.push({ code: 'amount-without-eye', text: 'nil', message: '"No torsion" is written without an eye beside other findings.' })
    }
    else {
      s.eyes.RE = { amount: 0, direction: 'none' }
      s.eyes.LE = { amount: 0, direction: 'none' }
    }
  }
  const out: GazeSection = { gaze: s.gaze, eyes: s.eyes }
  if (s.unplaced) out.unplaced = s.unplaced
  if (s.gazeDegrees !== undefined) out.gazeDegrees = s.gazeDegrees
  if (s.total) out.total = s.total
  return out
}
