// The word tables of the record parser (domain.md §5.1, clinical-facts §9): the
// trade's words and abbreviations that lexicon.ts recognises. Phrase tables list
// each phrase as slots of alternative words.

import type { Eye, PrismBase } from '../types'
import type { NotPerformedReason, TestName } from './types'

// ---- word tables -----------------------------------------------------------

export const NUMBER_WORDS: Record<string, number> = {
  zero: 0, one: 1, two: 2, three: 3, four: 4, five: 5, six: 6, seven: 7, eight: 8, nine: 9, ten: 10,
  eleven: 11, twelve: 12, thirteen: 13, fourteen: 14, fifteen: 15, sixteen: 16, seventeen: 17,
  eighteen: 18, nineteen: 19, twenty: 20, thirty: 30,
}

/** An "amount" this large can only be a figure copied off the dial (the grader uses the same line). */
export const DIAL_FIGURE_FROM = 45

// ("dg" is not a unit here: clinicians write it for downgaze)
export const DEGREE_UNITS = ['°', 'deg', 'degs', 'degree', 'degrees']
export const PRISM_UNITS = ['pd', 'prism', 'prisms', 'pdpt', 'dioptre', 'dioptres', 'diopter', 'diopters']

export const EX_WORDS = new Set([
  'ex', 'exc', 'excyc', 'excyclo', 'excyclotorsion', 'excyclotorted', 'excyclotorsional', 'excyclotropia',
  'excyclophoria', 'excyclodeviation', 'excycloduction', 'excyclorotation', 'excycloversion', 'extorsion',
  'extorsional', 'extorted', 'extort', 'extorts', 'extortion', 'excyclotortion', 'extorsions',
  'excyclorotated', 'exrotated', 'exrotation', 'excyclotorsions', 'extorting', 'excycloposition',
])
export const IN_WORDS = new Set([
  'incyc', 'incyclo', 'incyclotorsion', 'incyclotorted', 'incyclotorsional', 'incyclotropia', 'incyclophoria',
  'incyclodeviation', 'incycloduction', 'incyclorotation', 'incycloversion', 'intorsion', 'intorsional',
  'intorted', 'intort', 'intorts', 'intortion', 'incyclotortion', 'intorsions',
  'incyclorotated', 'inrotated', 'inrotation', 'incyclotorsions', 'intorting', 'incycloposition',
])
export const TORSION_NOUNS = ['torsion', 'cyclotorsion', 'cyclo', 'cyclodeviation', 'cyclotropia', 'cyclophoria', 'tilt', 'rotation']
/** Words after a hyphenated "in-"/"ex-" that make it a direction: "in-cyclotorsion", "in-rotated". */
export const AFTER_IN = new Set([
  ...TORSION_NOUNS.filter(x => x !== 'tilt'), 'torted', 'torsional', 'rotated', 'cyclotorted', 'cyclorotated', 'cyclorotation', 'cycloduction',
  'cycloversion', 'cyclotorsional',
])
/** Qualifiers clinicians put between "no" and the torsion: "no measurable cyclotorsion". */
export const NO_QUALIFIERS = new Set([
  'measurable', 'measureable', 'significant', 'detectable', 'appreciable', 'obvious', 'apparent', 'visible',
  'manifest', 'demonstrable', 'definite', 'discernible', 'discernable', 'clinically', 'subjective', 'real',
  'evident', 'relevant', 'notable', 'further', 'any', 'abnormal',
])
/** Past participles that make "not …" / "none …" a finding of no torsion: "not detected", "none seen". */
export const NOT_FOUND = new Set(['detected', 'seen', 'found', 'present', 'noted', 'observed', 'evident', 'demonstrated', 'demonstrable', 'apparent', 'elicited', 'shown', 'appreciated'])

