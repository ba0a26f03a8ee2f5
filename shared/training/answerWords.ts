/**
 * What the product says about a trainee's answer to an exercise: that an exercise takes one
 * answer, graded at once and final, and the grade in a few words. One source, so the exercise
 * page and the e-mail that brings the grade never tell a trainee two different things
 * (server/mail/messages.ts submissionGradedMessage, src/views/TrainingExerciseView.vue).
 * No units, no numbers.
 */

/** The grade in words: the page's banner and the e-mail's subject. */
export function gradeHeadline(passed: boolean): string {
  return passed ? 'Within tolerance' : 'Outside the tolerance';
}

/**
 * The rule on answers, before answering ('to answer') and once graded ('graded'). The trainee
 * sees the first above the submit button, the second under the grade and in the e-mail.
 */
export function oneAnswerWords(state: 'to answer' | 'graded'): string {
  return state === 'to answer'
    ? 'You submit once: your answer is graded at once and the grade is final. After grading, the product’s trace is shown beside your steps.'
    : 'You submitted once and this grade is final: an exercise takes one answer. Your steps stand beside the product’s trace.';
}
