/**
 * `npm run soak [-- --seconds N --connections N]`: load the real server on loopback with
 * signed-in reads and deck-version saves (default 50 connections × 30 s each), read every
 * acknowledged save back, check the database, and print the figures. Exit code 1 when a save
 * was lost, a request failed or the database fails integrity_check.
 */
import { parseArgs } from './harness/args.js';
import { runSoak } from './soakRun.js';

const options = parseArgs(process.argv.slice(2), { seconds: 30, connections: 50, rounds: 1 });
runSoak({ ...options, signInFlood: true }).then(
  (r) => process.exit(r.ok ? 0 : 1),
  (e: unknown) => {
    console.error(e instanceof Error ? e.stack : e);
    process.exit(1);
  },
);
