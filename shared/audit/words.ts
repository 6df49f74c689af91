// The audit log in words. Stored rows keep their stable action codes and JSON detail
// (never shown as such); the admin page shows what happened and what changed, field
// by field, old → new. `AUDIT_ACTIONS` lists every action the server writes
// (tests/unit/audit-words.test.ts scans server/ for writeAudit calls and fails on one
// missing here); an action written later without words still reads as a sentence.
import { ROLE_LABELS, isRole } from '../auth/roles'
import { CRITERION_LABELS } from '../schemas/quiz'

export const AUDIT_ACTION_WORDS = {
  'cohort.created': 'Cohort created',
  'cohort.renamed': 'Cohort renamed',
  'fundus-photo.deleted': 'Fundus photograph deleted',
  'fundus-photo.marked': 'Fundus photograph marked',
  'fundus-photo.uploaded': 'Fundus photograph uploaded',
  'invitation.accepted': 'Invitation accepted',
  'invitation.created': 'Invitation sent',
  'lti.account-created': 'Account made on a launch from a learning platform',
  'lti.cohort-joined': 'Joined a cohort on a launch from a learning platform',
  'lti.key-rotated': 'Signing key for learning platforms replaced',
  'lti.course-linked': 'Course on a learning platform linked to a cohort',
  'lti.platform-changed': 'Learning platform changed',
  'lti.platform-registered': 'Learning platform registered',
  'lti.quiz-linked': 'Quiz added to a course on a learning platform',
  'password-reset.completed': 'Password reset completed',
  'password-reset.limited': 'Password reset held back: too many asked for within the hour',
  'password-reset.requested': 'Password reset requested',
  'practice-set.create': 'Practice set sent',
  'quiz.created': 'Quiz created',
  'quiz.duplicated': 'Quiz duplicated',
  'quiz.mark-overridden': 'Quiz mark changed',
  'quiz.released': 'Quiz results released',
  'quiz.updated': 'Quiz changed',
  'roster.imported': 'Roster imported',
  'sessions.revoked-all': 'Signed out everywhere',
  'user.name-changed': 'Name changed',
  'user.role-changed': 'Role changed',
  'user.disabled-changed': 'Account enabled or disabled',
  'user.cohorts-changed': 'Cohorts changed',
} as const satisfies Record<string, string>
export type AuditAction = keyof typeof AUDIT_ACTION_WORDS
export const AUDIT_ACTIONS = Object.keys(AUDIT_ACTION_WORDS) as AuditAction[]

/** Names the server looked up for ids in a row (users, cohorts, quizzes). */
export interface AuditNames {
  user: (id: number) => string | undefined
  cohort: (id: number) => string | undefined
  quiz: (id: number) => string | undefined
}

const FIELD_WORDS: Record<string, string> = {
  title: 'Title',
  instructions: 'Instructions',
  time_limit_minutes: 'Time limit',
  opens_at: 'Opens',
  closes_at: 'Closes',
  attempts_allowed: 'Submissions per item',
  interpretation: 'Interpretation step',
  hold_feedback: 'Feedback held until release',
  published_at: 'Published',
  archived_at: 'Archived',
  cohortIds: 'Cohorts',
  name: 'Name',
  role: 'Role',
  disabled: 'Account',
  cohorts: 'Cohorts',
}

/** A code written as a sentence: "quiz.mark-overridden" → "Quiz mark overridden". */
function sentence(code: string): string {
  const s = code.replace(/[._-]+/g, ' ').trim()
  return s.charAt(0).toUpperCase() + s.slice(1)
}

export function auditActionWords(action: string): string {
  return (AUDIT_ACTION_WORDS as Record<string, string>)[action] ?? sentence(action)
}

const ISO = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/
function when(iso: string): string {
  return new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', timeZone: 'UTC' }) + ' UTC'
}

function value(field: string, v: unknown, names: AuditNames): string {
  if (v === null || v === undefined || v === '') {
    if (field === 'published_at') return 'draft'
    if (field === 'archived_at') return 'not archived'
    if (field === 'time_limit_minutes') return 'none'
    return 'none'
  }
  if (field === 'published_at' && typeof v === 'string') return `published ${when(v)}`
  if (field === 'archived_at' && typeof v === 'string') return `archived ${when(v)}`
  if (field === 'disabled' || field === 'interpretation' || field === 'hold_feedback') {
    const on = v === true || v === 1
    return field === 'disabled' ? (on ? 'disabled' : 'enabled') : on ? 'on' : 'off'
  }
  if (field === 'time_limit_minutes' && typeof v === 'number') return `${v} min`
  if (field === 'role' && isRole(v)) return ROLE_LABELS[v].toLowerCase()
  if ((field === 'cohortIds' || field === 'cohorts') && Array.isArray(v)) {
    return v.length ? v.map(id => names.cohort(Number(id)) ?? `cohort ${id}`).join(', ') : 'none'
  }
  if (typeof v === 'string' && ISO.test(v)) return when(v)
  if (typeof v === 'string') return `“${v.length > 80 ? `${v.slice(0, 77)}…` : v}”`
  if (typeof v === 'number' || typeof v === 'boolean') return String(v)
  return Array.isArray(v) ? v.map(String).join(', ') : JSON.stringify(v)
}

