// Issue 11, second independent examiner: records written in styles the first table
// (marking-table.test.ts) does not cover — line breaks, bullets, "R:"/"L:" labels, OD/OS,
// "RE=8 ex", amount-before-eye prose, totals beside per-eye findings, "BE … each", gaze and
// fixation distance named in many ways, prism / head-tilt / cc-sc notes, patients who should
// not be tested, error carried forward from the learner's own (or the patient's) dial
// setting, tolerances 1–5 and truths from 0 to ±20, including just under and just over 1°.
//
// Conventions kept from the first table: slips are sorted `code:eye` strings (`code` alone for a
// slip about no single eye); a slip's eye is the eye whose true finding it concerns; an amount
// with no eye is `eye-missing` with no eye; torsion claimed beyond tolerance on an eye under 1°
// is `amount-off` on that eye with a direction mark below 1; a wrong gaze or distance loses its
// mark with no slip; `eye-wrong`, `direction-reversed`, `dial-value-as-amount` and
// `should-not-test` cap the score at 0.5 (domain.md §5.2).
// Scores: 1 = full marks; 'cap' ≤ 0.5; 'pass' in (0.5, 1); 'lt1' below 1.

import { describe, expect, it } from 'vitest'
import type { Distance, Gaze } from '#shared/engine/types'
import { T, N, D, row, DR, EW, DV, AO, DM, EM, NP, grade, slipKeys, markOf, checkScore } from '../../support/marking-table'
import type { Row } from '../../support/marking-table'

// ---------------------------------------------------------------------------
// 1. Layouts: line breaks, bullets, labels, OD/OS, "=", prose (domain.md §5.1 complete record).
// ---------------------------------------------------------------------------
const LAYOUTS: Row[] = [
  row('DMR N primary\n- RE 8° excyclo\n- LE no torsion', T(8, 0, N), [], 1), // domain.md §5.1 (common practice: bullet list)
  row('DMR, near, primary\n• R: 6° ex\n• L: nil', T(6, 0, N), [], 1), // domain.md §5.1 R/L (common practice: bullets, labels)
  row('DMR N PP\nR: 5 ex\nL: 0', T(5, 0, N), [], 1), // domain.md §5.1 R/L (common practice: "R:" labels)
  row('DMR\nNear\nPrimary position\nRight eye: 7° excyclotorsion\nLeft eye: no torsion', T(7, 0, N), [], 1), // domain.md §5.1 (common practice: one field a line)
  row('DMR N PP: RE=8 ex, LE=0', T(8, 0, N), [], 1), // domain.md §5.1 (common practice: "RE=8 ex")
  row('DMR N PP: RE = 4 in, LE = nil', T(-4, 0, N), [], 1), // domain.md §5.1 (common practice)
  row('DMR near, primary: 8° of excyclotorsion RE, no torsion LE', T(8, 0, N), [], 1), // domain.md §5.1 (common practice: amount before eye)
  row('DMR near, primary position: excyclotorsion of 8 degrees in the right eye; left eye no torsion', T(8, 0, N), [], 1), // domain.md §5.1 (common practice: prose)
  row('DMR N primary: right eye excyclotorted by 8°, left eye not torted', T(8, 0, N), [], 1), // domain.md §5.1 (common practice: prose)
  row('DMR N primary: incyclotorsion of 5° in the left eye, right eye nil', T(0, -5, N), [], 1), // domain.md §5.1 (common practice: prose)
  row('DMR N primary:\nOD: 7° excyclo\nOS: 0°', T(7, 0, N), [], 1), // clinical-facts §9 OD/OS (R75, R76)
  row('dmr n pp od 3 in os 6 ex', T(-3, 6, N), [], 1), // clinical-facts §9 OD/OS (R75, R76), terse lower case
  row('DMR N primary: RE ex 8°, LE nil', T(8, 0, N), [], 1), // domain.md §5.1 (common practice: direction before amount)
  row('DMR N primary: excyclo 6° LE, RE nil', T(0, 6, N), [], 1), // domain.md §5.1 (common practice: eye last)
  row('DMR N primary: RE 8°ex, LE 0°', T(8, 0, N), [], 1), // domain.md §5.1 (common practice: no space)
  row('DMR N primary: RE 8 EXCYCLO, LE NIL', T(8, 0, N), [], 1), // domain.md §5.1 (common practice: capitals)
  row('DMR N primary: LE 5 deg. incyclo, RE nil', T(0, -5, N), [], 1), // domain.md §5.1 "deg" (common practice)
  row('DMR N primary: RE 7.5° excyclotorsion, LE nil', T(7.5, 0, N), [], 1), // domain.md §5.1 (common practice: decimals)
  row('DMR N primary: RE - 8° ex, LE - nil', T(8, 0, N), [], 1), // common practice (dash as separator, not a sign)
  row('Test: DMR. Distance: near. Position: primary. RE: 8 excyclo. LE: nil.', T(8, 0, N), [], 1), // domain.md §5.1 fields (common practice: labelled form)
  row('DMR (N) PP:\n  R: 6° ex\n  L: 2° ex\nTotal: 8° ex', T(6, 2, N), [], 1), // clinical-facts §9 total (common practice)
  row('Double Maddox rod test, near, primary position. R eye 9 ex. L eye nil.', T(9, 0, N), [], 1), // domain.md §5.1 (common practice)
  row('DMR N primary: LE 6° ex (84° on dial), RE nil', T(0, 6, N), [], 1), // ISO 8429:1986 dial; domain.md §3.4 LE t = 90 − a
  row('DMR N primary: RE 8º excyclo, LE nil', T(8, 0, N), [], 1), // common practice ("º" typed for "°")
]

