/** Training exercises: the instructor's and the trainee's lists, the open exercise, and actions. */
import { defineStore } from 'pinia';
import { ref } from 'vue';
import * as trainingApi from '@/api/training';
import type { ExerciseChanges, ExerciseListItem, InstructorExercise, LanePlacement, NewExercise, QuestionPreset, Submission, SubmissionStep, TraineeExercise } from '@/api/training';

export const useTrainingStore = defineStore('training', () => {
  const exercises = ref<ExerciseListItem[]>([]);
  const loading = ref(false);
  const questions = ref<QuestionPreset[]>([]);
  const trainees = ref<{ id: number; name: string; email: string }[]>([]);
  const instructorExercise = ref<InstructorExercise | null>(null);
  const traineeExercise = ref<TraineeExercise | null>(null);
  const lastSubmission = ref<Submission | null>(null);

  async function fetchList(asInstructor: boolean): Promise<void> {
    loading.value = true;
    try {
      exercises.value = asInstructor ? await trainingApi.listExercises() : await trainingApi.listMyExercises();
    } finally {
      loading.value = false;
    }
  }

  async function fetchFormData(): Promise<void> {
    const [q, t] = await Promise.all([trainingApi.listQuestions(), trainingApi.listTrainees()]);
    questions.value = q;
    trainees.value = t;
  }

  async function create(input: NewExercise): Promise<InstructorExercise> {
    const created = await trainingApi.createExercise(input);
    instructorExercise.value = created;
    return created;
  }

  async function openAsInstructor(id: number): Promise<void> {
    instructorExercise.value = await trainingApi.getExercise(id);
  }

  async function update(id: number, changes: ExerciseChanges): Promise<void> {
    instructorExercise.value = await trainingApi.updateExercise(id, changes);
  }

  async function openAsTrainee(id: number): Promise<void> {
    traineeExercise.value = await trainingApi.getMyExercise(id);
    lastSubmission.value = traineeExercise.value.submissions.at(-1) ?? null;
  }

  async function submit(id: number, input: { value: number; steps: SubmissionStep[]; placement?: { lanes: LanePlacement[] } }): Promise<Submission> {
    const out = await trainingApi.submitAnswer(id, input);
    traineeExercise.value = out.assignment;
    lastSubmission.value = out.submission;
    return out.submission;
  }

  return { exercises, loading, questions, trainees, instructorExercise, traineeExercise, lastSubmission, fetchList, fetchFormData, create, openAsInstructor, update, openAsTrainee, submit };
});
