/**
 * Hook for the sign-in flood measurement (failed sign-ins flooding while a signed-in user makes
 * cheap requests), written separately as tests/load/signInFlood.ts. When that script exists it
 * runs as its own process with the same --seconds/--connections and prints its own figures;
 * when it does not, this phase says so and is skipped.
 */
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { REPO_ROOT } from './harness/server.js';
import type { Print } from './harness/report.js';
import type { PhaseFigures } from './loadPhases.js';

const SCRIPT = resolve(REPO_ROOT, 'tests/load/signInFlood.ts');

export async function runSignInFloodPhase(options: { seconds: number; connections: number }, print: Print): Promise<PhaseFigures[]> {
  if (!existsSync(SCRIPT)) {
    print('sign-in flood phase: skipped (tests/load/signInFlood.ts is not in this tree yet)');
    return [];
  }
  print('\nsign-in flood phase (tests/load/signInFlood.ts):');
  const child = spawn(resolve(REPO_ROOT, 'node_modules/.bin/tsx'), [SCRIPT, '--seconds', String(options.seconds), '--connections', String(options.connections)], { cwd: REPO_ROOT, stdio: ['ignore', 'pipe', 'pipe'] });
  child.stdout.on('data', (b: Buffer) => b.toString().split('\n').filter(Boolean).forEach((l) => print(`  ${l}`)));
  child.stderr.on('data', (b: Buffer) => b.toString().split('\n').filter(Boolean).forEach((l) => print(`  ${l}`)));
  const code = await new Promise<number | null>((done) => child.once('exit', (c) => done(c)));
  if (code !== 0) throw new Error(`the sign-in flood phase exited with code ${code}`);
  return [];
}
