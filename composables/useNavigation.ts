import type { Role } from '#shared/auth/roles'

export interface NavItem { to: string, label: string }

// The top navigation for each role. Features add their pages here.
const NAV: Record<Role, NavItem[]> = {
  student: [
    { to: '/student', label: 'Home' },
    { to: '/practice', label: 'Practice' },
    { to: '/practice/history', label: 'History' },
    { to: '/student/quizzes', label: 'Quizzes' },
    { to: '/fundus/photos', label: 'Fundus photographs' },
  ],
  tutor: [
    { to: '/tutor', label: 'Home' },
    { to: '/casebook', label: 'Casebook' },
    { to: '/quizzes', label: 'Quizzes' },
    { to: '/record-checker', label: 'Record checker' },
    { to: '/review', label: 'Slip patterns' },
    { to: '/fundus/photos', label: 'Fundus photographs' },
  ],
  lecturer: [
    { to: '/lecturer', label: 'Home' },
    { to: '/casebook', label: 'Casebook' },
    { to: '/quizzes', label: 'Quizzes' },
    { to: '/record-checker', label: 'Record checker' },
    { to: '/review', label: 'Slip patterns' },
    { to: '/fundus/photos', label: 'Fundus photographs' },
  ],
  admin: [
    { to: '/admin', label: 'Overview' },
    { to: '/admin/users', label: 'Users' },
    { to: '/admin/cohorts', label: 'Cohorts' },
    { to: '/admin/outbox', label: 'Outbox' },
    { to: '/admin/learning-platforms', label: 'Learning platforms' },
    { to: '/admin/audit', label: 'Audit log' },
    { to: '/record-checker', label: 'Record checker' },
    { to: '/fundus/photos', label: 'Fundus photographs' },
  ],
}

export function useNavigation() {
  const { user } = useUserSession()
  return computed<NavItem[]>(() => (user.value ? NAV[user.value.role] : []))
}
