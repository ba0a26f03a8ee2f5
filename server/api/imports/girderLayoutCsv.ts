/**
 * CSV import of a girder layout and the girder section properties.
 *
 * One row per girder, a header row first. Columns (each quantity in US customary or SI units,
 * named by its suffix; either spelling, not both):
 *   girder                               required: 1, 2, 3 … in order (girder 1 = left exterior)
 *   spacing_ft | spacing_m               required: centre-to-centre distance from the previous
 *                                        girder (> 0); blank for girder 1
 *   area_in2 | area_m2                   optional section properties of the girder alone:
 *   inertia_in4 | inertia_m4               A, I, centroid depth from the girder's top, d, J, b, eg
 *   centroid_from_top_in | centroid_from_top_m
 *   depth_in | depth_m
 *   torsion_in4 | torsion_m4
 *   width_in | width_m
 *   eg_in | eg_m
 * The deck model holds one section for all girders (the formulas of AASHTO LRFD Art. 4.6.2.2
 * are written for girders of about equal stiffness), so section values are given on girder 1's
 * row; on later rows a cell is blank or repeats girder 1's value.
 *
 * Every problem is reported at once, naming the row (as a spreadsheet numbers it: the header is
 * row 1), the column and the rule; each value is checked against its physical range
 * (shared/deck/limits.ts) before anything is computed. A file with any problem imports nothing.
 * Output values are internal SI (m, m², m⁴).
 */
import Papa from 'papaparse';
import { toCsv } from '../../reports/csvText.js';
import { fromUs } from '../../../shared/units.js';
import type { SectionProperties } from '../../../shared/deck/schema.js';
import { formatBound, PHYSICAL_LIMITS, type PhysicalRange } from '../../../shared/deck/limits.js';

export type SectionField = 'area' | 'inertia' | 'centroidFromTop' | 'depth' | 'torsion' | 'width' | 'eg';

interface ColumnDef {
  field: 'girder' | 'spacing' | SectionField;
  us?: { name: string; toSi: (v: number) => number };
  si?: { name: string };
  plain?: string;
  label: string;
}

const COLUMNS: ColumnDef[] = [
  { field: 'girder', plain: 'girder', label: 'girder number' },
  { field: 'spacing', us: { name: 'spacing_ft', toSi: fromUs.ft }, si: { name: 'spacing_m' }, label: 'spacing from the previous girder' },
  { field: 'area', us: { name: 'area_in2', toSi: fromUs.in2 }, si: { name: 'area_m2' }, label: 'girder area A' },
  { field: 'inertia', us: { name: 'inertia_in4', toSi: fromUs.in4 }, si: { name: 'inertia_m4' }, label: 'girder moment of inertia I' },
  { field: 'centroidFromTop', us: { name: 'centroid_from_top_in', toSi: fromUs.in }, si: { name: 'centroid_from_top_m' }, label: 'centroid depth from the girder top' },
  { field: 'depth', us: { name: 'depth_in', toSi: fromUs.in }, si: { name: 'depth_m' }, label: 'girder depth d' },
  { field: 'torsion', us: { name: 'torsion_in4', toSi: fromUs.in4 }, si: { name: 'torsion_m4' }, label: 'torsional inertia J' },
  { field: 'width', us: { name: 'width_in', toSi: fromUs.in }, si: { name: 'width_m' }, label: 'beam width b' },
  { field: 'eg', us: { name: 'eg_in', toSi: fromUs.in }, si: { name: 'eg_m' }, label: 'eg' },
];

export const SECTION_FIELDS: SectionField[] = ['area', 'inertia', 'centroidFromTop', 'depth', 'torsion', 'width', 'eg'];

/** Column name of a field in a unit system. */
export function columnName(field: ColumnDef['field'], units: 'US' | 'SI'): string {
  const c = COLUMNS.find((x) => x.field === field)!;
  return c.plain ?? (units === 'US' ? c.us!.name : c.si!.name);
}

export interface CsvProblem {
  /** Spreadsheet row (header = 1), or null for a problem with the file or a column. */
  row: number | null;
  column: string | null;
  message: string;
}

export interface ParsedLayout {
  /** Girder offsets from girder 1, m. */
  offsets: number[];
  /** Spacings, m. */
  spacings: number[];
  /** Section properties given, internal SI. */
  section: Partial<Pick<SectionProperties, SectionField>>;
  /** The column name used for each field, for error messages later on. */
  columnOf: Partial<Record<ColumnDef['field'], string>>;
  rows: number;
}

