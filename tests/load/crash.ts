/**
 * `npm run crash [-- --rounds N --seconds N --connections N]`: SIGKILL the real server while
 * deck saves run (3 rounds by default) and during a PDF export, restart it on the same
 * database each time, and print what survived. Exit code 1 when an acknowledged save is
 * missing or different, the database fails integrity_check or the export is broken after.
 */
import { parseArgs } from './harness/args.js';
import { runCrash } from './crashRun.js';

const options = parseArgs(process.argv.slice(2), { seconds: 3, connections: 8, rounds: 3 });
runCrash(options).then(
  (r) => process.exit(r.ok ? 0 : 1),
  (e: unknown) => {
    console.error(e instanceof Error ? e.stack : e);
    process.exit(1);
  },
);
