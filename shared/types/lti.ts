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
