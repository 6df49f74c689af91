// Record parser, third pass: one section per position of gaze, built up eye by
// eye. Two different findings for one eye in one section are a problem, never a choice.

import type { Eye } from '../types'
import type { EyeRecord, GazeSection, RecordProblem } from './types'
import type { Owner } from './clauses'

export const same = (a: EyeRecord, b: EyeRecord): boolean => a.amount === b.amount && a.direction === b.direction

export interface SectionBuilder extends GazeSection {
  hasFindings: boolean
  lastOwner: Owner
  noneForBoth: boolean
  /** The one eye the previous position of gaze recorded: "LE 4° ex primary, 7° ex downgaze" names it once. */
  carryEye?: Eye
}

export function newSection(previous?: SectionBuilder): SectionBuilder {
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

export function putEye(s: SectionBuilder, eye: Eye, rec: EyeRecord, problems: RecordProblem[], text: string) {
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

/** "RE 8°, excyclo" — a clause with no eye fills what the previous eye lacks; otherwise it is unplaced. */
export function attachOwnerless(s: SectionBuilder, rec: EyeRecord, problems: RecordProblem[], text: string) {
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

export function hasAmounts(s: GazeSection): boolean {
  return [s.eyes.RE, s.eyes.LE, s.total].some(r => r && r.amount !== null && r.amount > 0)
}

export function finishSection(s: SectionBuilder, problems: RecordProblem[]): GazeSection {
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
