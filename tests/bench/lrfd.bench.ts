/**
 * Benchmark: time to compute every code-method distribution factor of a deck
 * (computeCodeFactors: empirical formulas, lever rule, rigid section, skew, fatigue,
 * deflection, governing values; target under 1 ms per deck). Prints figures when imported;
 * asserts nothing about time.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { assertDeck, computeCodeFactors, deckFromDisplay, type Deck } from '../../shared/index.js';

function loadExample(file: string): Deck {
  const path = fileURLToPath(new URL(`../../public/examples/${file}`, import.meta.url));
  const f = JSON.parse(readFileSync(path, 'utf8')) as { units: 'US' | 'SI'; deck: unknown };
  return assertDeck(deckFromDisplay(f.deck, f.units));
}

function time(label: string, deck: Deck): void {
  for (let i = 0; i < 200; i++) computeCodeFactors(deck); // warm-up
  const runs: number[] = [];
  let rows = 0;
  for (let k = 0; k < 7; k++) {
    const n = 300;
    const t0 = performance.now();
    for (let i = 0; i < n; i++) rows = computeCodeFactors(deck).factors.length;
    runs.push((performance.now() - t0) / n);
  }
  runs.sort((a, b) => a - b);
  const median = runs[3];
  console.log(`lrfd factors  ${label.padEnd(44)} ${rows.toString().padStart(4)} rows  median ${(median * 1000).toFixed(1).padStart(7)} µs/deck  (best ${(runs[0] * 1000).toFixed(1)} µs; target < 1000 µs)`);
}

const examples = [
  ['fhwa-psc-step-5-1.deck.json', 'FHWA PSC example, 2 spans, 6 girders'],
  ['larchmont-mill-creek.deck.json', 'steel girders, 3 spans continuous, skewed'],
  ['larchmont-quarry-lane.deck.json', 'adjacent boxes, 1 span'],
] as const;
for (const [file, label] of examples) {
  try {
    time(label, loadExample(file));
  } catch (e) {
    console.log(`lrfd factors  ${label}: not run (${(e as Error).message})`);
  }
}
