/**
 * The workspace solver worker's work, measured in Node on the same code the worker runs
 * (src/workers/solverCore.ts): the analysis (code factors, grillage, beam line), the
 * influence surfaces of every girder's moment and shear, every governing placement, and the
 * drag path — one evaluation of every girder's share for a placement (the recomputation of
 * one drag frame; target under 2 ms). Figures are printed, never asserted.
 */
import { SolverSession, type StudyEffect } from '../../src/workers/solverCore';
import { deckFromDisplay } from '../../shared/deck/units.js';
import type { LanePlacement } from '../../shared/placement/rules.js';
import { quarryCreekDeck } from '../fixtures/decks.js';

/** An invented twelve-girder steel deck (US display units), seven design lanes. */
const twelveGirders = deckFromDisplay(
  {
    name: 'Twelve-girder bench deck',
    sectionType: 'a',
    girders: { kind: 'uniform', count: 12, spacing: 8 },
    overhangLeft: 3,
    overhangRight: 3,
    barrierLeft: { width: 1.5, height: 34 },
    barrierRight: { width: 1.5, height: 34 },
    slab: { thickness: 8, haunch: 1.5, wearingSurface: 0 },
    section: { area: 56, inertia: 24000, centroidFromTop: 27, depth: 50.1, torsion: 15 },
    materials: { deck: { kind: 'concrete', fc: 4, unitWeight: 0.15, K1: 1, modulusEquation: 'current' }, girder: { kind: 'modulus', modulus: 29000 } },
    spans: [{ length: 100 }],
    continuous: false,
    supports: [{ skew: 15 }, { skew: 15 }],
    diaphragms: { type: 'steel-cross-frames', atSupports: true, intermediatePerSpan: 3, topChordArea: 3.75, bottomChordArea: 3.75, diagonalArea: 2.86, frameDepth: 40 },
  },
  'US',
);

/** An invented three-span continuous deck (US display units). */
const threeSpans = deckFromDisplay(
  {
    name: 'Three-span bench deck',
    sectionType: 'a',
    girders: { kind: 'uniform', count: 5, spacing: 10 },
    overhangLeft: 3.5,
    overhangRight: 3.5,
    barrierLeft: { width: 1.5, height: 34 },
    barrierRight: { width: 1.5, height: 34 },
    slab: { thickness: 8.5, haunch: 2, wearingSurface: 0 },
    section: { area: 74.5, inertia: 47332, centroidFromTop: 34.64, depth: 62.375, torsion: 24.5 },
    materials: { deck: { kind: 'concrete', fc: 4, unitWeight: 0.15, K1: 1, modulusEquation: 'current' }, girder: { kind: 'modulus', modulus: 29000 } },
    spans: [{ length: 120 }, { length: 150 }, { length: 120 }],
    continuous: true,
    supports: [{ skew: 0 }, { skew: 0 }, { skew: 0 }, { skew: 0 }],
    diaphragms: { type: 'steel-cross-frames', atSupports: true, intermediatePerSpan: 4, topChordArea: 3.75, bottomChordArea: 3.75, diagonalArea: 2.86, frameDepth: 50 },
  },
  'US',
);

function stats(samples: number[]): { median: number; p95: number; max: number } {
  const s = [...samples].sort((a, b) => a - b);
  return { median: s[Math.floor(s.length / 2)], p95: s[Math.floor(s.length * 0.95)], max: s[s.length - 1] };
}

async function run(label: string, deck: unknown, segmentsPerSpan?: number): Promise<void> {
  const session = new SolverSession();
  const t0 = performance.now();
  const a = await session.analyse(deck, { segmentsPerSpan });
  const t1 = performance.now();
  const study = await session.study(0, 'design truck');
  const t2 = performance.now();
  const all = await session.governingAll();
  const t3 = performance.now();
  const refined = session.refinedComparison();
  if (!a.grillage) throw new Error(`${label}: the grillage was not built (${a.grillageError})`);
  console.log(
    `${label}: ${a.girderCount} girders, ${a.rules.laneCount} design lanes, ${a.grillage.segmentsPerSpan} segments per span, ${a.grillage.stats.unknowns} unknowns — ` +
      `analysis ${(t1 - t0).toFixed(0)} ms (code ${a.timings.codeMs.toFixed(1)}, grillage ${a.timings.grillageMs.toFixed(0)}, beam line ${a.timings.beamLineMs.toFixed(0)}), ` +
      `surfaces of the studied span ${(t2 - t1).toFixed(0)} ms, ${all.length} governing placements ${(t3 - t2).toFixed(0)} ms, ` +
      `refined run of every girder, effect and span ${refined.elapsedMs.toFixed(0)} ms`,
  );
  for (const k of [1, a.rules.laneCount]) {
    const lanes: LanePlacement[] = [];
    for (let i = 0; i < k; i++) {
      lanes.push({ left: a.rules.curbLeft + i * a.rules.laneWidth, wheelOffset: a.rules.wheelToLaneEdge, ...study.beamLinePosition.moment });
    }
    for (const effect of ['moment', 'shear'] as StudyEffect[]) {
      for (let i = 0; i < 300; i++) session.evaluate(lanes, effect);
      const samples: number[] = [];
      for (let i = 0; i < 2000; i++) {
        // A drag: the first lane moves a little every frame.
        const moved = lanes.map((l, j) => (j === 0 ? { ...l, left: l.left + ((i % 50) / 50) * 0.3 } : l));
        const s = performance.now();
        session.evaluate(moved, effect);
        samples.push(performance.now() - s);
      }
      const st = stats(samples);
      console.log(
        `  drag frame, ${k} loaded lane${k === 1 ? '' : 's'}, ${effect}: every girder's share in ${st.median.toFixed(3)} ms (median), ` +
          `${st.p95.toFixed(3)} ms (95th percentile), ${st.max.toFixed(3)} ms (max)`,
      );
    }
  }
}

await run('Quarry Creek (precast, one 110 ft span, 20° skew)', quarryCreekDeck());
await run('Twelve girders (one 100 ft span, 15° skew)', twelveGirders);
await run('Three continuous spans (120–150–120 ft)', threeSpans);
await run('Quarry Creek, fine mesh (80 segments per span)', quarryCreekDeck(), 80);
