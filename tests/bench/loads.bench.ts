/**
 * Benchmark: time to compute the HL-93 beam-line envelopes (moment and shear at the tenth
 * points of every span, reactions, fatigue truck; every loading of Art. 3.6.1.3.1) for a
 * three-span continuous deck (target under 20 ms) and for a simple span. Prints figures
 * when imported; asserts nothing about time.
 */
import { fromUs, hl93BeamLineEffects, type BeamModel } from '../../shared/index.js';

function time(label: string, beam: BeamModel, fatigue: boolean): void {
  for (let i = 0; i < 20; i++) hl93BeamLineEffects(beam, { fatigue }); // warm-up
  const runs: number[] = [];
  let points = 0;
  for (let k = 0; k < 7; k++) {
    const n = 20;
    const t0 = performance.now();
    for (let i = 0; i < n; i++) points = hl93BeamLineEffects(beam, { fatigue }).points.length;
    runs.push((performance.now() - t0) / n);
  }
  runs.sort((a, b) => a - b);
  console.log(
    `hl93 envelopes  ${label.padEnd(52)} ${points.toString().padStart(3)} points  median ${runs[3].toFixed(2).padStart(6)} ms  (best ${runs[0].toFixed(2)} ms; target < 20 ms)`,
  );
}

const ft = fromUs.ft;
const cases: [string, BeamModel][] = [
  ['3 spans continuous 100-130-100 ft', { spans: [ft(100), ft(130), ft(100)], continuous: true }],
  ['3 spans continuous 100-130-100 ft, EI 1:1.6:1', { spans: [ft(100), ft(130), ft(100)], continuous: true, flexuralRigidity: [1, 1.6, 1] }],
  ['simple span 110 ft', { spans: [ft(110)], continuous: false }],
];
for (const [label, beam] of cases) {
  time(`${label}, with fatigue`, beam, true);
  time(`${label}, HL-93 only`, beam, false);
}
