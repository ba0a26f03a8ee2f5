import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { assertDeck, DeckInputError } from '../../../shared/deck/schema.js';
import { compositeInertia, derivedSection } from '../../../shared/deck/section.js';
import { deckFromDisplay } from '../../../shared/deck/units.js';
import { analyseLoads, buildGrillage, influenceSurfaces, PANEL_ASPECT_LIMIT, worstPanel } from '../../../shared/grillage/index.js';
import { fromUs } from '../../../shared/units.js';
import { steelDeck } from './fixtures.js';

describe('mesh of a right deck', () => {
  const deck = steelDeck({ girders: 5, spacingFt: 8, spansFt: [100] });
  const model = buildGrillage(deck);
  const mesh = model.mesh;
  const L = deck.spans[0].length;
  const S = fromUs.ft(8);

  it('has girder lines of 21 nodes (default 20 segments), two bearings per girder and skew-parallel members', () => {
    expect(model.layout).toBe('skew-parallel');
    expect(mesh.lines).toHaveLength(5);
    for (const line of mesh.lines) expect(line.nodes.length).toBe(21);
    expect(mesh.bearings).toHaveLength(10);
    expect(mesh.members.filter((m) => m.kind === 'girder')).toHaveLength(5 * 20);
    expect(mesh.members.filter((m) => m.kind === 'slab')).toHaveLength(4 * 21);
  });

  it('slab strips of each bay add up to the span (tributary widths), each with I = b·ts³/12, J = b·ts³/6, G = E/2.4', () => {
    // Grillage analogy for a slab: i = t³/12, j = t³/6 per unit width (Hambly, Bridge Deck
    // Behaviour; from memory); ν = 0.2 for concrete (AASHTO LRFD Art. 5.4.2.5)
    const Ed = derivedSection(deck).deckModulus;
    const ts = deck.slab.thickness;
    const slabs = mesh.members.filter((m) => m.kind === 'slab');
    for (let bay = 0; bay < 4; bay++) {
      const w = slabs.filter((m) => mesh.nodes[m.i].line === bay).reduce((a, m) => a + m.stripWidth, 0);
      expect(w).toBeRelativelyClose(L, 1e-12);
    }
    for (const m of slabs) {
      expect(m.EI).toBeRelativelyClose((Ed * m.stripWidth * ts ** 3) / 12, 1e-12);
      expect(m.GJ).toBeRelativelyClose((Ed / (2 * 1.2)) * ((m.stripWidth * ts ** 3) / 6), 1e-12);
    }
  });

  it('girder members carry the composite inertia of their tributary width and the slab share of torsion', () => {
    // Tributary flange width (AASHTO LRFD Art. 4.6.2.6.1): interior S, exterior S/2 + overhang.
    // E_girder = n·E_deck (Eq. 4.6.2.2.1-2). No J given: girder torsion neglected, slab share b·ts³/6.
    const ds = derivedSection(deck);
    const Eg = ds.modularRatio * ds.deckModulus;
    const ts = deck.slab.thickness;
    const Gd = ds.deckModulus / 2.4;
    const member = (g: number) => mesh.members.find((m) => m.kind === 'girder' && m.line === mesh.girderLine[g])!;
    expect(member(2).EI).toBeRelativelyClose(Eg * compositeInertia(deck, S), 1e-12);
    expect(member(0).EI).toBeRelativelyClose(Eg * compositeInertia(deck, S / 2 + deck.overhangLeft), 1e-12);
    expect(member(2).GJ).toBeRelativelyClose((Gd * S * ts ** 3) / 6, 1e-12);
    expect(model.findings.some((f) => f.code === 'girder-torsion-estimated')).toBe(true);
    const withJ = buildGrillage(steelDeck({ girders: 5, torsionIn4: 40 }));
    const mJ = withJ.mesh.members.find((m) => m.kind === 'girder' && m.line === withJ.mesh.girderLine[2])!;
    // steel girder (E ≥ 100 GPa): ν = 0.3
    expect(mJ.GJ).toBeRelativelyClose((Eg / 2.6) * fromUs.in4(40) + (Gd * S * ts ** 3) / 6, 1e-12);
    expect(withJ.findings.some((f) => f.code === 'girder-torsion-estimated')).toBe(false);
  });

  it('reports no quality finding for the default mesh, and carries a trace with articles', () => {
    expect(model.findings.filter((f) => f.severity === 'warning')).toEqual([]);
    expect(worstPanel(mesh)!.ratio).toBeLessThan(PANEL_ASPECT_LIMIT);
    expect(model.trace.length).toBeGreaterThan(4);
    for (const t of model.trace) {
      expect(t.article.length).toBeGreaterThan(0);
      expect(Number.isFinite(t.value)).toBe(true);
    }
  });
});

