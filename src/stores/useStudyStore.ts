/** The project's studies and the study open on its page (polled while it runs). */
import { defineStore } from 'pinia';
import { ref, shallowRef } from 'vue';
import * as api from '@/api/studies';
import type { NewStudy, Study, StudyPointRow } from '@/api/studies';

/** How often a running study is asked for its progress, ms. */
export const STUDY_POLL_MS = 500;

export const useStudyStore = defineStore('studies', () => {
  const list = ref<Study[]>([]);
  const listProject = ref<number | null>(null);
  const current = ref<Study | null>(null);
  const points = shallowRef<StudyPointRow[]>([]);

  async function loadList(projectId: number): Promise<void> {
    list.value = await api.listStudies(projectId);
    listProject.value = projectId;
  }
  async function create(projectId: number, input: NewStudy): Promise<Study> {
    return api.createStudy(projectId, input);
  }
  async function open(studyId: number): Promise<void> {
    const r = await api.getStudy(studyId);
    current.value = r.study;
    points.value = r.points;
  }
  async function cancel(): Promise<void> {
    if (!current.value) return;
    current.value = await api.cancelStudy(current.value.id);
  }
  async function resume(): Promise<void> {
    if (!current.value) return;
    current.value = await api.resumeStudy(current.value.id);
  }
  return { list, listProject, current, points, loadList, create, open, cancel, resume, pointDeck: api.pointDeck };
});
