/**
 * The client as a browser receives it (issue targets: sign-in page ≤ 350 kB of compressed
 * JavaScript; the 3D canvas ready ≤ 1.5 s after opening a deck on a warm server).
 *
 * Starts the product on a fresh database with the demo firm (tests/e2e/harness.ts: the built
 * dist/, so run `npx vite build` first), drives Debian's Chromium headless and prints:
 *  - the JavaScript bytes on the wire (compressed, as sent) before the sign-in form shows;
 *  - the bytes (all kinds, and JavaScript alone) from opening a saved demo deck until its 3D
 *    view is ready, and the time that took, cold (first visit) and warm (cached assets,
 *    second visit);
 * Figures are printed, never asserted. Skipped with a line saying why when dist/ or Chromium
 * is missing.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { Page, Response } from 'playwright-core';
import { CHROMIUM_PATH, DEMO_USERS, ROOT, signIn, startHarness } from '../e2e/harness.js';

interface Tally {
  js: number;
  all: number;
  files: number;
}

/** Counts the encoded (on-the-wire) body bytes of every response the page finishes. */
function countBytes(page: Page): { tally: Tally; reset(): void; settle(): Promise<void> } {
  const tally: Tally = { js: 0, all: 0, files: 0 };
  const pending = new Set<Promise<void>>();
  page.on('response', (res: Response) => {
    const p = (async () => {
      try {
        await res.finished();
        const sizes = await res.request().sizes();
        const bytes = sizes.responseBodySize;
        tally.all += bytes;
        tally.files++;
        const type = res.headers()['content-type'] ?? '';
        if (type.includes('javascript')) tally.js += bytes;
      } catch {
        // a response the page abandoned carries no size
      }
    })();
    pending.add(p);
    void p.finally(() => pending.delete(p));
  });
  return {
    tally,
    reset() {
      tally.js = 0;
      tally.all = 0;
      tally.files = 0;
    },
    async settle() {
      await Promise.all([...pending]);
    },
  };
}

const kB = (b: number) => `${(b / 1000).toFixed(1)} kB`;

async function openDeck(page: Page, url: string): Promise<number> {
  const t0 = performance.now();
  await page.goto(url);
  await page.locator('[data-test="deck-scene"][data-ready="true"]').waitFor({ timeout: 60_000 });
  await page.locator('[data-test="scene-canvas"] canvas').waitFor({ timeout: 60_000 });
  return performance.now() - t0;
}

if (!existsSync(join(ROOT, 'dist', 'index.html'))) {
  console.log('client: skipped — no dist/ (run `npx vite build` first)');
} else if (!existsSync(CHROMIUM_PATH)) {
  console.log(`client: skipped — no Chromium at ${CHROMIUM_PATH} (apt-get install chromium, or set CHROMIUM_PATH)`);
} else {
  const h = await startHarness();
  try {
    const bytes = countBytes(h.page);
    await h.page.goto(h.url('/sign-in'));
    await h.page.locator('input[data-test="email"]').waitFor();
    await h.page.waitForLoadState('networkidle');
    await bytes.settle();
    const signInJs = bytes.tally.js;
    const signInAll = bytes.tally.all;
    await signIn(h.page, h.baseUrl, DEMO_USERS.designer);
    await h.page.waitForLoadState('networkidle');
    // The first demo deck (fresh database: deck 1). A warm-up visit fills the server's caches
    // and the browser's; the figures below are a cold-asset visit and a cached-asset visit.
    await openDeck(h.page, h.url('/decks/1'));
    await h.page.goto(h.url('/projects'));
    const cdp = await h.context.newCDPSession(h.page);
    await cdp.send('Network.enable');
    await cdp.send('Network.clearBrowserCache');
    await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
    await h.page.waitForLoadState('networkidle');
    await bytes.settle();
    bytes.reset();
    const cold = await openDeck(h.page, h.url('/decks/1'));
    await bytes.settle();
    const coldBytes = { ...bytes.tally };
    await cdp.send('Network.setCacheDisabled', { cacheDisabled: false });
    await openDeck(h.page, h.url('/decks/1'));
    await h.page.goto(h.url('/projects'));
    await h.page.waitForLoadState('networkidle');
    const warm: number[] = [];
    for (let i = 0; i < 3; i++) {
      warm.push(await openDeck(h.page, h.url('/decks/1')));
      await h.page.goto(h.url('/projects'));
      await h.page.waitForLoadState('networkidle');
    }
    warm.sort((a, b) => a - b);
    console.log('client (headless Chromium, software WebGL, loopback, gzip):');
    console.log(`  sign-in page: ${kB(signInJs)} of compressed JavaScript (target ≤ 350 kB), ${kB(signInAll)} in all`);
    console.log(
      `  open a demo deck, nothing cached: ${kB(coldBytes.js)} of JavaScript, ${kB(coldBytes.all)} in all (${coldBytes.files} responses); 3D view ready after ${cold.toFixed(0)} ms`,
    );
    console.log(`  open a demo deck, assets cached: 3D view ready after ${warm.map((t) => t.toFixed(0)).join(' / ')} ms (median ${warm[1].toFixed(0)} ms; target ≤ 1,500 ms)`);
  } finally {
    await h.stop();
  }
}
