import { describe, expect, it } from 'vitest';
import { showLengths } from '../../../shared/quantities/inText.js';
import { DeckInputError, type DeckInput } from '../../../shared/deck/schema.js';
import {
  GrillageInputError,
  GrillageMechanismError,
  analyseLoads,
  assembleGrid,
  buildGrillage,
  influenceSurfaces,
  type GridDefinition,
  type GrillageOptions,
  type GrillageResponse,
} from '../../../shared/grillage/index.js';
import { steelDeck } from './fixtures.js';

function thrown(f: () => unknown): unknown {
  try {
    f();
  } catch (e) {
    return e;
  }
  throw new Error('expected an error');
}

describe('bad input gives a typed error naming the cause', () => {
  it('an unsupported girder (every bearing of girder 3 left out)', () => {
    const e = thrown(() => buildGrillage(steelDeck({ girders: 5 }), { omitBearings: [{ girder: 2, support: 0 }, { girder: 2, support: 1 }] }));
    expect(e).toBeInstanceOf(GrillageInputError);
    expect((e as GrillageInputError).code).toBe('unsupported-girder');
    expect((e as Error).message).toMatch(/girder 3 has no bearing/);
  });

  it('an unsupported girder in one simple span', () => {
    const e = thrown(() =>
      buildGrillage(steelDeck({ girders: 4, spansFt: [60, 60] }), { omitBearings: [{ girder: 0, support: 1 }, { girder: 0, support: 2 }] }),
    ) as GrillageInputError;
    expect(e.code).toBe('unsupported-girder');
    expect(e.message).toMatch(/girder 1 has no bearing in span 2/);
  });

  it('a mechanism: every bearing of one support line left out (the deck pivots about the other)', () => {
    const e = thrown(() => buildGrillage(steelDeck({ girders: 5 }), { omitBearings: [0, 1, 2, 3, 4].map((g) => ({ girder: g, support: 1 })) }));
    expect(e).toBeInstanceOf(GrillageMechanismError);
    const m = e as GrillageMechanismError;
    expect(m.location.girder).toBeTypeOf('number');
    expect(m.location.where).toMatch(/girder \d at x = /);
    expect(['w', 'rx', 'ry']).toContain(m.location.direction);
    expect(m.message).toMatch(/is unrestrained/);
  });

  it('a mechanism: torsion removed on a skewed deck leaves end-zone girder nodes free to twist', () => {
    // perpendicular members at 40°: girder nodes in the skewed end triangles have no
    // transverse member; without torsion nothing holds their rotation about the girder axis
    const e = thrown(() => buildGrillage(steelDeck({ girders: 8, skew: 40, spansFt: [60, 60], continuous: true }), { torsionFactor: 0 })) as GrillageMechanismError;
    expect(e).toBeInstanceOf(GrillageMechanismError);
    expect(e.location.direction).toBe('rx');
    // the node's x is a length token, shown in the reader's units (shared/quantities/inText.ts)
    expect(showLengths(e.location.where, 'SI')).toMatch(/^girder \d at x = [\d.]+ m \(span \d, [\d.]+ of the span\)$/);
    expect(showLengths(e.location.where, 'US')).toMatch(/^girder \d at x = [\d.]+ ft \(span \d, [\d.]+ of the span\)$/);
  });

  it('a mechanism in a bare grid: a beam line free to twist names the node and the twist direction', () => {
    const def: GridDefinition = {
      nodes: [0, 1, 2, 3].map((k) => ({ x: 2 * k, y: 0 })),
      members: [0, 1, 2].map((k) => ({ i: k, j: k + 1, EI: 1e8, GJ: 5e7 })),
      restraints: [
        { node: 0, direction: 'w' },
        { node: 3, direction: 'w' },
      ],
    };
    const e = thrown(() => assembleGrid(def)) as GrillageMechanismError;
    expect(e).toBeInstanceOf(GrillageMechanismError);
    expect(e.location.direction).toBe('rx');
    expect(e.message).toMatch(/rotation θx about the longitudinal \(girder\) axis is unrestrained/);
    // and a beam with one support only: rigid-body rotation
    const e2 = thrown(() => assembleGrid({ ...def, restraints: [{ node: 0, direction: 'w' }, { node: 0, direction: 'rx' }] })) as GrillageMechanismError;
    expect(e2).toBeInstanceOf(GrillageMechanismError);
  });

  it('zero stiffness: a stiffness factor of 0, a member without EI, a negative GJ', () => {
    for (const [opt, field] of [
      [{ transverseStiffnessFactor: 0 }, 'transverseStiffnessFactor'],
      [{ transverseStiffnessFactor: -2 }, 'transverseStiffnessFactor'],
      [{ torsionFactor: -1 }, 'torsionFactor'],
      [{ edgeMembers: { inertia: 0 } }, 'edgeMembers.inertia'],
    ] as [GrillageOptions, string][]) {
      const e = thrown(() => buildGrillage(steelDeck(), opt)) as GrillageInputError;
      expect(e).toBeInstanceOf(GrillageInputError);
      expect(e.path).toEqual(['grillage', field]);
    }
    const grid: GridDefinition = {
      nodes: [{ x: 0, y: 0 }, { x: 3, y: 0 }],
      members: [{ i: 0, j: 1, EI: 0, GJ: 1 }],
      restraints: [],
    };
    const e = thrown(() => assembleGrid(grid)) as GrillageInputError;
    expect(e.code).toBe('zero-stiffness');
    expect(e.path).toEqual(['grid', 'members', 0, 'EI']);
    const e2 = thrown(() => assembleGrid({ ...grid, members: [{ i: 0, j: 1, EI: 1, GJ: -1 }] })) as GrillageInputError;
    expect(e2.code).toBe('zero-stiffness');
    const e3 = thrown(() => assembleGrid({ ...grid, members: [{ i: 0, j: 1, EI: Number.NaN, GJ: 1 }] })) as GrillageInputError;
    expect(e3.code).toBe('zero-stiffness');
  });

  it('a degenerate mesh: bad densities, coincident nodes, members to missing nodes', () => {
    for (const segmentsPerSpan of [0, 2.5, Number.NaN, 5000, -3]) {
      const e = thrown(() => buildGrillage(steelDeck(), { segmentsPerSpan })) as GrillageInputError;
      expect(e).toBeInstanceOf(GrillageInputError);
      expect(e.path).toEqual(['grillage', 'segmentsPerSpan']);
    }
    const coincident: GridDefinition = {
      nodes: [{ x: 1, y: 1 }, { x: 1, y: 1 }],
      members: [{ i: 0, j: 1, EI: 1e8, GJ: 1e7 }],
      restraints: [],
    };
    expect((thrown(() => assembleGrid(coincident)) as GrillageInputError).code).toBe('degenerate-mesh');
    expect((thrown(() => assembleGrid({ ...coincident, members: [{ i: 0, j: 5, EI: 1, GJ: 1 }] })) as GrillageInputError).code).toBe('degenerate-mesh');
    expect((thrown(() => assembleGrid({ ...coincident, nodes: [{ x: 0, y: Number.NaN }, { x: 1, y: 1 }] })) as GrillageInputError).code).toBe('degenerate-mesh');
    // girders a hair apart, a span a hair long: the deck's physical ranges refuse them before
    // the mesher is reached (shared/deck/limits.ts), naming the same fields
    const close = thrown(() => buildGrillage(steelDeck({ offsetsFt: [0, 0.0001, 8, 16] }))) as DeckInputError;
    expect(close).toBeInstanceOf(DeckInputError);
    expect(close.path).toEqual(['girders', 'offsets', 1]);
    const short = thrown(() => buildGrillage(steelDeck({ spansFt: [60, 0.5] }))) as DeckInputError;
    expect(short).toBeInstanceOf(DeckInputError);
    expect(short.path).toEqual(['spans', 1, 'length']);
  });

  it('a deck the mesher cannot build: support lines that cross, a section without I, an invalid deck', () => {
    const e = thrown(() => buildGrillage(steelDeck({ girders: 5, spansFt: [20], skew: [60, -60] }))) as GrillageInputError;
    expect(e.code).toBe('unbuildable-deck');
    expect(e.path).toEqual(['supports', 1, 'skew']);
    expect(e.message).toMatch(/support lines 1 and 2 meet or cross/);
    // a box-beam deck (type b) needs only the depth for the formulas, but the grillage needs I
    const base = steelDeck();
    const boxInput: DeckInput = { ...base, sectionType: 'b', section: { depth: 1.2 } };
    const e2 = thrown(() => buildGrillage(boxInput as never)) as DeckInputError;
    expect(e2).toBeInstanceOf(DeckInputError);
    expect(e2.path).toEqual(['section', 'inertia']);
    const e3 = thrown(() => buildGrillage({ ...base, spans: [] } as never)) as DeckInputError;
    expect(e3).toBeInstanceOf(DeckInputError);
  });

  it('an extreme skew is refused quickly instead of meshing for ever', () => {
    const t0 = Date.now();
    const e = thrown(() => buildGrillage(steelDeck({ girders: 5, skew: 89.999 }))) as GrillageInputError;
    expect(e.code).toBe('mesh-too-large');
    expect(Date.now() - t0).toBeLessThan(2000);
    expect((thrown(() => buildGrillage(steelDeck({ girders: 40, spacingFt: 6, spansFt: [100, 100, 100, 100, 100, 100] }), { segmentsPerSpan: 1000 })) as GrillageInputError).code).toBe(
      'mesh-too-large',
    );
  });

  it('other bad options name their field', () => {
    for (const [opt, field] of [
      [{ layout: 'diagonal' }, 'layout'],
      [{ skewParallelLimit: 95 }, 'skewParallelLimit'],
      [{ maxNodes: 2.5 }, 'maxNodes'],
      [{ edgeMembers: 'yes' }, 'edgeMembers'],
      [{ omitBearings: [{ girder: 9, support: 0 }] }, 'omitBearings'],
      [{ girderPoisson: 0.7 }, 'girderPoisson'],
      [{ pivotTolerance: 0 }, 'pivotTolerance'],
    ] as [GrillageOptions, string][]) {
      const e = thrown(() => buildGrillage(steelDeck(), opt)) as GrillageInputError;
      expect(e).toBeInstanceOf(GrillageInputError);
      expect(e.path[1]).toBe(field);
    }
  });

  it('responses and loads that do not exist', () => {
    const model = buildGrillage(steelDeck({ girders: 4, spansFt: [60, 60] }), { omitBearings: [{ girder: 1, support: 1 }] });
    const bad: [GrillageResponse, string][] = [
      [{ kind: 'girder-moment', girder: 4, span: 0, fraction: 0.5 }, 'girder'],
      [{ kind: 'girder-moment', girder: 0, span: 2, fraction: 0.5 }, 'span'],
      [{ kind: 'girder-moment', girder: 0, span: 0, fraction: 1.5 }, 'fraction'],
      [{ kind: 'girder-moment', girder: 0, span: 0, fraction: Number.NaN }, 'fraction'],
      [{ kind: 'girder-shear', girder: 0, support: 0, side: 'left' }, 'side'],
      [{ kind: 'girder-shear', girder: 0, support: 2, side: 'right' }, 'side'],
      [{ kind: 'reaction', girder: 1, support: 1 }, 'support'],
      [{ kind: 'reaction', girder: 0, support: 3 }, 'support'],
      [{ kind: 'torque', girder: 0 } as unknown as GrillageResponse, 'kind'],
    ];
    for (const [r, field] of bad) {
      const e = thrown(() => influenceSurfaces(model, [r])) as GrillageInputError;
      expect(e.code).toBe('invalid-response');
      expect(e.path).toEqual(['responses', 0, field]);
    }
    const off = thrown(() => analyseLoads(model, [{ x: -5, y: 1, P: 1 }])) as GrillageInputError;
    expect(off.code).toBe('invalid-load');
    expect((thrown(() => analyseLoads(model, [{ x: 5, y: 1, P: Number.NaN }])) as GrillageInputError).code).toBe('invalid-load');
    const [s] = influenceSurfaces(model, [{ kind: 'girder-moment', girder: 0, span: 0, fraction: 0.5 }]);
    expect(() => s.at(Number.POSITIVE_INFINITY, 1)).toThrow(RangeError);
  });

  it('never NaN: a very soft slab and a very stiff one give finite results', () => {
    for (const f of [1e-6, 1e6]) {
      const model = buildGrillage(steelDeck({ girders: 5, skew: 30 }), { transverseStiffnessFactor: f });
      const res = analyseLoads(model, [{ x: 15, y: 3, P: 1e5 }]);
      for (const v of [...res.girderMoments.flat(2), ...res.displacements, ...res.reactions.flat().map((r) => r ?? 0)]) {
        expect(Number.isFinite(v)).toBe(true);
      }
      expect(res.totalReaction).toBeRelativelyClose(1e5, 1e-8);
    }
  });
});
