// Learning platforms (LTI 1.3): platforms, launches and the grade-return log as tutors
// and administrators see them.
import type { JWK } from 'jose'
import type { CohortName } from './admin'

/** One score sent (or waiting) to a learning platform's line item. */
export interface GradeLogEntry {
  id: number
  quizId: number
  quizTitle: string
  studentId: number
  studentName: string
  platformName: string
  scoreGiven: number
  scoreMaximum: number
  reason: string
  status: string
  attempts: number
  lastError: string | null
  nextAttemptAt: string | null
  createdAt: string
  sentAt: string | null
}

/** GET /api/quizzes/:id/lti-grades: the quiz's marks sent to learning platforms. */
export interface QuizGradeLog { quizId: number, title: string, released: boolean, platforms: string[], items: GradeLogEntry[] }

/** GET /api/admin/lti/grades: every platform's marks sent (the latest first). */
export interface AdminGradeLog { items: GradeLogEntry[] }

/** A registered learning platform as administrators see it. */
export interface PlatformView {
  id: number
  name: string
  issuer: string
  clientId: string
  deploymentIds: string[]
  authUrl: string
  tokenUrl: string
  jwksUrl: string
  disabled: boolean
  createdAt: string
  updatedAt: string
}

/** What an administrator copies into the platform when registering Cyclodial. */
export interface ToolConfiguration {
  title: string
  description: string
  loginUrl: string
  launchUrl: string
  redirectUris: string[]
  deepLinkingUrl: string
  targetLinkUri: string
  jwksUrl: string
  messages: string[]
  claims: string[]
  scopes: string[]
  privacy: string
}

/** GET /api/admin/lti/platforms. */
export interface PlatformList { items: PlatformView[], tool: ToolConfiguration }

/** POST /api/admin/lti/keys/rotate: the new key and every key now published. */
export interface KeyRotated { kid: string, published: (string | undefined)[] }

/** GET /api/lti/jwks: the tool's public keys. */
export interface ToolJwks { keys: JWK[] }

/** GET /api/lti/launches/:id: what the launch page asks about. */
export interface LaunchView {
  messageType: string
  platformName: string
  course: { title: string | null, cohortId: number | null, cohortName: string | null } | null
  cohorts: CohortName[]
}

/** POST /api/lti/launches/:id/course: the course's cohort and where to go next. */
export interface CourseLinked { cohortId: number, next: string }
