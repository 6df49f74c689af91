// Role rules shared by the pages (route middleware) and the server (requireRole).
export const ROLES = ['student', 'tutor', 'lecturer', 'admin'] as const
export type Role = typeof ROLES[number]

export interface SessionUserData {
  id: number
  email: string
  name: string
  role: Role
}

const HOMES: Record<Role, string> = {
  student: '/student',
  tutor: '/tutor',
  lecturer: '/lecturer',
  admin: '/admin',
}

/** Where each role lands after signing in. */
export function homeFor(role: Role): string {
  return HOMES[role]
}

// ---- role groups: every route and page names its group from here ----

/** Staff who teach: tutors and lecturers (admins manage accounts, not teaching). */
export const TEACHING_ROLES = ['tutor', 'lecturer'] as const satisfies readonly Role[]
/** Every staff role: tutors, lecturers and administrators. */
export const STAFF_ROLES = ['tutor', 'lecturer', 'admin'] as const satisfies readonly Role[]
/** Roles that build and mark quizzes. */
export const QUIZ_STAFF = STAFF_ROLES
/** Roles that import a roster (a cohort's students from a CSV file). */
export const ROSTER_ROLES = STAFF_ROLES
/** Roles that read the slip patterns (review). */
export const REVIEW_ROLES = TEACHING_ROLES
/** Roles that keep the casebook (narrowed templates and exact cases). */
export const CASEBOOK_ROLES = TEACHING_ROLES
/** Everyone may practise. */
export const PRACTICE_ROLES = ROLES

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value)
}

export function roleAllowed(role: Role | undefined | null, allowed: readonly Role[]): boolean {
  return !!role && allowed.includes(role)
}

/**
 * A redirect target after sign-in must stay on this site: a path starting with
 * a single slash, no protocol-relative or backslash tricks.
 */
export function safeRedirect(target: unknown, fallback: string): string {
  if (typeof target !== 'string') return fallback
  if (!target.startsWith('/') || target.startsWith('//') || target.includes('\\')) return fallback
  // No control characters (a header-splitting or URL-parsing trick).
  if ([...target].some(ch => ch.charCodeAt(0) < 0x20)) return fallback
  return target
}

export const ROLE_LABELS: Record<Role, string> = {
  student: 'Student',
  tutor: 'Tutor',
  lecturer: 'Lecturer',
  admin: 'Administrator',
}
