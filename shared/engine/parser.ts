// The record parser (domain.md §5.1): free text → test, fixation distance,
// position of gaze, amount and direction per eye, plus what could not be read.
// The same function powers the live "read as" on the record pad and the grader.

import { assemble } from './record/assemble'
import { lex } from './record/lexicon'
import { rawTokens } from './record/raw'
import { correctSpellings } from './record/spelling'
import type { ParsedRecord } from './record/types'

export type { SpellingCorrection } from './record/spelling'
export type { EyeRecord, GazeSection, NotPerformedReason, ParsedRecord, ProblemCode, RecordProblem, TestName } from './record/types'
export { PROBLEM_CODES } from './record/types'
export { GAZE_LABEL, formatEyeRecord, gazeLabel, readAsLine } from './record/format'

/** Longest record the parser reads; longer text is cut (and reported as unread). */
export const MAX_RECORD_LENGTH = 2000

export function parseRecord(text: string): ParsedRecord {
  const input = text.slice(0, MAX_RECORD_LENGTH)
  if (input.trim() === '') {
    return {
      test: null,
      distance: null,
      gaze: null,
      eyes: {},
      sections: [{ gaze: null, eyes: {} }],
      notPerformed: null,
      prisms: [],
      notes: [],
      unread: [],
      problems: [{ code: 'nothing-recorded', message: 'Nothing is written yet.' }],
      spelling: [],
    }
  }
  // a word nothing could read may be a misspelling of one of the trade's words: read it as that word, once
  const raw = rawTokens(input)
  let sems = lex(raw)
  const unreadAt = sems.flatMap(x => (x.k === 'unread' && x.at !== undefined ? [x.at] : []))
  const { tokens, corrections, unclear } = correctSpellings(raw, unreadAt)
  if (corrections.length > 0) sems = lex(tokens)
  const { sections, globals, problems } = assemble(sems)
  for (const u of unclear) {
    problems.push({ code: 'unclear-spelling', text: u.written, message: `"${u.written}" is as close to ${u.meanings.join(' as to ')}: write the word out.` })
  }
  const first = sections[0]!
  const unread = [...globals.unread]
  if (text.length > MAX_RECORD_LENGTH) unread.push(text.slice(MAX_RECORD_LENGTH, MAX_RECORD_LENGTH + 40))
  const out: ParsedRecord = {
    test: globals.test,
    distance: globals.distance,
    gaze: first.gaze,
    eyes: first.eyes,
    sections,
    notPerformed: globals.notPerformed,
    prisms: globals.prisms,
    notes: globals.notes,
    unread,
    problems,
    spelling: corrections,
  }
  if (first.gazeDegrees !== undefined) out.gazeDegrees = first.gazeDegrees
  if (first.total) out.total = first.total
  return out
}
