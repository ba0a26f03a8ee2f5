/**
 * Command-line tool: validate a deck file and print its code-method distribution factors.
 *
 *   npm run factors -- <deck.json> [--json] [--refined]
 *
 * The deck file is JSON: { "units": "US" | "SI", "deck": { …deck fields… } } (the deck
 * fields may also sit beside "units" at the top level). Values are in the display units of
 * the stated system (US: ft, in, in², in⁴, ksi, kcf; SI: m, mm, mm², mm⁴, MPa, kN/m³).
 * Without --json it prints the governing factors, every factor row and the findings; with
 * --json a document { deck, units, caution, derived, factors, governing, findings, trace }.
 * --refined adds the grillage analysis: rows of method "grillage" per girder number in the
 * factor list (and table), and the governing placement of each (lane edges, wheel lines,
 * axle positions, the effect, the factor, the stated bound), in the document's `refined`.
 * A bad file prints each offending field path and rule and exits with code 1 (2 for a
 * usage error); no stack trace is printed.
 */
import { showLengths } from '../../shared/quantities/inText.js';
import { factorText } from '../../shared/lrfd/words.js';
import type { TraceStep } from '../../shared/trace.js';
import { readFileSync } from 'node:fs';
import {
  assertDeck,
  computeCodeFactors,
  computeRefinedFactors,
  deckFromDisplay,
  DeckInputError,
  refinedEffectKind,
  toDisplay,
  unitSymbol,
  type CodeFactorResult,
  type FactorRow,
  type QuantityKind,
  type RefinedResult,
  type UnitSystem,
  WHEEL_GAUGE,
} from '../../shared/index.js';

class CliError extends Error {
  constructor(
    message: string,
    readonly exitCode: number,
  ) {
    super(message);
  }
}

interface DeckFile {
  units: UnitSystem;
  deck: unknown;
  /** Prefix of field paths in messages ("deck." for the wrapped form). */
  prefix: string;
}

export function readDeckFile(text: string): DeckFile {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    throw new CliError(`the file is not valid JSON: ${(e as Error).message}`, 1);
  }
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) {
    throw new CliError('the file must hold one JSON object: { "units": "US" | "SI", "deck": { … } }', 1);
  }
  const obj = raw as Record<string, unknown>;
  const units = obj.units;
  if (units !== 'US' && units !== 'SI') {
    throw new CliError(`units: must be "US" or "SI" (the unit system the deck's values are written in), not ${JSON.stringify(units)}`, 1);
  }
  if ('deck' in obj) {
    const extra = Object.keys(obj).filter((k) => k !== 'units' && k !== 'deck');
    if (extra.length > 0) throw new CliError(`${extra[0]}: unknown top-level field (expected only "units" and "deck")`, 1);
    return { units, deck: obj.deck, prefix: 'deck.' };
  }
  const { units: _u, ...deck } = obj;
  void _u;
  return { units, deck, prefix: '' };
}

function parseArgs(argv: string[]): { file: string; json: boolean; refined: boolean } {
  const json = argv.includes('--json');
  const refined = argv.includes('--refined');
  const rest = argv.filter((a) => a !== '--json' && a !== '--refined');
  const unknown = rest.find((a) => a.startsWith('-'));
  if (unknown) throw new CliError(`unknown option ${unknown}\nusage: npm run factors -- <deck.json> [--json] [--refined]`, 2);
  if (rest.length !== 1) throw new CliError('usage: npm run factors -- <deck.json> [--json] [--refined]', 2);
  return { file: rest[0], json, refined };
}

function disp(value: number, kind: QuantityKind, units: UnitSystem, digits = 3): string {
  const v = toDisplay(value, kind, units);
  const sym = unitSymbol(kind, units);
  return `${Math.abs(v) >= 1e5 ? Math.round(v).toLocaleString('en-US') : v.toFixed(digits)}${sym ? ` ${sym}` : ''}`;
}

function quantity(value: number | undefined, kind: QuantityKind, units: UnitSystem) {
  if (value === undefined) return undefined;
  return { value: toDisplay(value, kind, units), unit: unitSymbol(kind, units) };
}

