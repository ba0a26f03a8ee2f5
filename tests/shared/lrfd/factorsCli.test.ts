/**
 * The command-line tool `npm run factors -- <deck.json> [--json]` on the example deck that
 * reproduces FHWA, "LRFD Design Example for Prestressed Concrete Girder Superstructure
 * Bridge", Design Step 5.1: the JSON document carries the published factors (interior
 * moment 0.542 / 0.796, interior shear with skew 0.782 / 0.973 to the example's rounding,
 * exterior lever rule 0.806 to the example's rounding), the derived values in the file's
 * units, and a trace naming articles. Bad files name the field and the rule, exit non-zero
 * and print no stack trace.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { run } from '../../../server/cli/factors.js';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const example = join(root, 'public/examples/fhwa-psc-step-5-1.deck.json');
const tsx = join(root, 'node_modules/.bin/tsx');
const cli = join(root, 'server/cli/factors.ts');

interface JsonRow {
  girder: string | number;
  effect: string;
  lanes: string;
  method: string;
  value: number;
  governing: boolean;
  findings: unknown[];
  location: { key: string };
  trace: { article: string }[];
}

function runIn(args: string[]) {
  let out = '';
  let err = '';
  const code = run(args, (s) => (out += s), (s) => (err += s));
  return { code, out, err };
}

describe('factors command', () => {
  it('prints a JSON document with the published factors', () => {
    const stdout = execFileSync(tsx, [cli, example, '--json'], { cwd: root, encoding: 'utf8' });
    const doc = JSON.parse(stdout) as { units: string; derived: Record<string, any>; factors: JsonRow[]; governing: any[]; caution: string; trace: unknown[] };
    expect(doc.units).toBe('US');
    expect(doc.derived.designLanes).toBe(4);
    expect(doc.derived.Kg.unit).toBe('in⁴');
    expect(Math.round(doc.derived.Kg.value)).toBe(2984704);
    const find = (girder: string, effect: string, lanes: string, method: string) =>
      doc.factors.find((r) => r.girder === girder && r.effect === effect && r.lanes === lanes && r.method === method && r.location.key === 'span1')!;
    const r3 = (x: number) => Math.round(x * 1000) / 1000;
    expect(r3(find('interior', 'moment', 'one', 'formula').value)).toBe(0.542);
    expect(r3(find('interior', 'moment', 'multiple', 'formula').value)).toBe(0.796);
    expect(Math.abs(find('interior', 'shear', 'one', 'formula').value - 0.782)).toBeLessThan(0.0006);
    expect(r3(find('interior', 'shear', 'multiple', 'formula').value)).toBe(0.973);
    expect(Math.abs(find('exterior', 'moment', 'one', 'lever-rule').value - 0.806)).toBeLessThan(0.0011);
    // Row shape of the issue: girder, effect, lanes, method, value, governing, findings.
    for (const r of doc.factors) {
      expect(['interior', 'exterior'].includes(String(r.girder)) || typeof r.girder === 'number').toBe(true);
      expect(['one', 'multiple']).toContain(r.lanes);
      expect(typeof r.value).toBe('number');
      expect(typeof r.governing).toBe('boolean');
      expect(Array.isArray(r.findings)).toBe(true);
      expect(r.trace.every((s) => s.article.length > 0)).toBe(true);
    }
    const gov = doc.governing.find((g) => g.girder === 'interior' && g.effect === 'moment' && g.location.key === 'span1');
    expect(r3(gov.value)).toBe(0.796);
    expect(doc.caution).toMatch(/licensed engineer/);
    expect(doc.trace.length).toBeGreaterThan(3);
  });

  it('prints a table without --json', () => {
    const { code, out } = runIn([example]);
    expect(code).toBe(0);
    expect(out).toMatch(/Governing factors/);
    // written as every other view writes a factor (4 decimals); FHWA Design Step 5.1 prints 0.796
    const printed = /interior\s+moment\s+span 1\s+110\.00 ft\s+(\d\.\d{4})\s/.exec(out);
    expect(printed).not.toBeNull();
    expect(Number(printed![1]).toFixed(3)).toBe('0.796');
    expect(out).toMatch(/Caution:/);
  });

  it('refuses a bad file with the field path and rule, a non-zero exit code and no stack trace', () => {
    const dir = mkdtempSync(join(tmpdir(), 'deck-'));
    const bad = join(dir, 'bad.deck.json');
    writeFileSync(bad, JSON.stringify({ units: 'US', deck: { name: 'x', sectionType: 'k', girders: { kind: 'uniform', count: 6, spacing: -2 } } }));
    const p = spawnSync(tsx, [cli, bad, '--json'], { cwd: root, encoding: 'utf8' });
    expect(p.status).toBe(1);
    expect(p.stdout).toBe('');
    expect(p.stderr).toMatch(/deck\.girders\.spacing: girder spacing must be greater than 0/);
    expect(p.stderr).not.toMatch(/\n\s+at /);
    const noUnits = join(dir, 'nounits.deck.json');
    writeFileSync(noUnits, JSON.stringify({ deck: {} }));
    const r = runIn([noUnits]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/^units: must be "US" or "SI"/);
    const notJson = join(dir, 'broken.deck.json');
    writeFileSync(notJson, '{ "units": "US", ');
    expect(runIn([notJson]).err).toMatch(/not valid JSON/);
    expect(runIn([]).code).toBe(2);
    expect(runIn([join(dir, 'missing.json')]).err).toMatch(/cannot read/);
  });

  it('reads SI deck files', () => {
    const { code, out } = runIn([join(root, 'public/examples/larchmont-quarry-lane.deck.json'), '--json']);
    expect(code).toBe(0);
    const doc = JSON.parse(out);
    expect(doc.units).toBe('SI');
    expect(doc.derived.roadwayWidth.unit).toBe('m');
    expect(doc.derived.spacings[0].value).toBeRelativelyClose(1.22, 1e-12);
  });
});
