// Issue 11, table-driven: records written the ways students and clinicians write them,
// each with its truth, the exact slips a fair examiner would name, and the score it may earn.
// The rules are domain.md §3.3–§5.3; each row names the rule (and its source) beside its check.
//
// Slips are compared as sorted `code:eye` strings (`code` alone for a slip that concerns no
// single eye). Slip eye = the eye whose true finding the slip is about (so a finding written
// against the other eye is `eye-wrong` on the torted eye, as grader.test.ts already fixes).
// Scores: 1 = full marks; 'cap' = at most 0.5 (a critical slip, domain.md §5.2);
// 'pass' = above 0.5 but below 1; 'lt1' = below 1 (not sure how far below).

import { describe, expect, it } from 'vitest'
import type { Eye, Gaze } from '#shared/engine/types'
import { T, N, row, DR, EW, DV, AO, DM, AM, EM, grade, slipKeys, markOf, checkScore } from '../../support/marking-table'
import type { Truth, Row } from '../../support/marking-table'

// ---------------------------------------------------------------------------
// 1. Correct, complete records in many clinical styles → full marks, no slips.
// ---------------------------------------------------------------------------
const CORRECT: Row[] = [
  row('DMR, near, primary position: RE 8° excyclotorsion, LE no torsion.', T(8, 0, N), [], 1), // domain.md §5.1 complete record (common practice)
  row('DMR N primary: RE 6° excyclo, LE 0°', T(6, 0, N), [], 1), // domain.md §5.1 complete record (common practice)
  row('Double Maddox rod at 33 cm, primary: right eye 7 degrees excyclotorsion, left eye nil', T(7, 0, N), [], 1), // clinical-facts §9 notation (common practice)
  row('DMR (N, cc) PP - RE 5° ex / LE nil', T(5, 0.4, N), [], 1), // clinical-facts §9 notation (common practice)
  row('DMR 1/3 m, straight ahead: OD 9 deg excyclo, OS 0', T(9, 0, N), [], 1), // clinical-facts §9 OD/OS (common practice)
  row('DMR D primary: LE 6° excyclotorsion, RE nil', T(0, 6, { distance: 'distance' }), [], 1), // clinical-facts §9 D = distance (common practice)
  row('DMR 6 m primary: R 4° incyclo, L no torsion', T(-4, 0, { distance: 'distance' }), [], 1), // clinical-facts §9 (common practice)
  row('DMR near, 20° downgaze: RE 10° excyclo, LE 1° excyclo', T(10, 1, { gaze: 'down', ...N }), [], 1), // clinical-facts §9 "20° downgaze" (common practice)
  row('DMR, primary: RE 3 ex, LE 3 ex, total 6 ex', T(3, 3), [], 1), // clinical-facts §9 total (common practice)
  row('DMR N primary: RE 7° ex, LE 6° ex (total 13° ex)', T(7, 6.5, N), [], 1), // clinical-facts §9 total (common practice)
  row('DMR near PP: LE 5° incyclo, RE no torsion', T(0, -5, N), [], 1), // domain.md §5.1 (common practice)
  row('DMR N, primary: LE intorsion 6°, RE nil', T(0, -6, N), [], 1), // domain.md §5.1 intorsion (common practice)
  row('DMR upgaze: RE 2° ex, LE 6° incyclo', T(2, -6, { gaze: 'up' }), [], 1), // domain.md §5.1 (common practice)
  row('DMR near in downgaze: RE 12 ex, LE 9 ex', T(12, 9, { gaze: 'down', ...N }), [], 1), // domain.md §5.1 (common practice)
  row('DMR, N, primary - RE: 8° excyclo; LE: nil', T(8, 0, N), [], 1), // clinical-facts §9 (common practice)
  row('DMR N primary\nRE 8 ex\nLE 0', T(8, 0, N), [], 1), // common practice (one eye a line)
  row('dmr n pp re 4 ex le 4 ex', T(4, 4, N), [], 1), // common practice (terse lower case)
  row('DMR near primary: RE 8.5° excyclo, LE no torsion', T(8.5, 0, N), [], 1), // domain.md §5.1 (common practice)
  row('DMR N primary: RE 8° excyclo, LE no torsion. 4Δ BD RE to separate. Aware of tilt.', T(8, 0, N), [], 1), // clinical-facts §9 prism + awareness (common practice)
  row('DMR N primary: RE 8° excyclo (dial 98°), LE no torsion', T(8, 0, N), [], 1), // ISO 8429:1986 dial; domain.md §3.4 RE t = a − 90
  row('DMR N primary: both eyes no torsion', T(0, 0, N), [], 1), // domain.md §5.1 "no torsion" (common practice)
  row('DMR N primary: RE 9° ex, LE 9° ex', T(9, 9, N), [], 1), // domain.md §5.1 (common practice)
  row('DMR N primary: 8° excyclo RE, LE nil', T(8, 0, N), [], 1), // common practice (amount before eye)
  row('DMR near, primary: RE 0°, LE 5° excyclotorsion', T(0, 5, N), [], 1), // domain.md §5.1 "0°" (common practice)
  row('DMR N primary: R 5 in, L nil', T(-5, 0, N), [], 1), // domain.md §5.1 "in" after the amount (common practice)
  row('Double Maddox rod, near, PP. RE extorsion 7°. LE intorsion 2°.', T(7, -2, N), [], 1), // domain.md §5.1 extorsion/intorsion (common practice)
  row('DMR N primary: OD 10 degrees excyclotorsion, OS 3 degrees excyclotorsion', T(10, 3, N), [], 1), // clinical-facts §9 OD/OS (common practice)
  row('DMR N primary: RE 8 degs ex, LE 0 degs', T(8, 0, N), [], 1), // domain.md §5.1 deg/degrees (common practice)
  row('DMR N primary: RE 11° excyclo, LE nil', T(7, 0, { ...N, tol: 5 }), [], 1), // domain.md §5.2 amount within tolerance (set per quiz)
  row('DMR N primary: RE 8° ex, LE nil', T(8.4, 0, { ...N, tol: 1 }), [], 1), // domain.md §5.2 amount within tolerance
  row('DMR N, down and right: RE 5 ex, LE nil', T(5, 0.5, { gaze: 'down-right', ...N }), [], 1), // domain.md §5.1 positions; §5.2 under 1° (common practice)
  row('DMR near, left gaze: RE 9° ex, LE nil', T(9, 0, { gaze: 'left', ...N }), [], 1), // domain.md §5.1 "left gaze" (common practice)
  row('DMR N, right gaze: LE 7 excyclo, RE 0', T(0, 7, { gaze: 'right', ...N }), [], 1), // domain.md §5.1 "right gaze" (common practice)
  row('DMR N primary: right eye excyclotorted 8°, left eye not torted', T(8, 0, N), [], 1), // common practice
  row('Primary position, near, DMR: RE 6° excyclotorsion, LE 6° excyclotorsion', T(6, 6, N), [], 1), // common practice (heading last)
  row('DMR N 1° position: RE 4 incyclo, LE 4 excyclo', T(-4, 4, N), [], 1), // common practice ("1° position" = primary)
  row('DMR near PP. Right eye: 3° excyclotorsion. Left eye: 10° excyclotorsion. Total 13° ex.', T(3, 10, N), [], 1), // clinical-facts §9 (common practice)
  row('DMR N primary: RE 14 ex, LE 13 ex, aware of tilt', T(14, 13, N), [], 1), // clinical-facts §9 (common practice)
  row('DMR N PP: RE 2 in, LE 8 ex', T(-2, 8, N), [], 1), // domain.md §5.1 (common practice)
  row('DMR near primary: RE 5° excyclo; LE 5° incyclo', T(5, -5, N), [], 1), // domain.md §5.1 (common practice)
  row('DMR, distance, primary position: RE no torsion, LE 3° incyclotorsion', T(0, -3, { distance: 'distance' }), [], 1), // domain.md §5.1 (common practice)
  row('DMR N downgaze: RE 15° excyclotorsion, LE 12° excyclotorsion', T(15, 12, { gaze: 'down', ...N }), [], 1), // domain.md §4 bilateral SO palsy pattern (J Clin Med 2020;9:1829)
  row('DMR N primary: RE 8 ex, LE 0, 4 pd BU LE', T(8, 0, N), [], 1), // clinical-facts §9 prism notation (common practice)
  row('DMR N upgaze: LE 6° incyclo, RE nil', T(0, -6, { gaze: 'up', ...N }), [], 1), // domain.md §4 inferior oblique palsy pattern (common practice)
]

