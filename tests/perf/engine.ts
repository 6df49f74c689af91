// In-process benchmark of the torsion engine: generate 100,000 cases and grade
// 100,000 written records (the record checker's path and a full attempt).
import { gradeAttempt, gradeKnownFinding } from '~~/server/lib/engine/attempt'
import { generateCase } from '~~/server/lib/engine/generator'
import { CASE_TEMPLATES } from '~~/server/lib/engine/templates'
import { toPresentation } from '~~/server/lib/engine/presentation'
import { parseRecord } from '#shared/engine/parser'
import type { OpStats } from './stats'
import { timeOps } from './stats'

// A spread of written records, correct and slipped, in the phrasings tutors meet.
const RECORDS = [
  'DMR, near, primary position: RE 8° excyclotorsion, LE no torsion.',
  'DMR N PP: R 10 ex, L nil',
  'dmr near pp re 10 excyclo le 0',
  'Double Maddox rod at 33 cm, primary position. Left eye 7 degrees incyclotorted; right eye nil.',
  'DMR N PP: RE 100° excyclo, LE nil',
  'near primary: RE 8 in, LE 90',
  'OD 8 deg extorsion',
  'DMR N: RE 6 ex, LE nil',
  'DMR near downgaze: RE 12 ex; LE 3 ex (total 15° excyclo)',
  'DMR not performed: sees one streak only — suppression',
]
const FINDINGS = [{ RE: 8, LE: 0 }, { RE: 10, LE: 0 }, { RE: 0, LE: -7 }, { RE: -5, LE: 0 }, { RE: 9, LE: 7 }]

export function engineBench(count = 100_000): OpStats[] {
  const templates = CASE_TEMPLATES
  const generate = timeOps('generate a case (generateCase)', count, 1000, i => generateCase(templates[i % templates.length]!, `bench-${i}`))
  // cases for the grading runs, made once
  const cases = Array.from({ length: 500 }, (_, i) => generateCase(templates[i % templates.length]!, `grade-${i}`))
  const present = timeOps('present a case (toPresentation)', count, 1000, i => toPresentation(cases[i % cases.length]!, i % 2 ? 'patient-turns' : 'learner-turns'))
  const parse = timeOps('parse a record (parseRecord)', count, 1000, i => parseRecord(RECORDS[i % RECORDS.length]!))
  const check = timeOps('grade a record against a finding (record checker)', count, 1000, i =>
    gradeKnownFinding({ torsion: FINDINGS[i % FINDINGS.length]!, gaze: 'primary', distance: 'near', readings: { RE: 98, LE: 90 }, record: RECORDS[i % RECORDS.length]! }))
  const attempt = timeOps('grade an attempt on a case (gradeAttempt)', count, 1000, (i) => {
    const c = cases[i % cases.length]!
    return gradeAttempt(c, { gaze: 'primary', distance: 'near', readings: { RE: 96, LE: 88 }, record: RECORDS[i % RECORDS.length]! }, { mode: i % 2 ? 'patient-turns' : 'learner-turns', trial: 1 })
  })
  return [generate, present, parse, check, attempt]
}