describe('quality findings', () => {
  it('panel aspect ratio above 5 (Art. 4.6.3.3.1) for long coarse panels', () => {
    // 200 ft span in 4 segments: 50 ft panels against 8 ft spacing, ratio 6.25
    const model = buildGrillage(steelDeck({ girders: 4, spansFt: [200] }), { segmentsPerSpan: 4 });
    const f = model.findings.find((x) => x.code === 'panel-aspect-ratio')!;
    expect(f.severity).toBe('warning');
    expect(f.article).toBe('AASHTO LRFD Art. 4.6.3.3.1');
    expect(f.values!.ratio).toBeRelativelyClose(50 / 8, 1e-9);
  });

  it('too few nodes per span', () => {
    const coarse = buildGrillage(steelDeck({ girders: 4, spansFt: [40] }), { segmentsPerSpan: 3 });
    const f = coarse.findings.find((x) => x.code === 'few-nodes-per-span')!;
    expect(f.severity).toBe('warning');
    expect(f.values!.nodes).toBe(4);
    const medium = buildGrillage(steelDeck({ girders: 4, spansFt: [40] }), { segmentsPerSpan: 6 });
    expect(medium.findings.find((x) => x.code === 'few-nodes-per-span')!.severity).toBe('info');
  });

  it('diaphragms without an inertia or geometry are refused (DeckInputError); left out by the switch; with one they join the girders', () => {
    expect(() => buildGrillage(steelDeck({ girders: 4, diaphragms: { type: 'steel-cross-frames', intermediatePerSpan: 3 } }))).toThrow(DeckInputError);
    const none = buildGrillage(steelDeck({ girders: 4, diaphragms: { type: 'steel-cross-frames', intermediatePerSpan: 3, includeInGrillage: false } }));
    expect(none.findings.some((f) => f.code === 'diaphragms-left-out')).toBe(true);
    expect(none.mesh.members.some((m) => m.kind === 'diaphragm')).toBe(false);
    for (const layout of ['skew-parallel', 'perpendicular'] as const) {
      const withI = buildGrillage(steelDeck({ girders: 4, diaphragms: { type: 'steel-cross-frames', intermediatePerSpan: 3, inertia: 4e-4 } }), { layout });
      // 3 intermediate lines + 2 support lines, 3 girder bays each
      expect(withI.mesh.members.filter((m) => m.kind === 'diaphragm')).toHaveLength(5 * 3);
    }
  });
});

describe('skew layouts', () => {
  it("'auto' keeps skew-parallel members up to 20° and turns them perpendicular above", () => {
    expect(buildGrillage(steelDeck({ skew: 20 })).layout).toBe('skew-parallel');
    expect(buildGrillage(steelDeck({ skew: -20.5 })).layout).toBe('perpendicular');
    const forced = buildGrillage(steelDeck({ skew: 45 }), { layout: 'skew-parallel' });
    expect(forced.layout).toBe('skew-parallel');
    expect(forced.findings.some((f) => f.code === 'skew-parallel-above-limit')).toBe(true);
    expect(buildGrillage(steelDeck({ skew: 10 }), { layout: 'perpendicular' }).layout).toBe('perpendicular');
  });

  it('skew-parallel members lie on the support direction; perpendicular members at right angles (or snapped within h/2)', () => {
    const skew = 15;
    const par = buildGrillage(steelDeck({ girders: 5, skew }));
    for (const m of par.mesh.members.filter((q) => q.kind === 'slab')) {
      const a = par.mesh.nodes[m.i];
      const b = par.mesh.nodes[m.j];
      expect((b.x - a.x) / (b.y - a.y)).toBeRelativelyClose(Math.tan((skew * Math.PI) / 180), 1e-9);
    }
    const deck = steelDeck({ girders: 5, skew: 40 });
    const per = buildGrillage(deck);
    const h = deck.spans[0].length / 20;
    const bearingNodes = new Set(per.mesh.bearings.map((b) => b.node));
    let perpendicular = 0;
    for (const m of per.mesh.members.filter((q) => q.kind === 'slab')) {
      const a = per.mesh.nodes[m.i];
      const b = per.mesh.nodes[m.j];
      const alongSupport = bearingNodes.has(m.i) && bearingNodes.has(m.j);
      if (alongSupport) continue;
      expect(Math.abs(b.x - a.x)).toBeLessThan(h / 2);
      if (Math.abs(b.x - a.x) < 1e-9) perpendicular++;
    }
    expect(perpendicular).toBeGreaterThan(40);
    // bearings on the skewed support lines
    for (const b of per.mesh.bearings) {
      const p = per.mesh.nodes[b.node];
      expect(p.x).toBeCloseTo(per.supportLineX(b.support, p.y), 9);
    }
  });
});

