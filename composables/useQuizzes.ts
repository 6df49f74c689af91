// GET /api/quizzes and GET /api/quizzes/:id answer by role: the staff shape or the
// student shape (the handlers declare the union). Each page is guarded to one side, so
// the union is narrowed once here rather than by a hand-written generic on every page.
import type { UseFetchOptions } from '#app'
import type { QuizPage, StaffQuizDetail, StaffQuizSummary, StudentQuizDetail, StudentQuizSummary } from '#shared/types/quiz'

type ListOptions = Pick<UseFetchOptions<unknown>, 'query' | 'lazy'> & { key: string }

/** The quizzes list as a tutor, lecturer or administrator sees it. */
export function useStaffQuizzes(options: ListOptions) {
  return useFetch('/api/quizzes', { ...options, transform: page => page as QuizPage<StaffQuizSummary> })
}

/** The quizzes list as a student sees it. */
export function useStudentQuizzes(options: ListOptions) {
  return useFetch('/api/quizzes', { ...options, transform: page => page as QuizPage<StudentQuizSummary> })
}

/** One quiz as staff see it (settings, items, cohorts). */
export function useStaffQuiz(id: MaybeRefOrGetter<number>, key: string) {
  return useFetch(() => `/api/quizzes/${toValue(id)}`, { key, transform: quiz => quiz as StaffQuizDetail })
}

/** One quiz as the student sitting it sees it. */
export function useStudentQuiz(id: MaybeRefOrGetter<number>, key: string) {
  return useFetch(() => `/api/quizzes/${toValue(id)}`, { key, transform: quiz => quiz as StudentQuizDetail })
}
