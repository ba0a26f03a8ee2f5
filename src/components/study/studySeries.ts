/**
 * What the study charts draw, from the stored points: per girder kind and effect, one line per
 * method against the swept parameter (display units), the points whose rows left a formula's
 * range (shared/findings/levels.ts 'out-of-range': out of range or fallback) as bands, and
 * the fallback points as marks. Factors are dimensionless lane fractions.
 */
import { STUDY_METHODS, type StudyKey, type StudyMethod } from '@shared/studies/pointResult';
import { toDisplay, type QuantityKind, type UnitSystem } from '@shared/units';
import type { StudyPointRow } from '@/api/studies';

export interface LineSeries {
  method: StudyMethod | 'governing';
  data: [number, number | null][];
}

export interface StudyChartData {
  lines: LineSeries[];
  /** [from, to] of the parameter (display units) where the formulas left their range. */
  bands: [number, number][];
  /** Points where the code's fallback replaced a formula: [x, governing]. */
  fallbacks: [number, number][];
  /** The point index of each x, in order (for a click). */
  indices: number[];
}

/** Contiguous runs of flagged points as bands, each widened by half a step to its neighbours. */
export function bandsOf(xs: number[], flagged: boolean[]): [number, number][] {
  const bands: [number, number][] = [];
  let start = -1;
  const edge = (i: number, side: -1 | 1) => {
    const j = i + side;
    if (j < 0 || j >= xs.length) return xs[i];
    return (xs[i] + xs[j]) / 2;
  };
  for (let i = 0; i <= xs.length; i++) {
    const on = i < xs.length && flagged[i];
    if (on && start < 0) start = i;
    if (!on && start >= 0) {
      bands.push([edge(start, -1), edge(i - 1, 1)]);
      start = -1;
    }
  }
  return bands;
}

export function chartData(points: StudyPointRow[], key: StudyKey, kind: QuantityKind, units: UnitSystem): StudyChartData {
  const rows = points.filter((p) => p.summary?.values[key]);
  const xs = rows.map((p) => toDisplay(p.values[0], kind, units));
  const lines: LineSeries[] = [];
  for (const m of STUDY_METHODS) {
    if (!rows.some((p) => p.summary!.values[key]!.byMethod[m] !== undefined)) continue;
    lines.push({ method: m, data: rows.map((p, i) => [xs[i], p.summary!.values[key]!.byMethod[m] ?? null]) });
  }
  lines.push({ method: 'governing', data: rows.map((p, i) => [xs[i], p.summary!.values[key]!.governing]) });
  const flagged = rows.map((p) => p.summary!.values[key]!.outOfRange || p.summary!.values[key]!.fallback);
  const fallbacks = rows.flatMap((p, i): [number, number][] => (p.summary!.values[key]!.fallback ? [[xs[i], p.summary!.values[key]!.governing]] : []));
  return { lines, bands: bandsOf(xs, flagged), fallbacks, indices: rows.map((p) => p.index) };
}
