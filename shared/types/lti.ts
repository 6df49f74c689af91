// Learning platforms (LTI 1.3): the grade-return log as tutors and administrators see it.

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
