/**
 * CSV exports of a deck version: the factor table (every code-method row, then the refined
 * rows of the grillage, stored with the version or computed) and the girder HL-93 LL+IM envelopes. Values are
 * written at full precision in the project's unit system (the header names each column's
 * unit), so a factor re-reads to the result's value exactly; stations and span lengths to
 * 0.001 ft or m (`lengthCell`); the last line carries the caution. Text cells that look like formulas are neutralised;
 * numbers stay numbers.
 */
import { showLengths } from '../../shared/quantities/inText.js';
import { FINDING_LEVEL_WORDS, findingLevel } from '../../shared/findings/levels.js';
import { toCsv, type CsvCell } from './csvText.js';
import { unitSymbol, toDisplay, type QuantityKind, type UnitSystem } from '../../shared/units.js';
import type { ReportData } from './reportData.js';
import { factorArticle } from '../api/reviews/versionResults.js';

export const CSV_CAUTION = '# Results are aids to a licensed engineer’s judgement; local codes, owner policies and licensed practice govern.';

function unitTag(kind: QuantityKind, units: UnitSystem): string {
  return unitSymbol(kind, units).replace('·', '_').replace('/', '_per_').replace('²', '2').replace('³', '3').replace('⁴', '4');
}

/** The table with formula-like text neutralised (see csvText.ts), then the caution line. */
function csv(rows: CsvCell[][]): string {
  return toCsv(rows) + `\r\n${JSON.stringify(CSV_CAUTION)}\r\n`;
}

/**
 * A station or a length for the CSV, in the project's unit to 0.001 ft or 0.001 m: as an
 * engineer writes stations (round-off such as 32.99999999999999 reads 33), and still a number.
 */
export function lengthCell(m: number, units: UnitSystem): number {
  return Number(toDisplay(m, 'length', units).toFixed(3)) || 0;
}

export function factorsCsv(data: ReportData): string {
  const u = data.units;
  const len = (m: number | undefined) => (m === undefined ? null : lengthCell(m, u));
  const header = ['row_id', 'girder', 'girder_number', 'effect', 'location', `span_length_${u === 'US' ? 'ft' : 'm'}`, 'lanes', 'loaded_lanes', 'method', 'value_before_skew', 'skew_factor', 'value', 'adopted', 'governing', 'article', 'findings', 'governing_load', 'bound_lanes', 'bound_percent', 'bound_meets_target'];
  const rows: CsvCell[][] = [header];
  for (const r of data.code.factors) {
    rows.push([
      r.id,
      r.girderKind,
      r.girderNumber ?? null,
      r.effect,
      r.location.description,
      len(r.location.spanLength),
      r.lanes,
      r.loadedLanes ?? null,
      r.method,
      r.baseValue,
      r.skewFactor,
      r.value,
      r.adopted,
      r.governing,
      factorArticle(r),
      r.findings.map((f) => `${FINDING_LEVEL_WORDS[findingLevel(f)]}: ${showLengths(f.message, data.units)}`).join(' | '),
      null,
      null,
      null,
      null,
    ]);
  }
  for (const g of data.refinedRows ?? []) {
    rows.push([g.id, g.girderKind, g.girderNumber ?? null, g.effect, g.location.description, len(g.location.spanLength), g.lanes, g.loadedLanes ?? null, g.method, g.baseValue, g.skewFactor, g.value, g.adopted, g.governing, data.summary.refined.source, g.findings.map((f) => `${FINDING_LEVEL_WORDS[findingLevel(f)]}: ${showLengths(f.message, data.units)}`).join(' | '), g.vehicle ?? null, g.bound?.lanes ?? null, g.bound?.percent ?? null, g.bound ? g.bound.meetsTarget : null]);
  }
  return csv(rows);
}

export function envelopesCsv(data: ReportData): string {
  const u = data.units;
  const m = unitTag('moment', u);
  const v = unitTag('force', u);
  const x = unitTag('length', u);
  const header = [
    'girder',
    'span',
    'fraction',
    `x_${x}`,
    `moment_max_${m}`,
    `moment_min_${m}`,
    `shear_max_${v}`,
    `shear_min_${v}`,
    `fatigue_moment_max_${m}`,
    `fatigue_moment_min_${m}`,
    'moment_factor',
    'negative_moment_factor',
    'shear_factor',
    'governing_loading_moment_max',
  ];
  const rows: CsvCell[][] = [header];
  for (const g of data.envelopes) {
    for (const p of g.effects.points) {
      rows.push([
        g.girder,
        p.span + 1,
        p.fraction,
        lengthCell(p.x, u),
        toDisplay(p.moment.max.value, 'moment', u),
        toDisplay(p.moment.min.value, 'moment', u),
        toDisplay(p.shear.max.value, 'force', u),
        toDisplay(p.shear.min.value, 'force', u),
        p.fatigueMoment ? toDisplay(p.fatigueMoment.max.value, 'moment', u) : null,
        p.fatigueMoment ? toDisplay(p.fatigueMoment.min.value, 'moment', u) : null,
        p.moment.max.factor,
        p.moment.min.factor,
        p.shear.max.factor,
        p.moment.max.governing,
      ]);
    }
  }
  return csv(rows);
}
