/** Words of the study screens. */
import type { StudyState } from '@/api/studies';

export const STUDY_STATE_WORDS: Record<StudyState, string> = {
  running: 'running',
  done: 'finished',
  cancelled: 'cancelled',
  interrupted: 'interrupted (can resume)',
};
