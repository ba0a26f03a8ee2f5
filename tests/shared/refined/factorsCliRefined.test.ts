/**
 * The command-line tool's `--refined` option on the example deck of FHWA's prestressed-girder
 * design example (Design Step 5.1): rows of method "grillage" per girder number join the
 * factor list and table, each with its governing placement; the code rows are unchanged.
 * The placements obey the transverse rules of AASHTO LRFD Art. 3.6.1.3.1 (checked here in the
 * file's units: 12 ft lanes inside the roadway, wheel lines 6 ft apart, 2 ft inside the lane).
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { run } from '../../../server/cli/factors.js';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const example = join(root, 'public/examples/fhwa-psc-step-5-1.deck.json');

function runIn(args: string[]) {
  let out = '';
  let err = '';
  const code = run(args, (s) => (out += s), (s) => (err += s));
  return { code, out, err };
}

interface Q {
  value: number;
  unit: string;
}

describe('factors --refined', () => {
  it('adds grillage rows with their governing placements to the JSON document', () => {
    const plain = runIn([example, '--json']);
    const withRefined = runIn([example, '--json', '--refined']);
    expect(withRefined.code).toBe(0);
    // lengths inside findings and trace labels are in the file's units (shared/quantities/inText.ts): no token is left
    expect(withRefined.out).not.toContain('{{len:');
    const a = JSON.parse(plain.out) as { factors: { id: string; value: number; method: string }[] };
    const b = JSON.parse(withRefined.out) as {
      factors: { id: string; girder: number | string; method: string; value: number; lanes: string; effect: string; governing: boolean; placement?: any }[];
      refined: { method: string; segmentsPerSpan: number; designLanes: number; caution: string };
      derived: { roadwayWidth: Q; designLanes: number };
    };
    // the code rows are unchanged and come first
    a.factors.forEach((r, i) => {
      expect(b.factors[i].id).toBe(r.id);
      expect(b.factors[i].value).toBe(r.value);
    });
    const grillage = b.factors.filter((r) => r.method === 'grillage');
    // 6 girders × (2 spans × (moment one/multiple, shear one/multiple, fatigue moment, fatigue shear)
    // + negative moment at support 2 one/multiple + reactions at 3 supports one/multiple)
    expect(grillage.length).toBe(6 * (2 * 6 + 2 + 3 * 2));
    expect(b.refined.method).toBe('grillage');
    expect(b.refined.caution).toMatch(/licensed engineer/);
    for (const r of grillage) {
      expect(typeof r.girder).toBe('number');
      expect(r.governing).toBe(false);
      const p = r.placement;
      expect(p.factor).toBeRelativelyClose(r.value, 1e-12);
      expect(p.lanes.length).toBe(p.loadedLanes);
      expect(r.lanes === 'one' ? p.loadedLanes === 1 : p.loadedLanes >= 2).toBe(true);
      for (const l of p.lanes) {
        expect(l.leftEdge.unit).toBe('ft');
        expect(l.rightEdge.value - l.leftEdge.value).toBeRelativelyClose(12, 1e-9);
        expect(l.wheelLines[1].value - l.wheelLines[0].value).toBeRelativelyClose(6, 1e-9);
        expect(l.wheelLines[0].value - l.leftEdge.value).toBeGreaterThanOrEqual(2 - 1e-9);
        expect(l.rightEdge.value - l.wheelLines[1].value).toBeGreaterThanOrEqual(2 - 1e-9);
        expect([1, -1]).toContain(l.direction);
      }
      expect(p.girderEffect.unit).toBe(r.effect.includes('moment') ? 'kip·ft' : 'kip');
      expect(p.bound.lanes).toBeGreaterThanOrEqual(0);
    }
  });

  it('prints the grillage rows and a table of governing placements', () => {
    const r = runIn([example, '--refined']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/grillage/);
    expect(r.out).toMatch(/Refined analysis \(grillage/);
    expect(r.out).toMatch(/lane edges/);
    expect(r.out.match(/Caution:/g)!.length).toBe(1);
  });

  it('refuses an unknown option with the usage line', () => {
    const r = runIn([example, '--refine']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--refined/);
  });

  it('names the field the grillage lacks when it cannot model a deck, and says the code factors still can be computed', () => {
    // A cast-in-place multicell box (type d) given without the girder moment of inertia (its code formulas need only Nc).
    const file = join(root, 'public/examples/larchmont-ferry-street.deck.json');
    const plain = runIn([file]);
    expect(plain.code).toBe(0);
    const r = runIn([file, '--refined']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/grillage cannot model this deck/);
    expect(r.err).toMatch(/deck\.section\.inertia/);
  });
});

