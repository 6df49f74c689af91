// Quiz seeds. Each student's case for an item is derived from the quiz seed, the
// item and the student id, so a tutor can regenerate exactly what a student saw and
// two students of one quiz get different (but equally fair) patients.
import { createHash, randomBytes } from 'node:crypto'

export function newQuizSeed(): string {
  return `quiz-${randomBytes(8).toString('hex')}`
}

/** Seed of one item's case: per student, or one for everyone (`studentId` null). */
export function quizCaseSeed(quizSeed: string, itemId: number, studentId: number | null): string {
  const digest = createHash('sha256').update(`cyclodial-quiz|${quizSeed}|item-${itemId}|${studentId === null ? 'everyone' : `student-${studentId}`}`).digest('hex')
  return `q${digest.slice(0, 20)}`
}