/** The governing placement behind one grillage row, in the file's units. */
function placementJson(refined: RefinedResult, index: number, units: UnitSystem) {
  const src = refined.rowSources[index];
  const f = refined.factors[src.factorIndex];
  const kind: QuantityKind = refinedEffectKind(f);
  const c = f.byLaneCount.find((b) => b.loadedLanes === src.loadedLanes)!;
  return {
    response: f.label,
    vehicle: refined.rows[index].vehicle ?? c.vehicle,
    loadedLanes: c.loadedLanes,
    multiplePresence: c.multiplePresence,
    factor: c.factor,
    girderEffect: quantity(c.girderEffect, kind, units),
    beamLineEffect: quantity(f.beamLineEffect, kind, units),
    bound: { lanes: f.tolerance.factor, statement: f.tolerance.text },
    lanes: c.placement.lanes.map((l) => ({
      leftEdge: quantity(l.left, 'length', units),
      rightEdge: quantity(l.left + refined.designLaneWidth, 'length', units),
      wheelOffset: quantity(l.wheelOffset, 'length', units),
      wheelLines: [quantity(l.left + l.wheelOffset, 'length', units), quantity(l.left + l.wheelOffset + (refined.wheelGauge ?? WHEEL_GAUGE), 'length', units)],
      frontAxleAt: quantity(l.frontAxleAt, 'length', units),
      direction: l.direction,
      axleSpacing: quantity(l.axleSpacing, 'length', units),
    })),
  };
}

/** Findings with their lengths in the file's units (shared/quantities/inText.ts). */
function findingsIn<F extends { message: string }>(findings: readonly F[], units: UnitSystem): F[] {
  return findings.map((f) => ({ ...f, message: showLengths(f.message, units) }));
}

/** Trace steps with the lengths and quantities of their labels, formulas, input descriptions and notes in the file's units. */
function traceIn(steps: readonly TraceStep[], units: UnitSystem): TraceStep[] {
  return steps.map((s) => ({
    ...s,
    label: showLengths(s.label, units),
    formula: showLengths(s.formula, units),
    inputs: s.inputs.map((i) => (i.description === undefined ? i : { ...i, description: showLengths(i.description, units) })),
    ...(s.note !== undefined ? { note: showLengths(s.note, units) } : {}),
  }));
}

export function jsonDocument(result: CodeFactorResult, units: UnitSystem, refined?: RefinedResult) {
  const d = result.derived;
  const grillageRows = refined
    ? refined.rows.map((r, i) => ({
        girder: r.girder,
        effect: r.effect,
        lanes: r.lanes,
        method: r.method,
        value: r.value,
        governing: false,
        findings: findingsIn(r.findings, units),
        id: r.id,
        girderNumber: r.girderNumber,
        loadedLanes: r.loadedLanes,
        location: { ...r.location, spanLength: quantity(r.location.spanLength, 'length', units) },
        baseValue: r.baseValue,
        skewFactor: r.skewFactor,
        adopted: false,
        trace: traceIn(r.trace, units),
        placement: placementJson(refined, i, units),
      }))
    : [];
  return {
    deck: result.deckName,
    sectionType: result.sectionType,
    units,
    caution: result.caution,
    derived: {
      formulaFamily: d.family,
      girderCount: d.girderCount,
      girderOffsets: d.offsets.map((o) => quantity(o, 'length', units)),
      spacings: d.spacings.map((s) => quantity(s, 'length', units)),
      interiorSpacing: quantity(d.interiorSpacing, 'length', units),
      deckWidth: quantity(d.deckWidth, 'length', units),
      roadwayWidth: quantity(d.roadwayWidth, 'length', units),
      designLanes: d.designLanes,
      designLaneWidth: quantity(d.designLaneWidth, 'length', units),
      deLeft: quantity(d.deLeft, 'length', units),
      deRight: quantity(d.deRight, 'length', units),
      deckModulus: quantity(d.deckModulus, 'stress', units),
      girderModulus: quantity(d.girderModulus, 'stress', units),
      modularRatio: d.modularRatio,
      eg: quantity(d.eg, 'dimension', units),
      Kg: quantity(d.Kg, 'inertia', units),
      spans: d.spans.map((s) => quantity(s, 'length', units)),
      skews: d.skews,
      continuous: d.continuous,
      symmetric: d.symmetric,
    },
    factors: [
      ...result.factors.map((r) => ({
      girder: r.girder,
      effect: r.effect,
      lanes: r.lanes,
      method: r.method,
      value: r.value,
      governing: r.governing,
      findings: findingsIn(r.findings, units),
      id: r.id,
      girderNumber: r.girderNumber,
      loadedLanes: r.loadedLanes,
      location: { ...r.location, spanLength: quantity(r.location.spanLength, 'length', units) },
      baseValue: r.baseValue,
      skewFactor: r.skewFactor,
      adopted: r.adopted,
      trace: traceIn(r.trace, units),
      leverRule: r.leverRule,
      rigidSection: r.rigidSection,
      })),
      ...grillageRows,
    ],
    governing: result.governing.map((g) => ({ ...g, location: { ...g.location, spanLength: quantity(g.location.spanLength, 'length', units) } })),
    findings: findingsIn(result.findings, units),
    trace: traceIn(result.trace, units),
    ...(refined
      ? {
          refined: {
            method: 'grillage',
            layout: refined.layout,
            segmentsPerSpan: refined.segmentsPerSpan,
            mesh: refined.mesh,
            stations: refined.stations,
            designLanes: refined.designLanes,
            findings: findingsIn(refined.findings, units),
            trace: traceIn(refined.trace, units),
            caution: refined.caution,
          },
        }
      : {}),
  };
}

