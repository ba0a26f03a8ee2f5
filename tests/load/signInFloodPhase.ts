/**
 * Hook for the sign-in flood measurement (failed sign-ins flooding while a signed-in user makes
 * cheap requests), written separately as tests/load/signInFlood.ts. When that script exists it
 * runs as its own process (its own server and database, its own 50 flood connections) with the
 * same --seconds and prints its own figures; when it does not, this phase says so and is skipped.
 */
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { REPO_ROOT } from './harness/server.js';
import type { Print } from './harness/report.js';

export interface SignInFloodOutcome {
  ran: boolean;
  /** The script's exit code (0: it ran to the end); null when skipped. */
  exitCode: number | null;
}

const SCRIPT = resolve(REPO_ROOT, 'tests/load/signInFlood.ts');

export async function runSignInFloodPhase(options: { seconds: number }, print: Print): Promise<SignInFloodOutcome> {
  if (!existsSync(SCRIPT)) {
    print('sign-in flood phase: skipped (tests/load/signInFlood.ts is not in this tree yet)');
    return { ran: false, exitCode: null };
  }
  print('\nsign-in flood phase (tests/load/signInFlood.ts):');
  const child = spawn(resolve(REPO_ROOT, 'node_modules/.bin/tsx'), [SCRIPT, '--seconds', String(options.seconds)], { cwd: REPO_ROOT, stdio: ['ignore', 'pipe', 'pipe'] });
  child.stdout.on('data', (b: Buffer) => b.toString().split('\n').filter(Boolean).forEach((l) => print(`  ${l}`)));
  child.stderr.on('data', (b: Buffer) => b.toString().split('\n').filter(Boolean).forEach((l) => print(`  ${l}`)));
  const code = await new Promise<number | null>((done) => child.once('exit', (c) => done(c)));
  if (code !== 0) print(`sign-in flood phase: FAILED (exit code ${code})`);
  return { ran: true, exitCode: code };
}
