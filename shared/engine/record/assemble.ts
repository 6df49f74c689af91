// Third pass of the record parser: put the recognised words together into
// findings per eye and per position of gaze. Whenever two readings are possible
// the parser reports a problem instead of choosing one.

import type { Eye } from '../types'
import type { GazeSection, RecordProblem } from './types'
import { clauseText, clausesAndGazes, readClause } from './clauses'
import type { Item, Tok } from './clauses'
import { attachOwnerless, finishSection, hasAmounts, newSection, putEye, same } from './sections'
import type { SectionBuilder } from './sections'
import { eyeMajorToGazeMajor, globals } from './globals'
import type { Globals } from './globals'

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
