/** How the built client and the API travel: compressed when the browser accepts it, hashed
 *  assets cached for a year, index.html revalidated on every load (so a new release is seen at
 *  once). A stand-in dist folder holds an index.html and one hashed asset. */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demo, makeTestApp, signIn, type TestContext } from './helpers.js';

let ctx: TestContext;
let dist: string;
const asset = `export const words = ${JSON.stringify('distribution factor '.repeat(500))};\n`;

beforeAll(async () => {
  dist = mkdtempSync(join(tmpdir(), 'deckshare-dist-'));
  mkdirSync(join(dist, 'assets'));
  writeFileSync(join(dist, 'index.html'), `<!doctype html><title>Deckshare</title><script type="module" src="/assets/index-AbCd1234.js"></script>${' '.repeat(2000)}`);
  writeFileSync(join(dist, 'assets', 'index-AbCd1234.js'), asset);
  ctx = await makeTestApp({ clientDist: dist });
});
afterAll(async () => {
  await ctx.close();
  rmSync(dist, { recursive: true, force: true });
});

describe('client delivery', () => {
  it('sends a hashed asset gzip-compressed, cached for a year as immutable', async () => {
    const res = await request(ctx.app).get('/assets/index-AbCd1234.js').set('Accept-Encoding', 'gzip');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.text).toBe(asset);
  });

  it('sends it plain to a client that does not accept compression', async () => {
    const res = await request(ctx.app).get('/assets/index-AbCd1234.js').set('Accept-Encoding', 'identity');
    expect(res.headers['content-encoding']).toBeUndefined();
    expect(Number(res.headers['content-length'])).toBe(Buffer.byteLength(asset));
  });

  it('revalidates index.html (and the single-page fallback) on every load', async () => {
    for (const path of ['/', '/projects/12']) {
      const res = await request(ctx.app).get(path).set('Accept-Encoding', 'gzip');
      expect(res.status, path).toBe(200);
      expect(res.headers['cache-control'], path).toBe('no-cache');
      expect(res.text).toContain('<title>Deckshare</title>');
    }
  });

  it('compresses large API answers, not small ones', async () => {
    const designer = await signIn(ctx.app, demo.designer);
    const projectId = (await designer.get('/api/projects')).body.projects[0].id;
    const deckId = (await designer.get(`/api/projects/${projectId}/decks`)).body.decks[0].id;
    const version = await designer.get(`/api/decks/${deckId}/versions/1`).set('Accept-Encoding', 'gzip');
    expect(version.status).toBe(200);
    expect(version.headers['content-encoding']).toBe('gzip');
    expect(version.body.version.deck.name).toBeTruthy();
    const health = await request(ctx.app).get('/api/health').set('Accept-Encoding', 'gzip');
    expect(health.headers['content-encoding']).toBeUndefined(); // under the 1 kB threshold
  });
});