// ---------------------------------------------------------------------------
// 2. Signed findings (domain.md §5.2): direction and eye on the signed finding;
//    the tolerance is for the amount only; under 1° there is no direction to judge.
// ---------------------------------------------------------------------------
const SIGNED: Row[] = [
  // true torsion ≥ 1°, opposite direction named, tolerance wide enough to cover the amount
  row('DMR N primary: RE 5° incyclo, LE no torsion', T(5, 0, { ...N, tol: 5 }), [DR('RE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR N primary: RE 3 in, LE nil', T(3, 0, { ...N, tol: 4 }), [DR('RE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR N primary: LE 2° excyclo, RE nil', T(0, -2, { ...N, tol: 3 }), [DR('LE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR N primary: RE 2° incyclo, LE 1° excyclo', T(1.5, 1.2, N), [DR('RE')], 'cap'), // domain.md §5.2 "however small the amount" (common practice)
  row('DMR N primary: RE 4° excyclo, LE 4° incyclo', T(4, 4, { ...N, tol: 3 }), [DR('LE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR, N, downgaze: RE 6 ex, LE 2 in', T(6, 2, { gaze: 'down', ...N }), [DR('LE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR N primary: RE 7 incyclo, LE 6 incyclo', T(7, 6, N), [DR('RE'), DR('LE')], 'cap'), // domain.md §5.3 recorded the image for both eyes (common practice)
  row('DMR N primary: RE 12° incyclo, LE nil', T(8, 0, N), [DR('RE'), AO('RE')], 'cap'), // domain.md §5.2 + §5.3 amount-off (common practice)
  row('DMR N PP: RE nil, LE 6° extorsion', T(0, -6, { ...N, tol: 5 }), [DR('LE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR near upgaze: RE 3 excyclo, LE nil', T(-3, 0.2, { gaze: 'up', ...N, tol: 5 }), [DR('RE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  // finding written against the other eye, whatever the amounts
  row('DMR N primary: RE no torsion, LE 8 excyclo', T(8, 0, N), [EW('RE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR N primary: LE 8° excyclotorsion', T(8, 0, N), [EW('RE')], 'cap'), // domain.md §5.2 each slip once (eye-wrong, not also eye-missing)
  row('DMR N primary: RE nil, LE 4° excyclo', T(4, 0, { ...N, tol: 5 }), [EW('RE')], 'cap'), // domain.md §5.2 "eye-wrong whatever the amounts"
  row('DMR N PP: RE 5 incyclo, LE 0', T(0, -5, { ...N, tol: 5 }), [EW('LE')], 'cap'), // domain.md §5.2 "eye-wrong whatever the amounts"
  row('DMR near primary: R 6 ex, L nil', T(0.3, 6, N), [EW('LE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR N downgaze: RE no torsion, LE 10° ex', T(10, 0.5, { gaze: 'down', ...N }), [EW('RE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR N primary: OD 0, OS 7 degrees incyclo', T(-7, 0, N), [EW('RE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  // an eye under 1°: "no torsion", or any amount within the tolerance of zero, is right
  row('DMR N primary: RE 8 ex, LE no torsion', T(8, 0.7, N), [], 1), // domain.md §5.2 no-torsion band under 1° (common practice)
  row('DMR N primary: RE 8 ex, LE 1° in', T(8, 0.6, N), [], 1), // domain.md §5.2 amount within tolerance of zero (common practice)
  row('DMR N primary: RE nil, LE nil', T(0.8, -0.5, N), [], 1), // domain.md §5.2 no-torsion band (common practice)
  row('DMR N primary: RE 2° ex, LE 2° ex', T(0.5, 0.9, N), [], 1), // domain.md §5.2 amount within tolerance of zero (common practice)
  row('DMR N primary: RE 1 in, LE 1 ex', T(0.4, 0.2, N), [], 1), // domain.md §5.2 no direction under 1° (common practice)
  row('DMR N primary: RE 3° incyclo, LE 0', T(0.5, 0, { ...N, tol: 3 }), [], 1), // domain.md §5.2 amount within tolerance of zero
  row('DMR N primary: RE no torsion, LE 9° excyclo', T(-0.9, 9, N), [], 1), // domain.md §5.2 no-torsion band (common practice)
  row('DMR N PP: RE 1° ex, LE 7 in', T(-0.6, -7, N), [], 1), // domain.md §5.2 amount within tolerance of zero (common practice)
  row('DMR N primary: RE 0.5° excyclo, LE 0.5° excyclo', T(0.4, 0.6, { ...N, tol: 1 }), [], 1), // domain.md §5.2 no-torsion band (common practice)
  // torsion claimed beyond tolerance on an eye without any: wrong on amount and direction
  row('DMR N primary: RE 8 ex, LE 5 ex', T(8, 0, N), [AO('LE')], 'lt1', { directionLost: true }), // domain.md §5.2 signed findings (common practice)
  row('DMR N primary: RE nil, LE 6 in', T(0.5, 0, N), [AO('LE')], 'lt1', { directionLost: true }), // domain.md §5.2 signed findings (common practice)
  row('DMR N primary: RE 5° incyclo, LE nil', T(0.8, 0, { ...N, tol: 3 }), [AO('RE')], 'lt1', { directionLost: true }), // domain.md §5.2 signed findings (common practice)
  row('DMR near downgaze: RE 10° ex, LE 4° excyclo', T(10, -0.3, { gaze: 'down', ...N }), [AO('LE')], 'lt1', { directionLost: true }), // domain.md §5.2 signed findings (common practice)
  // "no torsion" for an eye that is clearly torted: an amount slip, not a reversed direction
  row('DMR N primary: RE no torsion, LE no torsion', T(8, 0, N), [AO('RE')], 'lt1', { directionLost: true }), // domain.md §5.2 amount (common practice)
  // amounts outside tolerance, direction right
  row('DMR N primary: RE 12° ex, LE nil', T(8, 0, N), [AO('RE')], 'pass'), // domain.md §5.2 amount tolerance default 2°
  row('DMR N primary: RE 11 ex, LE nil', T(8, 0, N), [AO('RE')], 'pass'), // domain.md §5.2 partial credit within twice the tolerance
  row('DMR N primary: LE 3° incyclo, RE 0', T(0, -8, { ...N, tol: 3 }), [AO('LE')], 'pass'), // domain.md §5.2 amount tolerance set per quiz
]

// ---------------------------------------------------------------------------
// 3. Critical slips (domain.md §5.2): at most 50 %.
// ---------------------------------------------------------------------------
const CRITICAL: Row[] = [
  row('DMR N primary: RE 98° excyclo, LE no torsion', T(8, 0, N), [DV('RE')], 'cap'), // ISO 8429:1986 dial; domain.md §3.4 RE t = a − 90
  row('DMR near primary: LE 84 degrees excyclo, RE nil', T(0, 6, N), [DV('LE')], 'cap'), // ISO 8429:1986 dial; domain.md §3.4 LE t = 90 − a
  row('DMR N downgaze: RE 102° ex, LE 85° ex', T(12, 5, { gaze: 'down', ...N }), [DV('RE'), DV('LE')], 'cap'), // ISO 8429:1986 dial; domain.md §3.4 (each eye once)
  row('DMR N primary: R 80 incyclo, L 0', T(-10, 0, N), [DV('RE')], 'cap'), // ISO 8429:1986 dial; domain.md §3.4 RE at 80 → 10° incyclo
  row('DMR N PP: RE nil, LE 97 incyclotorsion', T(0, -7, N), [DV('LE')], 'cap'), // ISO 8429:1986 dial; domain.md §3.4 check value LE at 97° → 7° incyclo
  row('DMR N primary: RE 100° excyclotorsion, LE no torsion', T(10, 0, { ...N, tol: 5 }), [DV('RE')], 'cap'), // domain.md §3.4 check value RE at 100° → 10° excyclo
  row('DMR N primary: RE 95 ex, LE 85 ex', T(5, 5, N), [DV('RE'), DV('LE')], 'cap'), // ISO 8429:1986 dial; domain.md §3.4 (common practice)
  // should not have been tested (domain.md §3.8): recording a measurement misleads
  row('DMR N primary: RE 2° ex, LE no torsion', T(0, 0, { ...N, shouldNotTest: true }), ['should-not-test'], 'cap'), // domain.md §3.8 suppression (common practice)
  row('DMR near PP: no torsion either eye', T(0, 0, { ...N, shouldNotTest: true }), ['should-not-test'], 'cap'), // domain.md §3.8 suppression (common practice)
  row('DMR N downgaze: RE 6 ex, LE 1 ex', T(0, 0, { gaze: 'down', ...N, shouldNotTest: true }), ['should-not-test'], 'cap'), // domain.md §3.8 ARC (common practice)
  // stopping is right
  row('DMR not performed: sees one streak only (suppression)', T(0, 0, { shouldNotTest: true }), [], 1), // domain.md §3.8 (common practice)
  row('DMR not done - pt suppressing, only one line seen', T(0, 0, { shouldNotTest: true }), [], 1), // domain.md §3.8 (common practice)
  row('Unable to perform DMR: abnormal retinal correspondence', T(0, 0, { shouldNotTest: true }), [], 1), // domain.md §3.8 ARC (common practice)
  row('DMR not performed', T(0, 0, { shouldNotTest: true }), [], 'pass'), // domain.md §3.8 the reason should be recorded
]

// ---------------------------------------------------------------------------
// 4. Combined slips named as they happened (domain.md §5.2, issue point 3).
// ---------------------------------------------------------------------------
const COMBINED: Row[] = [
  // left dial read with the right eye's rule, written against the right eye
  row('DMR N primary: RE 8° incyclo, LE nil', T(0, 8, N), [EW('LE'), DR('LE')], 'cap'), // domain.md §3.4: LE at 82 → 8° ex; RE rule gives −8
  row('DMR N primary: RE 6 excyclo, LE no torsion', T(0, -6, N), [EW('LE'), DR('LE')], 'cap'), // domain.md §3.4: LE at 96 → 6° in; RE rule gives +6
  // right dial read with the left eye's rule, written against the left eye
  row('DMR N PP: RE nil, LE 7 incyclotorsion', T(7, 0, N), [EW('RE'), DR('RE')], 'cap'), // domain.md §3.4: RE at 97 → 7° ex; LE rule gives −7
  row('DMR N primary: LE 5° incyclo', T(5, 0, { ...N, tol: 5 }), [EW('RE'), DR('RE')], 'cap'), // domain.md §5.2 signed findings, wide tolerance
  row('DMR near downgaze: R 0, L 9 in', T(9, 0.2, { gaze: 'down', ...N }), [EW('RE'), DR('RE')], 'cap'), // domain.md §3.4 reading rules (common practice)
  // an amount with no eye: eye-missing only
  row('DMR N primary: 8° excyclo', T(8, 0, N), ['eye-missing'], 'lt1'), // domain.md §5.2 each slip once
  row('DMR, near, downgaze: 10 deg ex', T(10, 0, { gaze: 'down', ...N }), ['eye-missing'], 'lt1'), // domain.md §5.2 each slip once
  row('DMR N PP 6° incyclotorsion', T(0, -6, N), ['eye-missing'], 'lt1'), // domain.md §5.2 each slip once
  // one eye left out
  row('DMR N primary: LE nil', T(8, 0, N), [EM('RE')], 'lt1'), // domain.md §5.3 eye-missing
  // each slip code once per eye, across positions and fields
  row('N primary: RE 4 ex, LE nil; downgaze: RE 9 ex, LE nil', T(9, 0, { gaze: 'down', ...N }), ['test-unnamed'], 'pass'), // domain.md §5.2 each slip once
  row('DMR N: RE 5 incyclo primary, 9 incyclo downgaze; LE nil', T(9, 0, { gaze: 'down', ...N }), [DR('RE')], 'cap'), // domain.md §5.2 each slip once
  row('DMR N primary: RE 98 ex, LE 98 in', T(8, -8, N), [DV('RE'), DV('LE')], 'cap'), // ISO 8429:1986 dial; domain.md §3.4 (each eye once)
  // fields left out
  row('Near, primary: RE 8° excyclo, LE no torsion', T(8, 0, N), ['test-unnamed'], 'pass'), // domain.md §5.1 complete record (common practice)
  row('DMR N: RE 8 ex, LE nil', T(8, 0, N), ['gaze-missing'], 'pass'), // domain.md §5.1 complete record (common practice)
  row('DMR N primary: RE 8°, LE nil', T(8, 0, N), [DM('RE')], 'pass'), // domain.md §5.1 complete record (common practice)
  row('DMR N primary: RE excyclo, LE nil', T(8, 0, N), [AM('RE')], 'lt1'), // domain.md §5.1 complete record (common practice)
  row('RE 8 ex, LE nil', T(8, 0), ['test-unnamed', 'gaze-missing'], 'pass'), // domain.md §5.1 complete record (common practice)
  // wrong position or distance: the mark is lost, no slip code exists for it
  row('DMR N downgaze: RE 8 ex, LE nil', T(8, 0, N), [], 'pass'), // domain.md §5.2 position of gaze named and correct
  row('DMR D primary: RE 8 ex, LE nil', T(8, 0, N), [], 'pass'), // domain.md §5.1 fixation distance
]

// ---------------------------------------------------------------------------
// 5. Several positions of gaze, the eye written once (issue point 5).
// ---------------------------------------------------------------------------
const POSITIONS_MULTI: Row[] = [
  row('DMR near - RE no torsion. LE 4° ex primary, 7° ex on looking down.', T(0, 7, { gaze: 'down', ...N }), [], 1), // common practice (eye written once for two positions)
  row('DMR near - RE no torsion. LE 4° ex primary, 7° ex on looking down.', T(0, 4, N), [], 1), // common practice (eye written once for two positions)
  row('DMR N primary: RE 5 ex, LE 0; 20° downgaze: RE 9 ex, LE 1 ex', T(9, 0.6, { gaze: 'down', ...N }), [], 1), // clinical-facts §9 example layout (common practice)
  row('DMR near: RE 6° ex in PP, 10° ex in d/g; LE nil', T(10, 0, { gaze: 'down', ...N }), [], 1), // common practice
  row('DMR near: RE 6° ex in PP, 10° ex in d/g; LE nil', T(6, 0, N), [], 1), // common practice
  row('DMR N: RE 6 ex PP, 11 ex DG, LE nil', T(11, 0, { gaze: 'down', ...N }), [], 1), // common practice
  row('DMR N. Primary: RE 4° excyclo, LE nil. Upgaze: RE 2° excyclo, LE nil. Downgaze: RE 9° excyclo, LE nil.', T(9, 0, { gaze: 'down', ...N }), [], 1), // common practice
  row('DMR N. Primary: RE 4° excyclo, LE nil. Upgaze: RE 2° excyclo, LE nil. Downgaze: RE 9° excyclo, LE nil.', T(2, 0, { gaze: 'up', ...N }), [], 1), // common practice
  row('DMR N: R 3 ex (primary), 7 ex (down gaze); L nil', T(7, 0, { gaze: 'down', ...N }), [], 1), // common practice
  row('DMR N: LE 3 ex primary, 8 ex downgaze, RE 0', T(0, 8, { gaze: 'down', ...N }), [], 1), // common practice
  row('DMR N: LE 3 ex primary, 8 ex downgaze, RE 0', T(0, 3, N), [], 1), // common practice
  row('DMR near: RE 2° ex primary, 8° ex downgaze; LE 0', T(2, 0, N), [], 1), // common practice
  row('DMR N: LE 4° ex primary, 7° incyclo on looking down; RE nil', T(0, 7, { gaze: 'down', ...N }), [DR('LE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR N: LE 4° ex primary, 7° incyclo on looking down; RE nil', T(0, 4, N), [], 1), // the primary finding is right (common practice)
  row('DMR near, RE 5 ex and LE 5 ex in primary, RE 9 ex and LE 8 ex in downgaze', T(9, 8, { gaze: 'down', ...N }), [], 1), // common practice
]

// ---------------------------------------------------------------------------
// 6. The usual ways of writing that an eye has no torsion (common practice).
// ---------------------------------------------------------------------------
const NO_TORSION_PHRASES = [
  'none seen', 'not detected', 'no measurable cyclotorsion', 'within normal limits', 'WNL', 'NAD', 'nil',
  'no torsion detected', 'none', 'no cyclotorsion', 'no torsion seen', 'no measurable torsion', 'no cyclodeviation',
  'no torsion found', 'nil torsion', 'not torted', 'nothing detected', 'none detected', 'no torsion noted', '0°',
]
const NO_TORSION: Row[] = [
  ...NO_TORSION_PHRASES.map((p, i) =>
    i % 2 === 0
      ? row(`DMR N primary: RE 7° excyclo, LE ${p}`, T(7, 0.3, N), [], 1) // common practice (no-torsion phrases)
      : row(`DMR N primary: RE ${p}, LE 6° incyclo`, T(-0.4, -6, N), [], 1), // common practice (no-torsion phrases)
  ),
  row('DMR N PP: NAD', T(0.4, 0.6, N), [], 1), // common practice ("NAD" for the whole test)
  row('DMR near, primary: WNL', T(0.2, 0.8, N), [], 1), // common practice ("WNL" for the whole test)
  row('DMR N primary: no torsion in either eye', T(0, 0.5, N), [], 1), // common practice
  row('DMR N primary: no measurable cyclotorsion either eye', T(-0.3, 0.3, N), [], 1), // common practice
  row('DMR N primary: neither eye torted', T(0, 0, N), [], 1), // common practice
  // the phrases are "no torsion" for an eye that is clearly torted too: not right
  row('DMR N primary: RE none seen, LE nil', T(8, 0, N), [AO('RE')], 'lt1', { directionLost: true }), // domain.md §5.2 (common practice)
  row('DMR N primary: RE WNL, LE not detected', T(0, -7, N), [AO('LE')], 'lt1', { directionLost: true }), // domain.md §5.2 (common practice)
]

// ---------------------------------------------------------------------------
// 7. Positions of gaze as clinicians name them (common practice).
// ---------------------------------------------------------------------------
const POSITION_NAMES: Array<[string, Gaze]> = [
  ['downgaze', 'down'], ['down gaze', 'down'], ['d/g', 'down'], ['dg', 'down'], ['DG', 'down'], ['looking down', 'down'],
  ['down-gaze', 'down'], ['inferior gaze', 'down'], ['20° downgaze', 'down'], ['D/G', 'down'],
  ['u/g', 'up'], ['ug', 'up'], ['upgaze', 'up'], ['up gaze', 'up'], ['looking up', 'up'], ['U/G', 'up'],
  ['primary', 'primary'], ['PP', 'primary'], ['1° position', 'primary'], ['primary position', 'primary'],
]
const POSITIONS: Row[] = POSITION_NAMES.map(([p, gaze], i) =>
  i % 2 === 0
    ? row(`DMR N ${p}: RE 9° ex, LE nil`, T(9, 0, { gaze, ...N }), [], 1) // common practice (position abbreviations)
    : row(`DMR near, ${p} - LE 5 excyclo, RE 0`, T(0, 5, { gaze, ...N }), [], 1), // common practice (position abbreviations)
)

// ---------------------------------------------------------------------------
// 8. Direction words in their usual variants (domain.md §5.1, clinical-facts §9).
// ---------------------------------------------------------------------------
const EX_VARIANTS = ['ex-cyclotorsion', 'ex-cyclo', 'excyclorotated', 'extorsion', 'extorted', 'excyclotorted', 'excyclorotation', 'Excyclo', 'EX', 'excyclotropia']
const IN_VARIANTS = ['in-cyclotorsion', 'in-cyclo', 'incyclorotated', 'intorsion', 'intorted', 'incyclotorted', 'incyclorotation', 'Incyclo', 'incyclotropia', 'incyclotorsion']
const DIRECTIONS: Row[] = [
  ...EX_VARIANTS.map((d, i) =>
    i % 2 === 0
      ? row(`DMR N primary: RE 6° ${d}, LE nil`, T(6, 0, N), [], 1) // clinical-facts §9 torsion words (common practice)
      : row(`DMR N primary: LE ${d} 6°, RE no torsion`, T(0, 6, N), [], 1), // clinical-facts §9 torsion words (common practice)
  ),
  ...IN_VARIANTS.map((d, i) =>
    i % 2 === 0
      ? row(`DMR N primary: LE 5 ${d}, RE 0`, T(0, -5, N), [], 1) // clinical-facts §9 torsion words (common practice)
      : row(`DMR N primary: RE ${d} 5°, LE nil`, T(-5, 0, N), [], 1), // clinical-facts §9 torsion words (common practice)
  ),
  // a variant read, but the direction is wrong for the eye: still direction-reversed
  row('DMR N primary: RE 6° intorted, LE nil', T(6, 0, N), [DR('RE')], 'cap'), // domain.md §5.2 signed findings (common practice)
  row('DMR N primary: RE nil, LE 5 ex-cyclo', T(0, -5, N), [DR('LE')], 'cap'), // domain.md §5.2 signed findings (common practice)
]

// ---------------------------------------------------------------------------
// 9. Misspellings one or two letters off a known word: read, with a note.
// ---------------------------------------------------------------------------
const MISSPELT: Row[] = [
  row('DMR N primary: RE 8° excylotorsion, LE nil', T(8, 0, N), [], 1, { misspelt: 'excylotorsion' }), // common practice (one letter off)
  row('DMR N primary: LE 6° incyclotorson, RE nil', T(0, -6, N), [], 1, { misspelt: 'incyclotorson' }), // common practice (one letter off)
  row('DMR N primary: RE 7 exyclotorsion, LE 0', T(7, 0, N), [], 1, { misspelt: 'exyclotorsion' }), // common practice (one letter off)
  row('DMR N primary: RE 5 incyclotosion, LE 0', T(-5, 0, N), [], 1, { misspelt: 'incyclotosion' }), // common practice (one letter off)
  row('DMR N primary: RE 9° excyclotrosion, LE no torsion', T(9, 0, N), [], 1, { misspelt: 'excyclotrosion' }), // common practice (two letters swapped)
  row('DMR N primary: RE no torsion, LE 4° intorsoin', T(0, -4, N), [], 1, { misspelt: 'intorsoin' }), // common practice (two letters swapped)
  row('DMR N primary: RE 6 excyclotortd, LE nil', T(6, 0, N), [], 1, { misspelt: 'excyclotortd' }), // common practice (one letter off)
  row('DMR N primary: RE 10° excyclotorsoin, LE 2° excyclotorsoin', T(10, 2, N), [], 1, { misspelt: 'excyclotorsoin' }), // common practice (two letters swapped)
  row('DMR N primary: LE 3 incycltorsion, RE nil', T(0, -3, N), [], 1, { misspelt: 'incycltorsion' }), // common practice (one letter off)
  row('DMR N primary: RE 8 excyclotorsian, LE nil', T(8, 0, N), [], 1, { misspelt: 'excyclotorsian' }), // common practice (one letter off)
  row('DMR N primary: RE 7° extorsoin, LE 0', T(7, 0, N), [], 1, { misspelt: 'extorsoin' }), // common practice (two letters swapped)
  row('DMR N primary: LE 5° incyclotorsin, RE nil', T(0, -5, N), [], 1, { misspelt: 'incyclotorsin' }), // common practice (one letter off)
  row('DMR N downgaze: RE 11 excyclotorison, LE nil', T(11, 0, { gaze: 'down', ...N }), [], 1, { misspelt: 'excyclotorison' }), // common practice (two letters off)
  row('DMR N primary: RE 6° exclotorsion, LE nil', T(6, 0, N), [], 1, { misspelt: 'exclotorsion' }), // common practice (two letters off)
  // a misspelling read, and the direction it names is wrong for the eye
  row('DMR N primary: RE 8 incylotorsion, LE nil', T(8, 0, N), [DR('RE')], 'cap', { misspelt: 'incylotorsion' }), // domain.md §5.2 signed findings
]

// ---------------------------------------------------------------------------
// 10. Where a careful examiner would ask: the parser declines to guess.
// ---------------------------------------------------------------------------
const DECLINED: Row[] = [
  row('DMR N primary: RE in 7°, LE nil', T(-7, 0, N), [DM('RE')], 'lt1', { declines: true }), // domain.md §5.1 a bare "in" may be a linking word (common practice)
  row('DMR N primary: LE in 5, RE 0', T(0, -5, N), [DM('LE')], 'lt1', { declines: true }), // domain.md §5.1 a bare "in" (common practice)
  row('DMR N PP: RE -6°, LE 0', T(6, 0, N), [DM('RE')], 'lt1', { declines: true }), // domain.md §3.4 the literature is not uniform on sign
  row('DMR N primary: RE +5, LE 0', T(5, 0, N), [DM('RE')], 'lt1', { declines: true }), // domain.md §3.4 the literature is not uniform on sign
  row('DMR N primary: RE 6° encyclo, LE nil', T(6, 0, N), [DM('RE')], 'lt1', { declines: true }), // "encyclo" is one letter off both excyclo and incyclo (common practice)
]

const GROUPS: Array<[string, Row[]]> = [
  ['correct records', CORRECT],
  ['signed findings', SIGNED],
  ['critical slips', CRITICAL],
  ['combined slips', COMBINED],
  ['several positions, eye written once', POSITIONS_MULTI],
  ['no-torsion phrases', NO_TORSION],
  ['positions of gaze', POSITIONS],
  ['direction variants', DIRECTIONS],
  ['misspellings', MISSPELT],
  ['declines to guess', DECLINED],
]

const ALL = GROUPS.flatMap(([, rows]) => rows)

describe('marking table (issue 11)', () => {
  it('has at least 160 rows across every class', () => {
    expect(ALL.length).toBeGreaterThanOrEqual(160)
    for (const [, rows] of GROUPS) expect(rows.length).toBeGreaterThan(0)
  })

  for (const [name, rows] of GROUPS) {
    describe(name, () => {
      rows.forEach((x, i) => {
        const label = `${i + 1}. "${x.record}" vs RE ${x.truth.RE} LE ${x.truth.LE}${x.truth.gaze ? ` ${x.truth.gaze}` : ''}${x.truth.tol ? ` tol ${x.truth.tol}` : ''}${x.truth.shouldNotTest ? ' (should not test)' : ''}`
        it(label, () => {
          const r = grade(x.record, x.truth)
          expect(slipKeys(r), `read as: ${r.readAs}`).toEqual([...x.slips].sort())
          checkScore(r, x.score)
          if (x.misspelt) {
            // read, not left unread, and the parsed result notes that a misspelling was read
            expect(r.parsed.unread).not.toContain(x.misspelt)
            const parsedText = JSON.stringify(r.parsed)
            expect(parsedText).toMatch(/spell/i)
            expect(parsedText.toLowerCase()).toContain(x.misspelt)
          }
          if (x.declines) {
            expect(r.parsed.problems.length, `read as: ${r.readAs}`).toBeGreaterThan(0)
          }
          if (x.directionLost) {
            expect(markOf(r, 'direction')?.score).toBeLessThan(1)
          }
        })
      })
    })
  }
})

// ---------------------------------------------------------------------------
// Reasons quote the record (issue point 4): the eye/direction reasons say what the
// learner wrote, and never put the truth in the learner's mouth.
// ---------------------------------------------------------------------------
interface ReasonRow {
  record: string
  truth: Truth
  criterion: 'direction' | 'eye'
  /** Words the learner wrote, which the reason must quote. */
  quotes: RegExp
  /** What the reason must not claim the learner wrote (the truth). */
  notClaimed: RegExp
}

const REASONS: ReasonRow[] = [
  // domain.md §5.2 "each reason quotes what the record said"
  { record: 'DMR N primary: RE no torsion, LE no torsion', truth: T(8, 0, N), criterion: 'direction', quotes: /no torsion/i, notClaimed: /(you wrote|you recorded|recorded|wrote)[^.;]*\b8\s*°?\s*(ex|excyclo)/i },
  { record: 'DMR N primary: RE 6° incyclo, LE nil', truth: T(6, 0, N), criterion: 'direction', quotes: /incyclo/i, notClaimed: /(you wrote|you recorded|recorded|wrote)[^.;]*excyclo/i },
  { record: 'DMR N primary: RE nil, LE 5° excyclotorsion', truth: T(0, -5, N), criterion: 'direction', quotes: /excyclo/i, notClaimed: /(you wrote|you recorded|recorded|wrote)[^.;]*incyclo/i },
  { record: 'DMR N primary: RE 5° incyclo, LE no torsion', truth: T(5, 0, { ...N, tol: 5 }), criterion: 'direction', quotes: /incyclo/i, notClaimed: /(you wrote|you recorded|recorded|wrote)[^.;]*excyclo/i },
  { record: 'DMR N PP: RE no torsion, LE 8° excyclo', truth: T(8, 0, N), criterion: 'eye', quotes: /(LE|left eye)/, notClaimed: /(you wrote|you recorded|recorded|wrote)[^.;]*(RE|right eye)\s*8/i },
  { record: 'DMR N primary: RE 8 incyclo, LE nil', truth: T(0, 8, N), criterion: 'eye', quotes: /(RE|right eye)/, notClaimed: /(you wrote|you recorded|recorded|wrote)[^.;]*(LE|left eye)\s*8/i },
]

describe('mark reasons quote the record (issue 11 point 4)', () => {
  REASONS.forEach((x, i) => {
    it(`${i + 1}. ${x.criterion} reason for "${x.record}"`, () => {
      const r = grade(x.record, x.truth)
      const m = markOf(r, x.criterion)
      expect(m).toBeDefined()
      expect(m!.score).toBeLessThan(1)
      expect(m!.reason).toMatch(x.quotes)
      expect(m!.reason).not.toMatch(x.notClaimed)
    })
  })
})

// ---------------------------------------------------------------------------
// Model record (issue point 6): an eye under 1° is written "no torsion", and the
// model record itself earns full marks with no slips.
// ---------------------------------------------------------------------------
const MODEL: Array<{ truth: Truth, quiet: Eye[] }> = [
  // domain.md §5.2 no-torsion band under 1° (common practice)
  { truth: T(8, 0.6, N), quiet: ['LE'] },
  { truth: T(0.9, -6, N), quiet: ['RE'] },
  { truth: T(-0.5, 0.4, N), quiet: ['RE', 'LE'] },
  { truth: T(12, 0.95, { gaze: 'down', ...N }), quiet: ['LE'] },
  { truth: T(3, -0.7, { ...N, tol: 1 }), quiet: ['LE'] },
  { truth: T(0.8, 5, { ...N, tol: 0.5 }), quiet: ['RE'] },
  { truth: T(-0.6, 7.4, { gaze: 'up', distance: 'distance', tol: 3 }), quiet: ['RE'] },
]

describe('model record (issue 11 point 6)', () => {
  MODEL.forEach(({ truth, quiet }, i) => {
    it(`${i + 1}. RE ${truth.RE} LE ${truth.LE}${truth.tol ? ` tol ${truth.tol}` : ''}`, () => {
      const r = grade('DMR', truth)
      for (const e of quiet) expect(r.modelRecord).toMatch(new RegExp(`${e} no torsion`))
      const again = grade(r.modelRecord, truth)
      expect(again.slips).toEqual([])
      expect(again.score).toBe(1)
    })
  })
})