export const FILLERS = new Set([
  'the', 'a', 'an', 'at', 'of', 'with', 'for', 'on', 'by', 'to', 'from', 'position', 'eye', 'eyes', 'test',
  'tested', 'testing', 'measured', 'measurement', 'measures', 'shows', 'showed', 'shown', 'show', 'showing',
  'was', 'is', 'are', 'were', 'has', 'had', 'have', 'there', 'found', 'finding', 'findings', 'result',
  'results', 'reading', 'readings', 'about', 'approx', 'approximately', 'circa', 'ca', 'mean', 'average',
  'avg', 'torsion', 'torsional', 'cyclotorsion', 'cyclo', 'cyclodeviation', 'cyclotropia', 'cyclophoria',
  'deviation', 'degree', 'degrees', 'deg', 'patient', 'pt', 'also', 'then', 'gaze', 'looking', 'look',
  'seen', 'noted', 'recorded', 'record', 'torted', 'rotated', 'rotation', 'rod', 'rods', 'its', 'his', 'her',
  'their', 'amount', 'direction', 'value', 'so', 'ie', 'eg', 'roughly', 'around', 'some', 'slight',
  'slightly', 'mild', 'mildly', 'small', 'marked', 'markedly', 'which', 'that', 'this', 'result', 'obtained',
  'gives', 'given', 'equals', 'only', 'lines', 'line', 'streak', 'streaks', 'sees', 'saw', 'see',
  'perform', 'performed', 'attempt', 'attempted', 'possible', 'as', 'because', 'due', 'since', 'reason',
  'pos', 'either', 'detected', 'detectable', 'observed', 'present',
  '°', ':', '=', '~', '≈', '(', ')', '[', ']', '"', '\'', '?', '!', '*', '#', '@', '>', '<',
])

export const NOT_DONE: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, true]> = [
  [['not', ['performed', 'done', 'tested', 'possible', 'attempted', 'measured', 'measurable', 'valid', 'appropriate', 'completed']], true],
  [['not', 'carried', 'out'], true],
  [[['unable', 'cannot', 'can\'t', 'couldnt', 'couldn\'t']], true],
  [['could', 'not'], true],
  [['did', 'not'], true],
  [[['abandoned', 'stopped', 'untestable', 'invalid', 'notapplicable', 'unreliable', 'omitted', 'declined']], true],
  [['test', ['abandoned', 'stopped', 'invalid']], true],
  [['no', ['measurement', 'result', 'reading']], true],
]

const SEE_WORDS = ['see', 'appreciate', 'perceive', 'make', 'distinguish']
const LINE_WORDS = ['streak', 'streaks', 'line', 'lines', 'light', 'lights']
const STREAK_COLOURS = ['red', 'white', 'one', 'single']

export const REASONS: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, NotPerformedReason]> = [
  [[['suppression', 'suppresses', 'suppressing', 'suppressed', 'suppress', 'supp']], 'suppression'],
  [['arc'], 'abnormal-correspondence'],
  [['abnormal', 'retinal', 'correspondence'], 'abnormal-correspondence'],
  [['abnormal', 'correspondence'], 'abnormal-correspondence'],
  [['anomalous', 'retinal', 'correspondence'], 'abnormal-correspondence'],
  [['anomalous', 'correspondence'], 'abnormal-correspondence'],
  [[['one', 'single', '1'], ['streak', 'line', 'light']], 'one-streak'],
  [[['sees', 'saw', 'seeing'], 'only', ['one', '1', 'a', 'single']], 'one-streak'],
  [['only', ['one', '1', 'a', 'single'], ['streak', 'line', 'light']], 'one-streak'],
  [['only', 'sees', ['one', '1', 'a', 'single']], 'one-streak'],
  [['no', 'simultaneous', 'perception'], 'suppression'],
  [['cannot', 'see', 'both'], 'one-streak'],
  [['can\'t', 'see', 'both'], 'one-streak'],
  [[['could', 'did', 'does', 'do'], 'not', SEE_WORDS, ['both', 'two', '2']], 'one-streak'],
  [[['couldnt', 'couldn\'t', 'cannot', 'can\'t', 'didnt', 'didn\'t', 'doesnt', 'doesn\'t'], SEE_WORDS, ['both', 'two', '2']], 'one-streak'],
  [['unable', 'to', SEE_WORDS, ['both', 'two', '2']], 'one-streak'],
  [[['sees', 'saw', 'seeing', 'see'], STREAK_COLOURS, LINE_WORDS, 'only'], 'one-streak'],
  [[['sees', 'saw', 'seeing', 'see'], 'only', ['the', 'a', 'one'], STREAK_COLOURS, LINE_WORDS], 'one-streak'],
  [[['sees', 'saw', 'seeing', 'see'], 'only', STREAK_COLOURS, LINE_WORDS], 'one-streak'],
  [[['sees', 'saw', 'seeing', 'see'], ['one', '1', 'a', 'single'], LINE_WORDS, 'only'], 'one-streak'],
  [[STREAK_COLOURS, LINE_WORDS, 'only'], 'one-streak'],
]

