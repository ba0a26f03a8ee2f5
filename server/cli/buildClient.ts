/**
 * Builds the client only when its sources changed since the last build: `npm start` and
 * `npm run demo` call this before serving, so a restart with nothing changed skips the
 * 6–8 s Vite build. The sources' fingerprint (SHA-256 of every file's path and bytes under
 * src/, shared/ and public/, plus index.html, the Vite and TypeScript configurations and the
 * lock file) is kept in dist/.source-hash, written only after a successful build.
 *
 * Usage: tsx server/cli/buildClient.ts [--force]
 */
import { createHash } from 'node:crypto';
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';

const ROOT = resolve(import.meta.dirname, '../..');
const DIST = join(ROOT, 'dist');
const HASH_FILE = join(DIST, '.source-hash');
const SOURCE_DIRS = ['src', 'shared', 'public'];
const SOURCE_FILES = ['index.html', 'vite.config.ts', 'tsconfig.json', 'tsconfig.app.json', 'package-lock.json'];

/** Every source file, sorted, as paths relative to the repository root. */
function sourceFiles(): string[] {
  const files: string[] = [];
  for (const dir of SOURCE_DIRS) {
    const abs = join(ROOT, dir);
    if (!existsSync(abs)) continue;
    for (const entry of readdirSync(abs, { recursive: true, withFileTypes: true })) {
      if (entry.isFile()) files.push(relative(ROOT, join(entry.parentPath, entry.name)));
    }
  }
  for (const f of SOURCE_FILES) if (existsSync(join(ROOT, f))) files.push(f);
  return files.sort();
}

/** The fingerprint of the client's sources. */
export function sourceHash(): string {
  const h = createHash('sha256');
  for (const f of sourceFiles()) {
    h.update(`${f}\0${statSync(join(ROOT, f)).size}\0`);
    h.update(readFileSync(join(ROOT, f)));
  }
  return h.digest('hex');
}

function main() {
  const force = process.argv.includes('--force');
  const hash = sourceHash();
  const built = existsSync(join(DIST, 'index.html')) && existsSync(HASH_FILE) && readFileSync(HASH_FILE, 'utf8').trim() === hash;
  if (built && !force) {
    console.log('Client is up to date (sources unchanged since the last build).');
    return;
  }
  console.log(force ? 'Building the client (forced)…' : 'Building the client (sources changed or no build yet)…');
  const r = spawnSync(join(ROOT, 'node_modules/.bin/vite'), ['build'], { cwd: ROOT, stdio: 'inherit' });
  if (r.status !== 0) {
    console.error(`The client build failed (exit ${r.status ?? r.signal}); see the messages above.`);
    process.exit(1);
  }
  writeFileSync(HASH_FILE, `${hash}\n`);
}

main();
