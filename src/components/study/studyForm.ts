/**
 * The new-study form's state in the project's units, and its sweep in internal units
 * (shared/studies/sweep.ts). Values the user types are read with the app's own parser
 * (useUnits parseInput); a value that is not a number is reported with its field.
 */
import { STUDY_PARAMETER_INFO, type StudyParameter, type SweepInput, type StudyGrillage } from '@shared/studies/sweep';
import type { UnitSystem } from '@shared/units';
import { parseInput } from '@/composables/useUnits';

export interface AxisDraft {
  parameter: StudyParameter;
  mode: 'range' | 'list';
  from: string;
  to: string;
  step: string;
  list: string;
}

export interface StudyDraft {
  name: string;
  deckId: number | undefined;
  versionNumber: number | undefined;
  axes: AxisDraft[];
  grillage: StudyGrillage;
}

export const emptyAxis = (parameter: StudyParameter = 'skew'): AxisDraft => ({ parameter, mode: 'range', from: '', to: '', step: '', list: '' });

/** The sweep the draft describes, or the first problem in words (field and rule). */
export function draftSweep(d: StudyDraft, units: UnitSystem): { ok: true; sweep: SweepInput } | { ok: false; message: string } {
  const axes: SweepInput['axes'] = [];
  for (const [i, a] of d.axes.entries()) {
    const kind = STUDY_PARAMETER_INFO[a.parameter].kind;
    const where = `parameter ${i + 1}`;
    const read = (text: string, what: string) => {
      const v = parseInput(text, kind, units);
      if (v === undefined || Number.isNaN(v)) throw new Error(`${where}: ${what} must be a number`);
      return v;
    };
    try {
      if (a.mode === 'range') axes.push({ parameter: a.parameter, values: { kind: 'range', from: read(a.from, 'from'), to: read(a.to, 'to'), step: read(a.step, 'step') } });
      else axes.push({ parameter: a.parameter, values: { kind: 'list', values: a.list.split(/[;,\s]+/).filter(Boolean).map((t) => read(t, 'each listed value')) } });
    } catch (e) {
      return { ok: false, message: (e as Error).message };
    }
  }
  return { ok: true, sweep: { axes, grillage: d.grillage } };
}