const fieldWords = (f: string) => FIELD_WORDS[f] ?? sentence(f.replace(/_at$/, '').replace(/Ids?$/, ''))
const change = (field: string, from: unknown, to: unknown, names: AuditNames) =>
  `${fieldWords(field)}: ${value(field, from, names)} → ${value(field, to, names)}`

/** What changed, one line per field, in words (no codes, no JSON). */
export function auditChangeWords(action: string, detail: unknown, names: AuditNames): string[] {
  if (!detail || typeof detail !== 'object') return []
  const d = detail as Record<string, unknown>
  if (action.startsWith('user.') && action.endsWith('-changed') && 'to' in d) {
    const field = action.slice('user.'.length, -'-changed'.length)
    return [change(field, d.from, d.to, names)]
  }
  switch (action) {
    case 'cohort.created': return [`Name: ${value('name', d.name, names)}`]
    case 'cohort.renamed': return [change('name', d.from, d.to, names)]
    case 'roster.imported': return [`${d.invitations} invitation${d.invitations === 1 ? '' : 's'} sent`, ...(Array.isArray(d.cohorts) && d.cohorts.length ? [`Cohorts: ${d.cohorts.join(', ')}`] : [])]
    case 'quiz.created': return [`Title: ${value('title', d.title, names)}`, `Cohorts: ${value('cohortIds', d.cohortIds, names)}`]
    case 'quiz.released': return [`Title: ${value('title', d.title, names)}`]
    case 'quiz.duplicated': return [`Copied from ${typeof d.from === 'number' ? names.quiz(d.from) ? `“${names.quiz(d.from)}”` : `quiz ${d.from}` : 'another quiz'}`]
    case 'quiz.updated': {
      const previous = (d.previous && typeof d.previous === 'object' ? d.previous : {}) as Record<string, unknown>
      return Object.keys(d).filter(k => k !== 'previous' && k !== 'previousCohortIds').map(k => k in previous || (k === 'cohortIds' && 'previousCohortIds' in d)
        ? change(k, k === 'cohortIds' ? d.previousCohortIds : previous[k], d[k], names)
        : `${fieldWords(k)} set to ${value(k, d[k], names)}`)
    }
    case 'quiz.mark-overridden': {
      const crit = typeof d.criterion === 'string' ? (CRITERION_LABELS as Record<string, string>)[d.criterion] ?? sentence(d.criterion) : 'Mark'
      const lines = [
        ...(typeof d.quizId === 'number' && names.quiz(d.quizId) ? [`Quiz: “${names.quiz(d.quizId)}”`] : []),
        ...(typeof d.studentId === 'number' && names.user(d.studentId) ? [`Student: ${names.user(d.studentId)}`] : []),
        `${crit}: ${d.from} → ${d.to}`,
      ]
      if (typeof d.reason === 'string' && d.reason) lines.push(`Reason: “${d.reason}”`)
      return lines
    }
    case 'invitation.created': return [
      ...(typeof d.email === 'string' ? [`To ${d.email}`] : []),
      ...(isRole(d.role) ? [`As ${ROLE_LABELS[d.role].toLowerCase()}`] : []),
      ...(typeof d.cohortId === 'number' ? [`Cohort: ${names.cohort(d.cohortId) ?? `cohort ${d.cohortId}`}`] : []),
    ]
    case 'invitation.accepted': return []
    case 'fundus-photo.uploaded': return [
      `Title: ${value('title', d.title, names)}`,
      ...(d.eye === 'RE' || d.eye === 'LE' ? [d.eye === 'RE' ? 'Right eye' : 'Left eye'] : []),
      ...(Array.isArray(d.cohortIds) ? [`Shared with: ${value('cohortIds', d.cohortIds, names)}`] : []),
    ]
    case 'fundus-photo.deleted': return [`Title: ${value('title', d.title, names)}`]
    case 'fundus-photo.marked': return typeof d.angle === 'number' ? [`Disc–fovea angle ${d.angle.toFixed(1)}°`] : []
    case 'practice-set.create': return [
      ...(typeof d.size === 'number' ? [`${d.size} case${d.size === 1 ? '' : 's'}`] : []),
      ...(typeof d.learners === 'number' ? [`to ${d.learners} learner${d.learners === 1 ? '' : 's'}`] : []),
    ]
    default:
      // an action without its own words: each field in words, never the raw JSON
      return Object.entries(d).filter(([, v]) => v === null || typeof v !== 'object' || Array.isArray(v)).map(([k, v]) => `${fieldWords(k)}: ${value(k, v, names)}`)
  }
}

/** The target of a row in words: "Tamsin Arkwell", "quiz “Week 3…”", "cohort Kestrel cohort". */
export function auditTargetWords(type: string | null, id: string | null, names: AuditNames): string | null {
  if (!type) return null
  const n = id !== null && /^\d+$/.test(id) ? Number(id) : null
  switch (type) {
    case 'user': return (n !== null && names.user(n)) || 'an account'
    case 'cohort': return (n !== null && names.cohort(n)) || 'a cohort'
    case 'quiz': return n !== null && names.quiz(n) ? `quiz “${names.quiz(n)}”` : 'a quiz'
    case 'attempt': return 'a quiz attempt'
    case 'fundus-attempt': return 'a fundus quiz attempt'
    case 'fundus-photo': return 'a fundus photograph'
    case 'practice_set': return 'a practice set'
    case 'invitation': return 'an invitation'
    case 'roster': return 'a roster'
    default: return sentence(type).toLowerCase()
  }
}
