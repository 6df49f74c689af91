/** Roles that build and mark quizzes. */
export const QUIZ_STAFF = ['tutor', 'lecturer', 'admin'] as const
