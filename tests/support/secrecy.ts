// The secrecy scan: does a response that carries a case give the answer away
// before the truth is due? Build the secrets of a case once (`caseSecrets`), then
// scan every case-carrying response with `findCaseSecrets` / `expectNoCaseSecrets`.
// Used by the practice API tests; quizzes call it on their responses the same way.
//
// What counts as a leak (architecture.md, "The boundary that matters"):
// - any key or string value that names a direction (excyclo, incyclotorsion,
//   extorsion, intorted…), the word torsion, a condition word (palsy, skew,
//   thyroid, suppression…), a muscle (superior oblique, RSO…);
// - this case's condition, template label or title, its model record, and —
//   when the template is hidden — its template id;
// - a key that only the truth has (torsion, reported, condition, label,
//   templateId, palsiedMuscles, modelRecord, truth, directions, sources…);
// - a number equal to one of the case's torsion magnitudes (any gaze, objective or
//   shown) anywhere except the paths that legitimately carry case numbers
//   (presentation positions and cover test, the patient's threshold, dial
//   readings, prism powers, ids, trial numbers).
import { expect } from 'vitest'
import { GAZES, MUSCLES } from '#shared/engine/types'
import { revealTruth } from '~~/server/lib/engine/attempt'
import { getCaseTemplate } from '~~/server/lib/engine/templates'
import type { Case } from '~~/server/lib/engine/types'
import { baseTemplateId, baseTemplateTitle } from '~~/server/lib/practice/templates'

export interface CaseSecrets {
  /** For messages: which case these are. */
  name: string
  /** Forbidden as a substring of any key or string value (case-insensitive). */
  phrases: string[]
  /** Forbidden as a whole string value (case-insensitive), e.g. the condition "normal". */
  values: string[]
  /** Torsion magnitudes (1 decimal) forbidden as numbers outside CASE_NUMBER_PATHS. */
  numbers: number[]
}

/** Words that describe an answer, whichever case it is. */
export const ANSWER_WORDS: RegExp[] = [
  /excyclo|incyclo|extors|intors|extort|intort|cyclotors|torsion|torted/i,
  /palsy|paresis|oblique|rectus|thyroid|skew|suppress|restrict|correspondence|bilateral|long[- ]standing|under-?report/i,
  new RegExp(`\\b(${MUSCLES.join('|')})\\b`),
]

/** Keys only the truth has. */
export const TRUTH_KEYS = [
  'torsion', 'reported', 'objectiveTorsion', 'condition', 'label', 'templateId', 'palsiedMuscles', 'muscles',
  'affectedEye', 'modelRecord', 'truth', 'directions', 'behaviours', 'reliabilitySd', 'parallelThreshold', 'sources', 'levelAt',
]

/** Paths (dot-joined, array indices as numbers) whose numbers may legitimately come from the case. */
export const CASE_NUMBER_PATHS: RegExp[] = [
  /(^|\.)positions\.[a-z-]+\.(alignment|horizontalAt)\./,
  /(^|\.)coverTest\./,
  /(^|\.)response\.threshold$/,
  /(^|\.)(presentationVersion|generatorVersion|id|trial|caseId|attemptId|page|pageSize|total)$/,
  /(^|\.)readings\.(RE|LE)$/,
  /(^|\.)prisms\.\d+\.power$/,
]

export interface SecretsOptions {
  /** The template was chosen by the server ("any"): its id and title are secret too. Default true. */
  templateHidden?: boolean
}

const magnitude = (v: number) => Math.round(Math.abs(v) * 10) / 10

export function caseSecrets(c: Case, options: SecretsOptions = {}): CaseSecrets {
  const hidden = options.templateHidden ?? true
  const phrases = [c.label]
  const values: string[] = []
  if (c.condition.includes('-')) phrases.push(c.condition)
  else values.push(c.condition)
  for (const g of GAZES) {
    for (const d of ['near', 'distance'] as const) phrases.push(revealTruth(c, g, d).modelRecord)
  }
  if (hidden && c.templateId) {
    const t = getCaseTemplate(c.templateId)!
    phrases.push(c.templateId, baseTemplateId(c.templateId), t.family, baseTemplateTitle(t))
  }
  const numbers = new Set<number>()
  for (const g of GAZES) {
    const f = c.gazes[g]
    for (const t of [f.reported.RE, f.reported.LE, f.torsion.RE, f.torsion.LE, f.reported.RE + f.reported.LE]) {
      if (Math.abs(t) >= 1) numbers.add(magnitude(t))
    }
  }
  return { name: `${c.templateId ?? 'spec'} / ${c.seed}`, phrases, values, numbers: [...numbers] }
}

export interface ScanOptions {
  /** Paths whose content is the learner's own input echoed back (e.g. the draft's record), not scanned. */
  ignore?: RegExp[]
  /** More paths where case numbers are allowed. */
  allowNumbersAt?: RegExp[]
}

/** Every leak found in `body`, as "path: why" lines (empty when clean). */
export function findCaseSecrets(body: unknown, secrets: CaseSecrets, options: ScanOptions = {}): string[] {
  const found: string[] = []
  const ignore = options.ignore ?? []
  const numberPaths = [...CASE_NUMBER_PATHS, ...(options.allowNumbersAt ?? [])]
  const lowerPhrases = secrets.phrases.map(p => p.toLowerCase())
  const lowerValues = secrets.values.map(v => v.toLowerCase())

  const text = (path: string, s: string, what: 'key' | 'value') => {
    const lower = s.toLowerCase()
    for (const re of ANSWER_WORDS) if (re.test(s)) found.push(`${path}: ${what} "${s}" matches ${re}`)
    for (const p of lowerPhrases) if (p && lower.includes(p)) found.push(`${path}: ${what} "${s}" contains "${p}"`)
    if (what === 'value' && lowerValues.includes(lower)) found.push(`${path}: value "${s}" names the condition`)
  }
  const walk = (v: unknown, path: string) => {
    if (ignore.some(re => re.test(path))) return
    if (typeof v === 'string') text(path, v, 'value')
    else if (typeof v === 'number') {
      if (!numberPaths.some(re => re.test(path)) && secrets.numbers.includes(magnitude(v)) && Math.abs(v) >= 1) {
        found.push(`${path}: number ${v} equals a torsion magnitude of the case`)
      }
    }
    else if (Array.isArray(v)) v.forEach((x, i) => walk(x, path ? `${path}.${i}` : String(i)))
    else if (v && typeof v === 'object') {
      for (const [k, x] of Object.entries(v)) {
        const p = path ? `${path}.${k}` : k
        if (TRUTH_KEYS.includes(k)) found.push(`${p}: key "${k}" belongs to the truth`)
        text(p, k, 'key')
        walk(x, p)
      }
    }
  }
  walk(body, '')
  return found
}

export function expectNoCaseSecrets(body: unknown, secrets: CaseSecrets, what: string, options?: ScanOptions): void {
  expect(findCaseSecrets(body, secrets, options), `${what} (${secrets.name}) gives the answer away`).toEqual([])
}