export const TESTS: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, TestName]> = [
  [['dmr'], 'double-maddox-rod'],
  [['double', 'maddox'], 'double-maddox-rod'],
  [['double', 'maddox', ['rod', 'rods']], 'double-maddox-rod'],
  [['double', 'maddox', 'rod', 'test'], 'double-maddox-rod'],
  [[['two', '2'], 'maddox', 'rods'], 'double-maddox-rod'],
  [['maddox', 'double', ['rod', 'rods']], 'double-maddox-rod'],
  [['smr'], 'single-maddox-rod'],
  [['single', 'maddox'], 'single-maddox-rod'],
  [['single', 'maddox', 'rod'], 'single-maddox-rod'],
  [['maddox'], 'maddox-rod'],
  [['maddox', ['rod', 'rods']], 'maddox-rod'],
  [['mr'], 'maddox-rod'],
]

export const EYE_TABLE: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, Eye | 'both']> = [
  [[['re', 'od', 'rt', 'r', 'right']], 'RE'],
  [[['re', 'rt', 'r', 'right'], ['eye', 'e']], 'RE'],
  [['oculus', 'dexter'], 'RE'],
  [[['le', 'os', 'lt', 'l', 'left']], 'LE'],
  [[['le', 'lt', 'l', 'left'], ['eye', 'e']], 'LE'],
  [['oculus', 'sinister'], 'LE'],
  [[['be', 'ou', 'both', 'bilateral', 'bilaterally']], 'both'],
  [['both', 'eyes'], 'both'],
  [['each', 'eye'], 'both'],
  [['either', 'eye'], 'both'],
  // "RE/LE 0" — but never "R/L", which is the notation for a right hypertropia
  [[['re', 'od'], '/', ['le', 'os']], 'both'],
]

export const PRISM_BASE_TABLE: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, PrismBase]> = [
  [['bu'], 'up'], [['bd'], 'down'], [['bi'], 'in'], [['bo'], 'out'],
  [['base', 'up'], 'up'], [['base', 'down'], 'down'], [['base', 'in'], 'in'], [['base', 'out'], 'out'],
  [['up'], 'up'], [['down'], 'down'],
]

export const DEVIATION_WORDS = new Set([
  'rhyperl', 'lhyperr', 'rht', 'lht', 'hypertropia', 'hypotropia', 'hyper', 'hypo', 'hyperphoria',
  'eso', 'exo', 'esotropia', 'exotropia', 'esophoria', 'exophoria', 'et', 'xt', 'ortho', 'orthophoria', 'rhypo', 'lhypo',
])

const SIDE = ['right', 'left', 'r', 'l', 'rt', 'lt']
export const NOTES: ReadonlyArray<readonly [ReadonlyArray<readonly string[] | string>, true]> = [
  [['head', 'tilt', SIDE], true],
  [['head', 'tilt', 'to', 'the', SIDE], true],
  [['head', 'tilt', 'to', SIDE], true],
  [['tilt', SIDE], true],
  [['tilt', 'to', 'the', SIDE], true],
  [[SIDE, 'head', 'tilt'], true],
  [[SIDE, 'tilt'], true],
  [[['cc', 'sc']], true],
  [[['with', 'without'], ['glasses', 'specs', 'correction']], true],
  [['aware', 'of', ['tilt', 'torsion', 'diplopia']], true],
  [[['aware', 'symptomatic', 'asymptomatic', 'unaware']], true],
  [[['fr', 'fl']], true],
  [['fixing', SIDE], true],
  [[SIDE, 'fixing'], true],
  [[['upright', 'supine', 'sitting', 'lying', 'dim', 'dimmed', 'room', 'lights', 'light']], true],
  [['torsional', 'diplopia'], true],
  [[['in', 'at', 'for'], ['any', 'all', 'every', 'each'], ['position', 'positions', 'gaze', 'gazes', 'direction', 'directions']], true],
  [[['any', 'all', 'every'], ['position', 'positions', 'gazes']], true],
]

export const METRE = ['m', 'metre', 'metres', 'meter', 'meters']

export const EYE_WORDS = new Set(['re', 'le', 'r', 'l', 'od', 'os', 'rt', 'lt', 'right', 'left', 'eye', 'be', 'ou'])

export const NONE_WORDS = ['nil', 'none', 'normal', 'nad', 'zero', 'nothing', 'wnl', 'absent', 'untorted', 'neg', 'negative']
