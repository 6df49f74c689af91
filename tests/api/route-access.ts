// Who may call each API route. The role-matrix test walks server/api and fails
// when a route is missing here, so every new route must declare its access.
import type { Role } from '#shared/auth/roles'

export type Access = 'public' | 'signed-in' | Role[]

export const ROUTE_ACCESS: Record<string, Access> = {
  'GET /api/health': 'public',
  'POST /api/auth/login': 'public',
  'POST /api/auth/logout': 'public',
  'POST /api/auth/forgot': 'public',
  'POST /api/auth/reset': 'public',
  'GET /api/auth/me': 'signed-in',
  'GET /api/invitations/[token]': 'public',
  'POST /api/invitations/[token]/accept': 'public',
  'GET /api/admin/overview': ['admin'],
  'GET /api/admin/users': ['admin'],
  'PATCH /api/admin/users/[id]': ['admin'],
  'GET /api/admin/invitations': ['admin'],
  'POST /api/admin/invitations': ['admin'],
  'GET /api/admin/cohorts': ['admin'],
  'POST /api/admin/cohorts': ['admin'],
  'PATCH /api/admin/cohorts/[id]': ['admin'],
  'GET /api/admin/outbox': ['admin'],
  'GET /api/admin/outbox/[id]': ['admin'],
  'GET /api/admin/audit': ['admin'],
  'GET /api/practice/templates': 'signed-in',
  'POST /api/practice': ['student', 'tutor', 'lecturer', 'admin'],
  'GET /api/practice/[id]': ['student', 'tutor', 'lecturer', 'admin'],
  'PUT /api/practice/[id]/draft': ['student', 'tutor', 'lecturer', 'admin'],
  'POST /api/practice/[id]/turns': ['student', 'tutor', 'lecturer', 'admin'],
  'POST /api/practice/[id]/attempts': ['student', 'tutor', 'lecturer', 'admin'],
  'GET /api/practice/history': ['student', 'tutor', 'lecturer', 'admin'],
  'GET /api/practice/attempts/[attemptId]': ['student', 'tutor', 'lecturer', 'admin'],
  'POST /api/record-check': ['tutor', 'lecturer', 'admin'],
}