function pad(s: string, n: number): string {
  return s.length >= n ? s : s + ' '.repeat(n - s.length);
}

function table(head: string[], body: string[][]): string {
  const widths = head.map((h, i) => Math.max(h.length, ...body.map((r) => r[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => pad(c, widths[i])).join('  ').trimEnd();
  return [line(head), widths.map((w) => '-'.repeat(w)).join('  '), ...body.map(line)].join('\n');
}

function girderText(r: Pick<FactorRow, 'girder' | 'girderNumber' | 'girderKind'>): string {
  return typeof r.girder === 'number' ? `${r.girderKind} ${r.girder}` : r.girder;
}

/** The refined section of the text report: governing placement of each grillage row. */
function refinedText(refined: RefinedResult, units: UnitSystem): string[] {
  const out: string[] = [];
  out.push(`Refined analysis (grillage, ${refined.layout} transverse members, ${refined.segmentsPerSpan} segments per span, ${refined.mesh.nodes} nodes): governing placements`);
  const len = (v: number) => disp(v, 'length', units, 2);
  out.push(
    table(
      ['girder', 'effect', 'location', 'lanes', 'factor', 'bound', 'vehicle', 'lane edges', 'wheel lines', 'front axle, travel, rear spacing'],
      refined.rows.map((r, i) => {
        const src = refined.rowSources[i];
        const f = refined.factors[src.factorIndex];
        const c = f.byLaneCount.find((b) => b.loadedLanes === src.loadedLanes)!;
        return [
          String(r.girder),
          r.effect,
          r.location.description,
          `${r.lanes} (${c.loadedLanes})`,
          factorText(r.value),
          `±${f.tolerance.factor.toFixed(4)}`,
          r.vehicle ?? c.vehicle,
          c.placement.lanes.map((l) => `${len(l.left)}–${len(l.left + refined.designLaneWidth)}`).join('; '),
          c.placement.lanes.map((l) => `${len(l.left + l.wheelOffset)}, ${len(l.left + l.wheelOffset + (refined.wheelGauge ?? WHEEL_GAUGE))}`).join('; '),
          c.placement.lanes
            .map((l) => `${len(l.frontAxleAt as number)} ${l.direction === 1 ? '→' : '←'}${l.axleSpacing !== undefined ? ` ${len(l.axleSpacing)}` : ''}`)
            .join('; '),
        ];
      }),
    ),
  );
  out.push('Lane edges and wheel lines: y from girder 1, positive right; front axle: x along girder 1 from support line 1 (→ travelling up-station).');
  if (refined.findings.length) {
    out.push('Findings of the refined analysis');
    for (const f of refined.findings) out.push(`  - [${f.code}] ${showLengths(f.message, units)}`);
  }
  return out;
}

export function textReport(result: CodeFactorResult, units: UnitSystem, refined?: RefinedResult): string {
  const d = result.derived;
  const out: string[] = [];
  out.push(`Deck: ${result.deckName}`);
  out.push(`Section type ${result.sectionType} (${d.family}); ${d.girderCount} girders; ${d.designLanes} design lane(s) on a ${disp(d.roadwayWidth, 'length', units, 2)} roadway`);
  const spacing = d.uniformSpacing ? disp(d.spacings[0], 'length', units) : d.spacings.map((s) => disp(s, 'length', units)).join(', ');
  out.push(`Spacing ${spacing}; de left ${disp(d.deLeft, 'length', units)}, right ${disp(d.deRight, 'length', units)}; n = ${d.modularRatio.toFixed(3)}`);
  if (d.eg !== undefined) out.push(`eg = ${disp(d.eg, 'dimension', units)}; Kg = ${d.Kg !== undefined ? disp(d.Kg, 'inertia', units, 0) : '—'}`);
  out.push(`Spans ${d.spans.map((s) => disp(s, 'length', units, 2)).join(', ')} (${d.continuous ? 'continuous' : 'simple'}); skews ${d.skews.map((s) => `${s}°`).join(', ')}`);
  out.push('');
  out.push('Governing factors');
  out.push(
    table(
      ['girder', 'effect', 'location', 'L', 'value', 'from'],
      result.governing.map((g) => [
        g.girder,
        g.effect,
        g.location.description,
        g.location.spanLength !== undefined ? disp(g.location.spanLength, 'length', units, 2) : '',
        factorText(g.value),
        g.reason,
      ]),
    ),
  );
  out.push('');
  out.push('All factor rows (* governing, + adopted for its lane case)');
  out.push(
    table(
      ['', 'girder', 'effect', 'location', 'lanes', 'method', 'before skew', 'skew', 'value'],
      [...result.factors, ...(refined?.rows ?? [])].map((r) => [
        r.governing ? '*' : r.adopted ? '+' : '',
        girderText(r),
        r.effect,
        r.location.description,
        r.loadedLanes !== undefined && r.method !== 'formula' ? `${r.lanes} (${r.loadedLanes})` : r.lanes,
        r.method,
        factorText(r.baseValue),
        factorText(r.skewFactor),
        factorText(r.value),
      ]),
    ),
  );
  out.push('');
  out.push('Findings');
  if (result.findings.length === 0) out.push('  none');
  for (const f of result.findings) out.push(`  - [${f.code}] ${showLengths(f.message, units)} (${f.article})`);
  if (refined) {
    out.push('');
    out.push(...refinedText(refined, units));
  }
  out.push('');
  out.push(`Caution: ${result.caution}`);
  return out.join('\n');
}

/** Run the tool; returns the exit code. Output goes through the two writers. */
export function run(argv: string[], write: (s: string) => void, writeError: (s: string) => void): number {
  try {
    const { file, json, refined: withRefined } = parseArgs(argv);
    let text: string;
    try {
      text = readFileSync(file, 'utf8');
    } catch (e) {
      throw new CliError(`cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`, 1);
    }
    const df = readDeckFile(text);
    let result: CodeFactorResult;
    let refined: RefinedResult | undefined;
    try {
      const deck = assertDeck(deckFromDisplay(df.deck, df.units));
      result = computeCodeFactors(deck);
      if (withRefined) {
        try {
          refined = computeRefinedFactors(deck);
        } catch (e) {
          if (e instanceof DeckInputError) {
            const lines = e.issues.map((i) => `  ${df.prefix}${i.path.join('.') || '(deck)'}: ${showLengths(i.message, df.units)}`);
            throw new CliError(`${file}: the code factors can be computed (run without --refined), but the grillage cannot model this deck\n${lines.join('\n')}`, 1);
          }
          throw e;
        }
      }
    } catch (e) {
      if (e instanceof CliError) throw e;
      if (e instanceof DeckInputError) {
        const lines = e.issues.map((i) => `  ${df.prefix}${i.path.join('.') || '(deck)'}: ${i.message}`);
        throw new CliError(`${file}: the deck is not valid\n${lines.join('\n')}`, 1);
      }
      throw e;
    }
    write(json ? JSON.stringify(jsonDocument(result, df.units, refined), null, 2) : textReport(result, df.units, refined));
    return 0;
  } catch (e) {
    if (e instanceof CliError) {
      writeError(e.message);
      return e.exitCode;
    }
    writeError(`error: ${(e as Error).message ?? String(e)}`);
    return 1;
  }
}

const isMain = process.argv[1] !== undefined && /factors\.[cm]?[jt]s$/.test(process.argv[1]);
if (isMain) {
  const code = run(
    process.argv.slice(2),
    (s) => process.stdout.write(s + '\n'),
    (s) => process.stderr.write(s + '\n'),
  );
  process.exitCode = code;
}