// ---------------------------------------------------------------------------
// 2. Both eyes at once, totals beside per-eye findings (clinical-facts §9, §3.5).
// ---------------------------------------------------------------------------
const BOTH_EYES: Row[] = [
  row('DMR N PP: BE 3 ex each', T(3, 3, N), [], 1), // clinical-facts §9 BE (R75) (common practice)
  row('DMR N PP: both eyes no torsion', T(0.5, -0.4, N), [], 1), // domain.md §5.2 no-torsion band (common practice)
  row('DMR near primary: no torsion either eye', T(0, 0.9, N), [], 1), // domain.md §5.2 no-torsion band (common practice)
  row('DMR N PP: OU no torsion', T(0, 0, N), [], 1), // clinical-facts §9 OU (R75, R76)
  row('DMR N PP: RE 8 ex, LE 2 ex, total 10° excyclo', T(8, 2, N), [], 1), // clinical-facts §3.5 total = RE + LE (common practice)
  row('DMR N downgaze: R 9° ex L 6° ex; total 15° ex', T(9, 6, { gaze: 'down', ...N }), [], 1), // clinical-facts §3.5 (common practice)
  row('DMR N PP: RE 6 ex, LE 2 in (total 4 ex)', T(6, -2, N), [], 1), // clinical-facts §11 check 4: RE 8 ex + LE 2 in → 6 ex (derived)
  row('DMR N PP: BE 4° ex each', T(4, -4, N), [DR('LE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR N PP: no torsion either eye', T(5, 0, N), [AO('RE')], 'lt1', { directionLost: true }), // domain.md §5.2 (first table: "no torsion" on a torted eye is amount-off)
  row('DMR N PP: both eyes no torsion', T(0, -6, N), [AO('LE')], 'lt1', { directionLost: true }), // domain.md §5.2 (first table convention)
  row('DMR N PP: total 12° excyclo', T(6, 6, N), ['eye-missing'], 'lt1'), // domain.md §5.2 an amount with no eye is eye-missing only
  row('DMR N PP: RE 10 ex, LE 10 ex, total 20 ex', T(10, 10, N), [], 1), // domain.md §4 bilateral SO palsy (J Clin Med 2020;9:1829)
]

// ---------------------------------------------------------------------------
// 3. Positions of gaze named in many ways (domain.md §5.1 "20° downgaze" and the like).
// ---------------------------------------------------------------------------
const GAZE_NAMES: Array<[string, Gaze]> = [
  ['primary position', 'primary'], ['PP', 'primary'], ['straight ahead', 'primary'], ['in primary', 'primary'],
  ['in downgaze', 'down'], ['on downgaze', 'down'], ['20° down', 'down'], ['looking down', 'down'], ['DG', 'down'],
  ['reading position', 'down'], ['in down gaze', 'down'], ['20° downgaze', 'down'],
  ['on upgaze', 'up'], ['looking up', 'up'], ['UG', 'up'],
  ['right gaze', 'right'], ['looking left', 'left'], ['dextroversion', 'right'], ['laevoversion', 'left'],
  ['down and left', 'down-left'], ['down and right', 'down-right'], ['up and right', 'up-right'],
]
const GAZES_ROWS: Row[] = GAZE_NAMES.map(([p, gaze], i) =>
  i % 2 === 0
    ? row(`DMR N, ${p}: RE 10° ex, LE nil`, T(10, 0, { gaze, ...N }), [], 1) // domain.md §5.1 positions of gaze, named from the patient's side (common practice)
    : row(`DMR near ${p}\nLE 6 excyclo\nRE 0`, T(0, 6, { gaze, ...N }), [], 1), // domain.md §5.1 positions of gaze (common practice)
)

// ---------------------------------------------------------------------------
// 4. Fixation distance named in many ways (domain.md §5.1, clinical-facts §9 R9, R76).
// ---------------------------------------------------------------------------
const DISTANCE_NAMES: Array<[string, Distance]> = [
  ['N', 'near'], ['near', 'near'], ['1/3 m', 'near'], ['33 cm', 'near'], ['33cm', 'near'], ['1/3m', 'near'],
  ['D', 'distance'], ['6 m', 'distance'], ['6m', 'distance'], ['distance', 'distance'],
]
const DISTANCES_ROWS: Row[] = DISTANCE_NAMES.map(([d, distance], i) =>
  i % 2 === 0
    ? row(`DMR ${d} primary: RE 5° ex, LE nil`, T(5, 0, { distance }), [], 1) // domain.md §5.1 N / near / 33 cm / 1/3 m and D / distance / 6 m
    : row(`DMR at ${d}, PP - LE 4 incyclo, RE nil`, T(0, -4, { distance }), [], 1), // domain.md §5.1 fixation distance (common practice)
)

// ---------------------------------------------------------------------------
// 5. Notes clinicians add: prisms, head tilt, correction, vertical deviation, fixing eye.
// ---------------------------------------------------------------------------
const NOTES: Row[] = [
  row('DMR N primary with 6Δ BD RE: RE 8 ex, LE nil', T(8, 0, N), [], 1), // clinical-facts §9 prism note (R75, R76)
  row('DMR N primary: LE 6 ex, RE nil, with 6Δ BD RE', T(0, 6, N), [], 1), // clinical-facts §9 prism note: the prism's eye is not a finding
  row('DMR N PP: RE 8 ex, LE nil (6PD BU LE)', T(8, 0, N), [], 1), // clinical-facts §9 prism note (common practice)
  row('DMR N cc primary: RE 8 ex, LE nil', T(8, 0, N), [], 1), // clinical-facts §9 cc (R9, R76)
  row('DMR N sc PP: RE nil, LE 3 in', T(0, -3, N), [], 1), // clinical-facts §9 sc (R9, R76)
  row('DMR N primary: RE 8° ex, LE nil. Hyper increases on right head tilt.', T(8, 0, N), [], 1), // clinical-facts §9 head tilt note (common practice)
  row('DMR N PP: RE 8 ex, LE nil; R/L 6Δ', T(8, 0, N), [], 1), // clinical-facts §9 R/L = right hyper (R9, R75, R76)
  row('DMR N PP (FR): RE nil, LE 7 ex', T(0, 7, N), [], 1), // clinical-facts §9 fixing eye FR (R9)
  row('DMR N primary: RE 10 ex, LE nil. RHT 8Δ. Aware of tilt, worse on reading.', T(10, 0, N), [], 1), // clinical-facts §9 notes (common practice)
  row('DMR N primary: RE 8 ex, LE nil. 4Δ BD RE. Head tilt to L.', T(8, 0, N), [], 1), // clinical-facts §9 notes (common practice)
]

// ---------------------------------------------------------------------------
// 6. Patients who should not be tested (domain.md §3.8).
// ---------------------------------------------------------------------------
const SNT = { shouldNotTest: true }
const NOT_TESTABLE: Row[] = [
  row('DMR not possible — suppression', T(0, 0, { ...N, ...SNT }), [], 1), // domain.md §3.8 stop and record why (common practice)
  row('DMR unable: sees one line only', T(0, 0, { ...N, ...SNT }), [], 1), // domain.md §3.8 one streak only (common practice)
  row('DMR: pt sees only one streak - test abandoned', T(0, 0, SNT), [], 1), // domain.md §3.8 (common practice)
  row('DMR not attempted\nLE suppressed, one streak seen', T(0, 0, SNT), [], 1), // domain.md §3.8 (common practice)
  row('DMR N PP: RE 4 ex, LE nil', T(0, 0, { ...N, ...SNT }), ['should-not-test'], 'cap'), // domain.md §5.2 critical slip should-not-test
  row('DMR N PP\n- RE nil\n- LE nil', T(0, 0, { ...N, ...SNT }), ['should-not-test'], 'cap'), // domain.md §5.2 a recorded measurement misleads
  row('DMR N primary: BE 2 ex each', T(0, 0, { ...N, ...SNT }), ['should-not-test'], 'cap'), // domain.md §5.2 critical slip should-not-test
  row('DMR N downgaze: R 6 ex, L 0', T(0, 0, { gaze: 'down', ...N, ...SNT }), ['should-not-test'], 'cap'), // domain.md §5.2 critical slip should-not-test
  row('Unable: sees one line only', T(0, 0, SNT), ['test-unnamed'], 'pass'), // domain.md §5.1 the record names the test
]

// ---------------------------------------------------------------------------
// 7. Error carried forward (domain.md §5.2): the learner's own reading, converted correctly,
//    loses only the measurement mark; a wrong conversion is not rescued.
// ---------------------------------------------------------------------------
const ECF: Row[] = [
  // learner-turns: the streak looks level at the truth's reading (domain.md §3.4)
  row('DMR N PP: RE 8 ex, LE nil', T(8, 0, { ...N, readings: { RE: 98, LE: 90 } }), [], 1), // domain.md §3.4 RE at 98 → 8° ex
  row('DMR N PP: RE 5 ex, LE nil', T(8, 0, { ...N, readings: { RE: 95, LE: 90 } }), [NP('RE')], 'pass'), // domain.md §5.2 error carried forward
  row('DMR N PP: LE 2 ex, RE nil', T(0, 6, { ...N, readings: { RE: 90, LE: 88 } }), [NP('LE')], 'pass'), // domain.md §3.4 LE at 88 → 2° ex; §5.2 ECF
  row('DMR N PP: LE 4 in, RE 0', T(0, -7, { ...N, readings: { RE: 90, LE: 94 } }), [NP('LE')], 'pass'), // domain.md §3.4 LE at 94 → 4° in (level at 97, 3° out of the 2° tolerance); §5.2 ECF
  row('DMR N PP: RE 12 ex, LE 0', T(8, 0, { ...N, readings: { RE: 102, LE: 90 } }), [NP('RE')], 'pass'), // domain.md §3.4 RE at 102 → 12° ex; §5.2 ECF
  row('DMR N PP: RE 5 in, LE nil', T(8, 0, { ...N, readings: { RE: 95, LE: 90 } }), [NP('RE'), DR('RE')], 'cap'), // domain.md §5.2 a wrong conversion is not rescued
  row('DMR N PP: RE 5 ex, LE 4 ex', T(5, 0, { ...N, readings: { RE: 95, LE: 86 } }), [NP('LE')], 'pass'), // domain.md §3.4 LE at 86 → 4° ex; §5.2 ECF
  row('DMR N PP: RE 98 ex, LE nil', T(8, 0, { ...N, readings: { RE: 98, LE: 90 } }), [DV('RE')], 'cap'), // ISO 8429:1986 dial; domain.md §5.2 critical slip
  row('DMR N PP: RE 8 in, LE nil', T(8, 0, { ...N, readings: { RE: 98, LE: 90 } }), [DR('RE')], 'cap'), // domain.md §3.4 the LE rule on the RE dial
  row('DMR N PP: LE 6 in, RE nil', T(0, 6, { ...N, readings: { RE: 90, LE: 84 } }), [DR('LE')], 'cap'), // domain.md §3.4 the RE rule on the LE dial (84 − 90)
  row('DMR N downgaze: RE 9 ex, LE 3 ex', T(12, 3, { gaze: 'down', ...N, readings: { RE: 99, LE: 87 } }), [NP('RE')], 'pass'), // domain.md §3.4 RE at 99 → 9° ex (level at 102); §5.2 ECF
  // patient-turns: the patient left the rod; the learner reads the scale
  row('DMR N PP: RE 8 ex, LE 0', T(8, 0, { ...N, readings: { RE: 98, LE: 90 }, patientSettings: { RE: 98, LE: 90 } }), [], 1), // domain.md §3.4 RE at 98 → 8° ex
  row('DMR N PP: RE 6 ex, LE 0', T(8, 0, { ...N, readings: { RE: 96, LE: 90 }, patientSettings: { RE: 98, LE: 90 } }), [NP('RE')], 'pass'), // domain.md §5.2 misread scale, ECF
  row('DMR N PP: LE 3 ex, RE 0', T(0, 7, { ...N, readings: { RE: 90, LE: 87 }, patientSettings: { RE: 90, LE: 83 } }), [NP('LE')], 'pass'), // domain.md §3.4 LE at 87 → 3° ex; §5.2 ECF
  row('DMR N PP: LE 3 in, RE 0', T(0, 7, { ...N, readings: { RE: 90, LE: 87 }, patientSettings: { RE: 90, LE: 83 } }), [NP('LE'), DR('LE')], 'cap'), // domain.md §5.2 wrong conversion not rescued
  row('DMR N PP: RE 98, LE 90', T(8, 0, { ...N, readings: { RE: 98, LE: 90 }, patientSettings: { RE: 98, LE: 90 } }), [DV('RE'), DM('RE'), DV('LE')], 'cap'), // ISO 8429:1986 dial figures written as amounts; RE has no direction word (domain.md §5.1)
]

// ---------------------------------------------------------------------------
// 8. Tolerance 1–5, truths 0 to ±20, just under and just over 1° (domain.md §5.2).
// ---------------------------------------------------------------------------
const TOLERANCE: Row[] = [
  row('DMR N PP: RE 1 in, LE 0', T(0.95, 0, N), [], 1), // domain.md §5.2 under 1° no direction
  row('DMR N PP: RE 1 in, LE 0', T(1.05, 0, N), [DR('RE')], 'cap'), // domain.md §5.2 1° or more has a direction
  row('DMR N PP: RE 1 ex, LE 0', T(-1, 0, { ...N, tol: 3 }), [DR('RE')], 'cap'), // domain.md §5.2 "however small the amount or wide the tolerance"
  row('DMR N PP: RE 0, LE 1 ex', T(0, -1.2, { ...N, tol: 5 }), [DR('LE')], 'cap'), // domain.md §5.2 signed findings
  row('DMR N PP: RE 1 ex, LE 1 in', T(0.99, -0.99, { ...N, tol: 1 }), [], 1), // domain.md §5.2 under 1°
  row('DMR N PP: RE 3 ex, LE 0', T(0.9, 0, { ...N, tol: 1 }), [AO('RE')], 'lt1', { directionLost: true }), // domain.md §5.2 torsion claimed on an eye without any
  row('DMR N PP: RE 5 ex, LE 5 ex', T(0, 0, { ...N, tol: 5 }), [], 1), // domain.md §5.2 within the tolerance of zero
  row('DMR N PP: RE 2 ex, LE 0', T(0, 0, { ...N, tol: 1 }), [AO('RE')], 'lt1', { directionLost: true }), // domain.md §5.2 beyond the tolerance of zero
  row('DMR N PP: RE 9.5 ex, LE 0', T(8, 0, { ...N, tol: 1 }), [AO('RE')], 'pass'), // domain.md §5.2 partial credit within twice the tolerance
  row('DMR N PP: RE 11 ex, LE 0', T(8, 0, { ...N, tol: 3 }), [], 1), // domain.md §5.2 tolerance set per quiz
  row('DMR N PP: RE 13 ex, LE 0', T(8, 0, { ...N, tol: 4 }), [AO('RE')], 'pass'), // domain.md §5.2 amount off, direction right
  row('DMR N PP: RE 6 ex, LE 0', T(12, 0, { ...N, tol: 5 }), [AO('RE')], 'pass'), // domain.md §5.2 amount off, direction right
  row('DMR N PP: RE 15 ex, LE 12 ex', T(15, 12, N), [], 1), // domain.md §4 bilateral SO palsy (J Clin Med 2020;9:1829)
  row('DMR N PP: RE 20° incyclotorsion, LE nil', T(-20, 0, N), [], 1), // domain.md §3.3 sign convention
  row('DMR N DG: RE 20 ex, LE 18 ex', T(20, 18, { gaze: 'down', ...N }), [], 1), // domain.md §4 bilateral 20° (1993 study R17)
  row('DMR N PP: RE 30 ex, LE 0', T(20, 0, N), [AO('RE')], 'pass'), // domain.md §5.2 amount off (0 beyond twice tolerance)
  row('DMR N PP: RE 110 ex, LE 0', T(20, 0, N), [DV('RE')], 'cap'), // domain.md §3.4 RE at 110 → 20° ex
  row('DMR N PP: RE 70 ex, LE 0', T(-20, 0, N), [DV('RE'), DR('RE')], 'cap'), // domain.md §3.4 RE at 70 → 20° in, and the direction reversed
  row('DMR N PP: RE 0, LE 78 ex', T(0, 12, N), [DV('LE')], 'cap'), // domain.md §3.4 LE at 78 → 12° ex
  row('DMR N PP: RE 8 ex, LE 90', T(8, 0, N), [DV('LE')], 'cap'), // domain.md §5.3 the raw dial reading as the amount
  row('DMR N PP: RE no torsion, LE no torsion', T(1.2, 0, N), [DM('RE')], 'lt1'), // domain.md §5.2 1.2° has a direction; amount within tolerance
  row('DMR N PP: RE 3 in, LE 3 in', T(-3, -3, { ...N, tol: 5 }), [], 1), // domain.md §5.2 (common practice)
  row('DMR N PP: RE 3 ex, LE 3 in', T(-3, -3, { ...N, tol: 5 }), [DR('RE')], 'cap'), // domain.md §5.2 signed findings
  row('DMR N PP: RE 4 ex, LE 0', T(2, 0, { ...N, tol: 2 }), [], 1), // domain.md §5.2 amount within tolerance
  row('DMR N PP: RE 16 ex, LE 0', T(-16, 0, { ...N, tol: 5 }), [DR('RE')], 'cap'), // domain.md §5.2 signed findings (large)
]

// ---------------------------------------------------------------------------
// 9. Eyes: swaps of unequal amounts, both directions reversed, mixed cases (domain.md §5.2).
// ---------------------------------------------------------------------------
const EYES_ROWS: Row[] = [
  row('DMR N PP: RE 4 ex, LE 10 ex', T(10, 4, N), [EW('RE'), EW('LE')], 'cap'), // domain.md §5.2 eye-wrong whatever the amounts
  row('DMR N PP\nR: 3 ex\nL: 12 ex', T(12, 3, N), [EW('RE'), EW('LE')], 'cap'), // domain.md §5.2 eye-wrong (common practice layout)
  row('DMR N PP: RE 10 in, LE 4 in', T(10, 4, N), [DR('RE'), DR('LE')], 'cap'), // domain.md §5.3 recorded the image for both eyes
  row('DMR N PP: RE 3 in, LE 8 in', T(8, 3, N), [EW('RE'), EW('LE'), DR('RE'), DR('LE')], 'cap'), // domain.md §5.2 combined slips named as they happened
  row('DMR N PP: RE 6 ex, LE 3 ex', T(6, -3, N), [DR('LE')], 'cap'), // domain.md §5.2 mixed case, signed findings
  row('DMR N PP: RE 6 ex, LE 3 in', T(6, -3, N), [], 1), // domain.md §5.2 mixed case (common practice)
  row('DMR N PP: RE 4 ex, LE 7 ex', T(-4, 7, N), [DR('RE')], 'cap'), // domain.md §5.2 mixed case, signed findings
  row('DMR N PP: OD 0, OS 10 ex', T(10, 0, N), [EW('RE')], 'cap'), // domain.md §5.2 eye-wrong
  row('DMR N PP: LE 6 in, RE nil', T(-6, 0, N), [EW('RE')], 'cap'), // domain.md §5.2 eye-wrong
  row('DMR N PP: left eye excyclotorted by 9°, right eye not torted', T(9, 0, N), [EW('RE')], 'cap'), // domain.md §5.2 eye-wrong (prose)
  row('DMR N PP: 7° of excyclotorsion LE', T(7, 0, N), [EW('RE')], 'cap'), // domain.md §5.2 eye-wrong, each slip once
  row('DMR N PP: RE 8 ex', T(8, 5, N), [EM('LE')], 'lt1'), // domain.md §5.3 eye-missing
  row('DMR N PP: RE 5 ex, LE 5 in', T(-5, 5, N), [DR('RE'), DR('LE')], 'cap'), // domain.md §5.3 recorded the image for both eyes
  row('DMR N PP: RE nil, LE 6 incyclo', T(6, 0, N), [EW('RE'), DR('RE')], 'cap'), // domain.md §3.4 RE dial read with LE rule, written against LE
  row('DMR N downgaze: BE 5 ex each', T(10, 0, { gaze: 'down', ...N }), [AO('RE'), AO('LE')], 'lt1', { directionLost: true }), // domain.md §5.2 amount off; torsion claimed on an eye without any
]

// ---------------------------------------------------------------------------
// 10. Several positions in the new styles; wrong gaze / distance; missing fields.
// ---------------------------------------------------------------------------
const POSITIONS_MORE: Row[] = [
  row('DMR N\nPrimary: RE 4 ex, LE 0\nDG: RE 9 ex, LE 0', T(9, 0, { gaze: 'down', ...N }), [], 1), // common practice (one position a line)
  row('DMR N\nPrimary: RE 4 ex, LE 0\nDG: RE 9 ex, LE 0', T(4, 0, N), [], 1), // common practice (one position a line)
  row('DMR N: PP RE 4° ex, LE 0; on downgaze RE 9° ex, LE 0', T(9, 0, { gaze: 'down', ...N }), [], 1), // common practice
  row('DMR N\n- PP: R 3 ex, L nil\n- looking down: R 8 ex, L nil', T(8, 0, { gaze: 'down', ...N }), [], 1), // common practice (bullets per position)
  row('DMR near: RE 5 ex in primary, 10 ex in reading position; LE nil', T(10, 0, { gaze: 'down', ...N }), [], 1), // common practice (eye written once)
  row('DMR N PP: RE 8 ex, LE nil', T(8, 0, { gaze: 'down', ...N }), [], 'pass'), // domain.md §5.2 position named and correct (no slip code)
  row('DMR 6 m PP: RE 8 ex, LE nil', T(8, 0, N), [], 'pass'), // domain.md §5.1 fixation distance (no slip code)
  row('DMR 33 cm, PP: RE 8 ex, LE nil', T(8, 0, D), [], 'pass'), // domain.md §5.1 fixation distance (no slip code)
  row('Near, PP\nRE 8 ex\nLE nil', T(8, 0, N), ['test-unnamed'], 'pass'), // domain.md §5.1 the record names the test
  row('DMR near\nRE 8 ex\nLE nil', T(8, 0, N), ['gaze-missing'], 'pass'), // domain.md §5.1 the record names the position
  row('DMR N PP\nRE 8°\nLE nil', T(8, 0, N), [DM('RE')], 'pass'), // domain.md §5.1 the direction
  row('DMR N PP: R: excyclo, L: nil', T(8, 0, N), ['amount-missing:RE'], 'lt1'), // domain.md §5.1 the amount
  row('DMR N PP: 8 ex', T(8, 0, N), ['eye-missing'], 'lt1'), // domain.md §5.2 an amount with no eye is eye-missing only
  row('DMR N PP\n98° excyclo', T(8, 0, N), ['eye-missing', DV('RE')], 'cap'), // domain.md §5.2 each slip once; the dial figure is still critical
]

// ---------------------------------------------------------------------------
// 11. More styles: trade names of positions, labels, notes that hold gaze or number words.
// ---------------------------------------------------------------------------
const MORE: Row[] = [
  row('DMR N, in depression: RE 9 ex, LE nil', T(9, 0, { gaze: 'down', ...N }), [], 1), // common practice (orthoptic "depression" = downgaze)
  row('DMR N, in elevation: LE 5 in, RE nil', T(0, -5, { gaze: 'up', ...N }), [], 1), // common practice ("elevation" = upgaze)
  row('DMR N, dextrodepression: RE 8 ex, LE nil', T(8, 0, { gaze: 'down-right', ...N }), [], 1), // common practice (trade name of down-right)
  row('DMR N, laevodepression: RE 11 ex, LE nil', T(11, 0, { gaze: 'down-left', ...N }), [], 1), // common practice (trade name of down-left)
  row('DMR N, L gaze: RE 9 ex, LE nil', T(9, 0, { gaze: 'left', ...N }), [], 1), // domain.md §5.1 "right gaze" and the like (common practice)
  row('DMR N/PP: RE 8 ex, LE 0', T(8, 0, N), [], 1), // common practice (slash between fields)
  row('DMR @ 1/3m, PP: RE 8 ex, LE 0', T(8, 0, N), [], 1), // domain.md §5.1 1/3 m (common practice "@")
  row('DMR F primary: RE 4 ex, LE nil', T(4, 0, D), [], 1), // clinical-facts §9 "D or F (distance, 6 m)" (R9, R76)
  row('DMR 6 metres, primary: RE 4 ex, LE nil', T(4, 0, D), [], 1), // domain.md §5.1 6 m (common practice)
  row('DMR 40 cm, primary: RE 4 ex, LE nil', T(4, 0, N), [], 1), // common practice (a reading distance is near)
  row('Right: 8° ex. Left: 0.', T(8, 0), ['test-unnamed', 'gaze-missing'], 'pass'), // domain.md §5.1 right/left (fields left out)
  row('DMR N PP - Right: 8° ex. Left: 0.', T(8, 0, N), [], 1), // domain.md §5.1 right/left (common practice)
  row('DMR N PP: Rt 8 ex, Lt 0', T(8, 0, N), [], 1), // common practice (Rt/Lt)
  row('DMR N PP: RE and LE 3° ex each', T(3, 3, N), [], 1), // common practice
  row('DMR N PP: the right eye shows 8° of excyclotorsion; the left eye shows none', T(8, 0, N), [], 1), // domain.md §5.1 (prose)
  row('DMR N PP: RE: 8 degrees of excyclotorsion. LE: no cyclotorsion.', T(8, 0, N), [], 1), // domain.md §5.1 (prose)
  row('DMR N PP: no torsion RE; LE 6° intorsion', T(0, -6, N), [], 1), // domain.md §5.1 (eye after "no torsion")
  row('DMR N PP: 8 degrees excyclo right eye, left eye nil', T(8, 0, N), [], 1), // domain.md §5.1 (eye after the finding)
  row('DMR N PP: RE excyclo 8°, LE incyclo 2°', T(8, -2, N), [], 1), // domain.md §5.1 (direction before amount)
  row('DMR N PP: RE 6° excyclophoria, LE nil', T(6, 0, N), [], 1), // clinical-facts §9 excyclotropia/-phoria (R44, R28)
  row('DMR N PP (mean of 3): RE 8 ex, LE nil', T(8, 0, N), [], 1), // clinical-facts §3.1 average of three readings (R17)
  row('DMR N PP: RE 8 ex (range 7-9), LE nil', T(8, 0, N), [], 1), // clinical-facts §3.6 repeat readings vary (R17)
  row('DMR N PP: RE 8 ex, LE nil. Pt says the line slopes down to the left.', T(8, 0, N), [], 1), // common practice (what the patient saw is a note)
  row('DMR N PP: RE 6 ex, LE nil. Complains of tilt when looking down.', T(6, 0, N), [], 1), // clinical-facts §9 awareness note (common practice)
  row('DMR N PP: LE 6 ex, RE nil. L/R 4Δ.', T(0, 6, N), [], 1), // clinical-facts §9 L/R = left hyper (R9, R75, R76)
  row('DMR N PP: LE 5 ex, RE nil; 6Δ base down before RE', T(0, 5, N), [], 1), // clinical-facts §9 prism note (common practice)
  row('DMR N PP 6Δ BU LE: LE 4 ex, RE nil', T(0, 4, N), [], 1), // clinical-facts §9 prism note (common practice)
  row('DMR N\nRE: PP 4 ex, DG 9 ex\nLE: PP 0, DG 0', T(9, 0, { gaze: 'down', ...N }), [], 1), // common practice (eye heading, positions inside)
  row('DMR N\nRE: PP 4 ex, DG 9 ex\nLE: PP 0, DG 0', T(4, 0, N), [], 1), // common practice (eye heading, positions inside)
  row('DMR N PP RE 8 ex LE nil DG RE 12 ex LE 1 ex', T(12, 1, { gaze: 'down', ...N }), [], 1), // common practice (no punctuation)
  row('DMR N PP: RE 8 ex, LE 10 ex', T(10, 8, N), [], 1), // domain.md §5.2 each eye within the 2° tolerance
  row('DMR N PP: RE no torsion, LE no torsion', T(4, 0, { ...N, tol: 5 }), [DM('RE')], 'lt1', { directionLost: true }), // domain.md §5.2 4° has a direction whatever the tolerance
  row('DMR N PP: LE 82 ex, RE nil', T(0, 8, N), [DV('LE')], 'cap'), // domain.md §3.4 LE at 82 → 8° ex
  row('DMR N PP: excyclo 8°', T(8, 0, N), ['eye-missing'], 'lt1'), // domain.md §5.2 an amount with no eye is eye-missing only
  row('DMR N PP: RE 5 ex, LE 3 ex', T(8, 6, { ...N, readings: { RE: 95, LE: 87 } }), [NP('RE'), NP('LE')], 'pass'), // domain.md §3.4 RE 95 → 5 ex, LE 87 → 3 ex; §5.2 ECF
  row('DMR N PP: RE 95 ex, LE nil', T(8, 0, { ...N, readings: { RE: 95, LE: 90 } }), [DV('RE'), NP('RE')], 'cap'), // domain.md §5.3 dial figure; §5.2 measurement
  row('DMR N PP: RE 8 ex, LE nil', T(8, 0, { ...N, readings: { RE: 95, LE: 90 } }), [NP('RE')], 'pass'), // domain.md §5.2 the finding is right; the setting was not
  row('DMR not possible (ARC)', T(0, 0, SNT), [], 1), // domain.md §3.8 abnormal retinal correspondence (common practice)
  row('DMR not done: pt suppresses', T(0, 0, SNT), [], 1), // domain.md §3.8 suppression (common practice)
  row('DMR: only one streak seen, not continued', T(0, 0, SNT), [], 1), // domain.md §3.8 one streak (common practice)
  row('DMR: pt could not see both lines - stopped', T(0, 0, SNT), [], 1), // domain.md §3.8 (common practice)
]

// ---------------------------------------------------------------------------
// 12. Records inside fuller clinical notes; more positions and stop-and-say-why wording.
// ---------------------------------------------------------------------------
const NOTES_MORE: Row[] = [
  row('DMR N PP: RE 8 ex, LE nil. ? R SO palsy', T(8, 0, N), [], 1), // common practice (an impression is not a finding)
  row('DMR N PP: RE 8 ex, LE nil. Impression: right SO palsy.', T(8, 0, N), [], 1), // common practice (an impression is not a finding)
  row('DMR N PP: RE 8 ex, LE nil. Review 6/52.', T(8, 0, N), [], 1), // common practice (UK "6/52" = six weeks)
  row('VA 6/6 each eye. DMR N PP: RE 8 ex, LE nil.', T(8, 0, N), [], 1), // common practice (acuity beside the DMR record)
  row('DMR N PP with RE 6Δ BD: RE 8 ex, LE nil', T(8, 0, N), [], 1), // clinical-facts §9 prism note (common practice)
  row('RE 8 ex, LE nil (DMR, N, PP)', T(8, 0, N), [], 1), // domain.md §5.1 (test named last)
  row('DMR N. PP: R 4 ex / L 0. DG: R 9 ex / L 0. UG: R 2 ex / L 0.', T(2, 0, { gaze: 'up', ...N }), [], 1), // common practice (three positions)
  row('DMR N: 4° ex RE in PP, 9° ex RE in DG; LE 0', T(9, 0, { gaze: 'down', ...N }), [], 1), // common practice (eye after the finding, per position)
  row('Primary: RE 4 ex LE 0 | Downgaze: RE 9 ex LE 0 (DMR, N)', T(9, 0, { gaze: 'down', ...N }), [], 1), // common practice
  row('DMR N, on looking up: LE 6 in, RE nil', T(0, -6, { gaze: 'up', ...N }), [], 1), // domain.md §5.1 positions (common practice)
  row('DMR N, 20° up: LE 6 in, RE nil', T(0, -6, { gaze: 'up', ...N }), [], 1), // domain.md §5.1 positions (common practice)
  row('DMR N, upward gaze: LE 6 in, RE nil', T(0, -6, { gaze: 'up', ...N }), [], 1), // domain.md §5.1 positions (common practice)
  row('DMR N, downward gaze: RE 9 ex, LE nil', T(9, 0, { gaze: 'down', ...N }), [], 1), // domain.md §5.1 positions (common practice)
  row('DMR N PP: RE 3 ex, LE 8 in', T(8, 3, N), [EW('RE'), EW('LE'), DR('RE')], 'cap'), // domain.md §5.2 combined slips named as they happened
  row('DMR N PP: RE 0.5 ex, LE nil', T(1.5, 0, { ...N, tol: 1 }), [], 1), // domain.md §5.2 amount within tolerance, direction right
  row('DMR N PP: RE 0.5 in, LE nil', T(1.5, 0, { ...N, tol: 1 }), [DR('RE')], 'cap'), // domain.md §5.2 1° or more has a direction
  row('DMR N PP: RE 0.5 ex, LE nil', T(-0.5, 0, { ...N, tol: 1 }), [], 1), // domain.md §5.2 under 1° no direction
  row('DMR N PP: RE 8 ex, LE 8 ex', T(8, 0, N), [AO('LE')], 'lt1', { directionLost: true }), // domain.md §5.2 torsion claimed on an eye without any
  row('DMR: suppression RE - not tested', T(0, 0, SNT), [], 1), // domain.md §3.8 (common practice)
  row('DMR not performed: sees red line only', T(0, 0, SNT), [], 1), // domain.md §3.8 one streak (common practice)
  row('DMR: pt reports only one line; abandoned', T(0, 0, SNT), [], 1), // domain.md §3.8 one streak (common practice)
  row('DMR - pt unable to appreciate 2 lines', T(0, 0, SNT), [], 1), // domain.md §3.8 one streak (common practice)
  row('DMR N PP: unable', T(0, 0, { ...N, ...SNT }), [], 'pass'), // domain.md §3.8 stopped, reason not given
]

// ---------------------------------------------------------------------------
// 13. Eye headings over positions, and dial readings noted beside the finding.
// ---------------------------------------------------------------------------
const HEADINGS: Row[] = [
  row('DMR N\nRE: 4 ex (PP), 9 ex (DG)\nLE: 0 (PP), 0 (DG)', T(9, 0, { gaze: 'down', ...N }), [], 1), // common practice (eye heading, positions in brackets)
  row('DMR N. Right eye - primary 4° ex, downgaze 9° ex. Left eye - no torsion in any position.', T(9, 0, { gaze: 'down', ...N }), [], 1), // common practice (eye heading, prose)
  row('DMR N\nRE\n PP 4 ex\n DG 9 ex\nLE\n PP 0\n DG 0', T(9, 0, { gaze: 'down', ...N }), [], 1), // common practice (eye heading on its own line)
  row('DMR N\nRE\n PP 4 ex\n DG 9 ex\nLE\n PP 0\n DG 0', T(4, 0, N), [], 1), // common practice (eye heading on its own line)
  row('DMR N PP: RE 8 ex, LE 0 (dial: RE 98, LE 90)', T(8, 0, N), [], 1), // ISO 8429:1986 dial noted beside the finding; domain.md §3.4
  row('DMR N PP: RE 98 → 8° ex, LE 90 → 0', T(8, 0, N), [], 1), // domain.md §3.4 conversion shown (common practice)
]

const GROUPS: Array<[string, Row[]]> = [
  ['layouts', LAYOUTS],
  ['both eyes and totals', BOTH_EYES],
  ['positions of gaze', GAZES_ROWS],
  ['fixation distance', DISTANCES_ROWS],
  ['notes beside the finding', NOTES],
  ['should not be tested', NOT_TESTABLE],
  ['error carried forward', ECF],
  ['tolerance and truth sizes', TOLERANCE],
  ['eyes: swaps, reversals, mixed', EYES_ROWS],
  ['positions, fields', POSITIONS_MORE],
  ['more styles', MORE],
  ['fuller notes', NOTES_MORE],
  ['eye headings, dial notes', HEADINGS],
]

const ALL = GROUPS.flatMap(([, rows]) => rows)

describe('marking table, second examiner (issue 11)', () => {
  it('has at least 120 rows across every class', () => {
    expect(ALL.length).toBeGreaterThanOrEqual(120)
    for (const [, rows] of GROUPS) expect(rows.length).toBeGreaterThan(0)
  })

  for (const [name, rows] of GROUPS) {
    describe(name, () => {
      rows.forEach((x, i) => {
        const t = x.truth
        const label = `${i + 1}. ${JSON.stringify(x.record)} vs RE ${t.RE} LE ${t.LE}${t.gaze ? ` ${t.gaze}` : ''}${t.distance ? ` ${t.distance}` : ''}${t.tol ? ` tol ${t.tol}` : ''}${t.shouldNotTest ? ' (should not test)' : ''}${t.readings ? ` readings ${JSON.stringify(t.readings)}` : ''}${t.patientSettings ? ` patient ${JSON.stringify(t.patientSettings)}` : ''}`
        it(label, () => {
          const r = grade(x.record, t)
          expect(slipKeys(r), `read as: ${r.readAs}`).toEqual([...x.slips].sort())
          checkScore(r, x.score)
          if (x.directionLost) expect(markOf(r, 'direction')?.score).toBeLessThan(1)
        })
      })
    })
  }
})
