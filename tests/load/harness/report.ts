/** Plain-text figures for the load and crash scripts. */
import type { PhaseFigures } from '../loadPhases.js';

export type Print = (line: string) => void;

export function printPhaseTable(print: Print, phases: PhaseFigures[]): void {
  const head = ['phase'.padEnd(42), 'requests', ' non-2xx', '  errors', 'timeouts', ' p50 ms', ' p99 ms', ' max ms', '  req/s'];
  print(head.join(' '));
  for (const p of phases) {
    const cells = [p.phase.padEnd(42), String(p.requests).padStart(8), String(p.non2xx).padStart(8), String(p.errors).padStart(8), String(p.timeouts).padStart(8), String(p.p50).padStart(7), String(p.p99).padStart(7), String(p.max).padStart(7), p.perSecond.toFixed(0).padStart(7)];
    print(cells.join(' '));
  }
}