describe('simple spans and continuity', () => {
  it('simple spans: two bearings per girder at an interior support, no member across the joint; the pier reaction sums both', () => {
    const deck = steelDeck({ girders: 3, spansFt: [50, 50] });
    const model = buildGrillage(deck);
    const interior = model.mesh.bearings.filter((b) => b.support === 1);
    expect(interior).toHaveLength(6);
    const L = deck.spans[0].length;
    for (const m of model.mesh.members) {
      const a = model.mesh.nodes[m.i];
      const b = model.mesh.nodes[m.j];
      expect(a.span).toBe(b.span);
    }
    // load in span 1 only: span 2 carries nothing; reaction at support 1 equals the span-1 end reaction
    const res = analyseLoads(model, [{ x: 0.3 * L, y: 1, P: 1e5 }]);
    for (let g = 0; g < 3; g++) for (let k = 1; k < 10; k++) expect(Math.abs(res.girderMoments[g][1][k])).toBeLessThan(1e-6);
    const r1 = res.reactions.reduce((a, r) => a + r[1]!, 0);
    expect(r1).toBeRelativelyClose(0.3 * 1e5, 1e-9);
  });

  it('continuous spans: one bearing per girder per support line', () => {
    const model = buildGrillage(steelDeck({ girders: 3, spansFt: [50, 60, 50], continuous: true }));
    expect(model.mesh.bearings).toHaveLength(3 * 4);
    expect(model.mesh.lines[0].nodes.length).toBe(3 * 20 + 1);
  });

  it('edge members add a line at each deck edge; a short overhang gets none', () => {
    const model = buildGrillage(steelDeck({ girders: 4, overhangLeftFt: 3, overhangRightFt: 0.2 }), { edgeMembers: true });
    expect(model.mesh.lines.map((l) => l.kind)).toEqual(['edge', 'girder', 'girder', 'girder', 'girder']);
    expect(model.findings.some((f) => f.code === 'edge-line-skipped')).toBe(true);
    const res = analyseLoads(model, [{ x: 10, y: model.extent.yMin + 0.1, P: 1e4 }]);
    expect(res.totalReaction).toBeRelativelyClose(1e4, 1e-10);
  });
});

describe('the example decks', () => {
  // Every example deck either builds a grillage whose reactions balance a load, or is refused
  // with a typed error naming the missing field (decks without a girder moment of inertia).
  const dir = fileURLToPath(new URL('../../../public/examples/', import.meta.url));
  for (const file of readdirSync(dir).filter((f) => f.endsWith('.deck.json'))) {
    it(file, () => {
      const f = JSON.parse(readFileSync(join(dir, file), 'utf8')) as { units: 'US' | 'SI'; deck: unknown };
      const deck = assertDeck(deckFromDisplay(f.deck, f.units));
      if (deck.section.inertia === undefined) {
        expect(() => buildGrillage(deck)).toThrow(DeckInputError);
        return;
      }
      const model = buildGrillage(deck);
      const y = model.girderOffsets[1];
      const x = (model.supportLineX(0, y) + model.supportLineX(1, y)) / 2;
      expect(analyseLoads(model, [{ x, y, P: 1e5 }]).totalReaction).toBeRelativelyClose(1e5, 1e-10);
      const [s] = influenceSurfaces(model, [{ kind: 'girder-moment', girder: 1, span: 0, fraction: 0.5 }]);
      expect(s.at(x, y)).toBeGreaterThan(0);
      const { xs, ys } = s.breaks;
      expect(ys[0]).toBe(model.extent.yMin);
      expect(ys[ys.length - 1]).toBe(model.extent.yMax);
      expect(xs[0]).toBeCloseTo(model.extent.xMin, 9);
      for (let k = 1; k < xs.length; k++) expect(xs[k]).toBeGreaterThan(xs[k - 1]);
    });
  }
});