/** The physical range of each column's quantity. */
const RANGE_OF: Record<'spacing' | SectionField, PhysicalRange> = {
  spacing: PHYSICAL_LIMITS.girderSpacing,
  area: PHYSICAL_LIMITS.girderArea,
  inertia: PHYSICAL_LIMITS.girderInertia,
  torsion: PHYSICAL_LIMITS.torsion,
  centroidFromTop: PHYSICAL_LIMITS.sectionDimension,
  depth: PHYSICAL_LIMITS.sectionDimension,
  width: PHYSICAL_LIMITS.sectionDimension,
  eg: PHYSICAL_LIMITS.sectionDimension,
};

/** The rule a positive value in internal units breaks, or null when it is within range. */
function outOfRange(field: 'spacing' | SectionField, si: number): string | null {
  const r = RANGE_OF[field];
  if (si < r.min) return `must be at least ${formatBound(r.min, r.kind)}`;
  if (!(si <= r.max)) return `must be at most ${formatBound(r.max, r.kind)}`;
  return null;
}

function fmt(v: number): string {
  return Number.isInteger(v) ? String(v) : String(Number(v.toPrecision(8)));
}

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** Parse the CSV text; returns the layout or every problem found. */
export function parseGirderLayoutCsv(text: string): { ok: true; layout: ParsedLayout } | { ok: false; problems: CsvProblem[] } {
  const problems: CsvProblem[] = [];
  const clean = text.replace(/^\uFEFF/, '');
  if (clean.trim() === '') return { ok: false, problems: [{ row: null, column: null, message: 'the file is empty: it needs a header row and one row per girder' }] };
  const parsed = Papa.parse<string[]>(clean, { header: false, skipEmptyLines: false, delimitersToGuess: [',', ';', '\t'] });
  for (const e of parsed.errors) {
    if (e.code === 'UndetectableDelimiter') continue;
    problems.push({ row: typeof e.row === 'number' ? e.row + 1 : null, column: null, message: `the CSV cannot be read: ${e.message}` });
  }
  const lines = parsed.data;
  const header = (lines[0] ?? []).map((h) => h.trim().toLowerCase());
  // Header: every column known, each quantity once.
  const index = new Map<ColumnDef['field'], { col: number; name: string; toSi: (v: number) => number }>();
  header.forEach((name, col) => {
    if (name === '') {
      problems.push({ row: 1, column: `column ${col + 1}`, message: `row 1, column ${col + 1}: the header cell is empty` });
      return;
    }
    const def = COLUMNS.find((c) => c.plain === name || c.us?.name === name || c.si?.name === name);
    if (!def) {
      const known = COLUMNS.flatMap((c) => (c.plain ? [c.plain] : [c.us!.name, c.si!.name])).join(', ');
      problems.push({ row: 1, column: name, message: `row 1, column ${name}: unknown column (known columns: ${known})` });
      return;
    }
    const prev = index.get(def.field);
    if (prev) {
      problems.push({ row: 1, column: name, message: `row 1, column ${name}: the ${def.label} is already given in column ${prev.name}; give it once` });
      return;
    }
    const toSi = def.plain ? (v: number) => v : def.us!.name === name ? def.us!.toSi : (v: number) => v;
    index.set(def.field, { col, name, toSi });
  });
  for (const required of ['girder', 'spacing'] as const) {
    if (!index.has(required)) {
      const names = required === 'girder' ? 'girder' : 'spacing_ft (or spacing_m)';
      problems.push({ row: null, column: required === 'girder' ? 'girder' : 'spacing_ft', message: `column ${names} is missing: the header row must name it` });
    }
  }
  const body = lines.slice(1).map((cells, i) => ({ cells, row: i + 2 })).filter((r) => r.cells.some((c) => c.trim() !== ''));
  if (body.length < 2) problems.push({ row: null, column: null, message: `the file has ${body.length} girder row${body.length === 1 ? '' : 's'}: a deck needs at least 2 girders` });
  if (body.length > 40) problems.push({ row: null, column: null, message: `the file has ${body.length} girder rows: at most 40 girders` });
  if (problems.some((p) => p.row === 1 || p.row === null)) return { ok: false, problems };

  const cell = (r: { cells: string[] }, field: ColumnDef['field']) => (r.cells[index.get(field)!.col] ?? '').trim();
  const numberAt = (r: { cells: string[]; row: number }, field: ColumnDef['field']): number | null | undefined => {
    const raw = cell(r, field);
    if (raw === '') return null;
    const name = index.get(field)!.name;
    if (!NUMBER.test(raw)) {
      problems.push({ row: r.row, column: name, message: `row ${r.row}, column ${name}: “${raw.slice(0, 40)}” is not a number (use a point for decimals, no units or thousands separators)` });
      return undefined;
    }
    return Number(raw);
  };

  const spacings: number[] = [];
  const section: ParsedLayout['section'] = {};
  const firstSection = new Map<SectionField, number>();
  body.forEach((r, i) => {
    const extra = r.cells.length - header.length;
    if (extra > 0 && r.cells.slice(header.length).some((c) => c.trim() !== '')) {
      problems.push({ row: r.row, column: null, message: `row ${r.row}: ${extra} more cell${extra === 1 ? '' : 's'} than the header has columns` });
    }
    const g = numberAt(r, 'girder');
    if (g === null) problems.push({ row: r.row, column: 'girder', message: `row ${r.row}, column girder: the girder number is missing` });
    else if (g !== undefined && g !== i + 1) problems.push({ row: r.row, column: 'girder', message: `row ${r.row}, column girder: expected girder ${i + 1} (girders are numbered 1, 2, 3 … in order from the left), got ${fmt(g)}` });

    const spacingCol = index.get('spacing')!;
    const s = numberAt(r, 'spacing');
    if (i === 0) {
      if (s !== null && s !== undefined) problems.push({ row: r.row, column: spacingCol.name, message: `row ${r.row}, column ${spacingCol.name}: leave it blank for girder 1 (the spacing is measured from the previous girder)` });
    } else if (s === null) {
      problems.push({ row: r.row, column: spacingCol.name, message: `row ${r.row}, column ${spacingCol.name}: the spacing from girder ${i} is missing` });
    } else if (s !== undefined) {
      const rule = s > 0 ? outOfRange('spacing', spacingCol.toSi(s)) : 'must be greater than 0';
      if (rule) problems.push({ row: r.row, column: spacingCol.name, message: `row ${r.row}, column ${spacingCol.name}: the spacing ${rule} (got ${fmt(s)})` });
      else spacings.push(spacingCol.toSi(s));
    }

    for (const field of SECTION_FIELDS) {
      const col = index.get(field);
      if (!col) continue;
      const v = numberAt(r, field);
      if (v === undefined) continue;
      if (i === 0) {
        if (v === null) {
          problems.push({ row: r.row, column: col.name, message: `row ${r.row}, column ${col.name}: give girder 1's value (later rows may leave it blank)` });
        } else if (!(v > 0) || outOfRange(field, col.toSi(v))) {
          const rule = v > 0 ? outOfRange(field, col.toSi(v)) : 'must be greater than 0';
          problems.push({ row: r.row, column: col.name, message: `row ${r.row}, column ${col.name}: ${rule} (got ${fmt(v)})` });
        } else {
          firstSection.set(field, v);
          section[field] = col.toSi(v);
        }
      } else if (v !== null && firstSection.has(field)) {
        const v1 = firstSection.get(field)!;
        if (Math.abs(v - v1) > 1e-9 * Math.max(1, Math.abs(v1))) {
          problems.push({
            row: r.row,
            column: col.name,
            message: `row ${r.row}, column ${col.name}: ${fmt(v)} differs from girder 1's ${fmt(v1)}; the deck holds one section for all girders (the formulas of Art. 4.6.2.2 assume girders of about equal stiffness): leave it blank or repeat girder 1's value`,
          });
        }
      }
    }
  });
  if (problems.length) return { ok: false, problems };
  const offsets = [0];
  for (const s of spacings) offsets.push(offsets[offsets.length - 1] + s);
  const columnOf: ParsedLayout['columnOf'] = {};
  for (const [field, c] of index) columnOf[field] = c.name;
  return { ok: true, layout: { offsets, spacings, section, columnOf, rows: body.length } };
}

/** The downloadable template: header and example rows of an invented six-girder deck. */
export function girderLayoutTemplate(units: 'US' | 'SI'): string {
  const cols = ['girder', 'spacing', 'area', 'inertia', 'centroidFromTop', 'depth'] as const;
  const header = cols.map((c) => columnName(c, units));
  const first = units === 'US' ? ['1', '', '767', '545894', '35.4', '72'] : ['1', '', '0.49484', '0.22722', '0.8992', '1.8288'];
  const spacing = units === 'US' ? '9.6667' : '2.9464';
  const rows = [header, first];
  for (let g = 2; g <= 6; g++) rows.push([String(g), spacing, '', '', '', '']);
  return toCsv(rows) + '\r\n';
}
