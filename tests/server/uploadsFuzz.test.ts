/** Malformed multipart bodies sent raw to every upload route (drawings, CSV import): random
 *  boundaries, truncation at every byte, header-only parts, missing CRLFs, huge part-header
 *  lines, wrong Content-Types and broken limits. Every answer is a 4xx in the error envelope, never a 5xx, and
 *  nothing is stored (no attachment row, no file in the attachments folder, no deck version, no
 *  audit entry). Random cases use fast-check (one fixed seed under CI; FC_SEED replays). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { existsSync, readdirSync } from 'node:fs';
import { count } from 'drizzle-orm';
import { attachments, auditLog, deckVersions } from '../../server/db/schema.js';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, send, type WorkflowContext } from './workflowHelpers.js';

let ctx: WorkflowContext;
let designer: Agent;
let projectId: number;
let deckId: number;
let csvTemplate: string;

const PDF = '%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n';

interface Part {
  name: string;
  filename?: string;
  type?: string;
  content: string;
}

interface Route {
  name: string;
  url: () => string;
  parts: () => Part[];
}

const routes: Route[] = [
  {
    name: 'drawings',
    url: () => `/api/projects/${projectId}/attachments`,
    parts: () => [
      { name: 'title', content: 'Sheet 3' },
      // Content-Type before Content-Disposition: a lost CRLF between them hides the part's name.
      { name: 'file', filename: 'sheet.pdf', type: 'application/pdf', content: PDF },
    ],
  },
  {
    name: 'CSV import',
    url: () => '/api/imports/girder-layout',
    parts: () => [
      { name: 'deckId', content: String(deckId) },
      { name: 'file', filename: 'layout.csv', type: 'text/csv', content: csvTemplate },
    ],
  },
];

function partHead(p: Part): string {
  const disposition = `Content-Disposition: form-data; name="${p.name}"${p.filename ? `; filename="${p.filename}"` : ''}`;
  return (p.type ? `Content-Type: ${p.type}\r\n` : '') + disposition + '\r\n\r\n';
}

/** A well-formed multipart/form-data body (RFC 7578). */
function body(boundary: string, parts: Part[]): string {
  return parts.map((p) => `--${boundary}\r\n${partHead(p)}${p.content}\r\n`).join('') + `--${boundary}--\r\n`;
}

/** Where the closing delimiter "--boundary--" ends: any cut before it leaves the body incomplete. */
function closeEnd(text: string, boundary: string): number {
  return text.lastIndexOf(`\r\n--${boundary}--`) + `\r\n--${boundary}--`.length;
}

/**
 * The CRLFs that frame the body: ending part-header lines, the blank line after the headers and
 * the one before each delimiter — not those inside a part's content (losing one only changes the
 * content), not the one ending the closing delimiter (optional), and not the one after an opening
 * delimiter (without it the parser skips that part as unreadable, RFC 2046 §5.1.1, so the body
 * loses a part but stays well-framed; the missing-file case is covered by the header-only test).
 */
function framingCrlfs(text: string, boundary: string, parts: Part[]): number[] {
  const inContent: [number, number][] = [];
  let from = 0;
  for (const p of parts) {
    const start = text.indexOf(partHead(p), from) + partHead(p).length;
    inContent.push([start, start + p.content.length]);
    from = start + p.content.length;
  }
  const delimiter = `--${boundary}`;
  return [...text.slice(0, closeEnd(text, boundary)).matchAll(/\r\n/g)]
    .map((m) => m.index!)
    .filter((at) => !inContent.some(([a, z]) => at >= a && at < z) && text.slice(at - delimiter.length, at) !== delimiter);
}

const MULTIPART = (b: string) => `multipart/form-data; boundary=${b}`;

/** Boundaries of RFC 2046 §5.1.1 bchars (no trailing space), 1–70 characters. */
const boundaryArb = fc.string({ unit: fc.constantFrom(...'abcXYZ0189\'()+_,-./:=?'.split('')), minLength: 1, maxLength: 70 });

function stored() {
  const dir = ctx.attachmentsDir;
  return {
    attachments: ctx.db.select({ n: count() }).from(attachments).get()!.n,
    versions: ctx.db.select({ n: count() }).from(deckVersions).get()!.n,
    audit: ctx.db.select({ n: count() }).from(auditLog).get()!.n,
    files: existsSync(dir) ? readdirSync(dir).length : 0,
  };
}

async function post(route: Route, contentType: string | null, raw: Buffer | string) {
  const req = designer.post(route.url()).set('X-CSRF-Token', designer.csrf);
  if (contentType !== null) req.set('Content-Type', contentType);
  return req.send(Buffer.isBuffer(raw) ? raw : Buffer.from(raw, 'utf8'));
}

/** A refused upload: 4xx, the envelope, a detail naming where (bad JSON aside), nothing stored. */
async function expectRefused(route: Route, contentType: string | null, raw: Buffer | string) {
  const before = stored();
  const res = await post(route, contentType, raw);
  const shown = String(raw);
  const where = `${route.name}, Content-Type ${contentType}, body ${JSON.stringify(shown.length > 400 ? `${shown.slice(0, 200)} … ${shown.slice(-200)}` : shown)}`;
  expect(res.status, where).toBeGreaterThanOrEqual(400);
  expect(res.status, where).toBeLessThan(500);
  expect(res.body, where).toMatchObject({ error: { code: expect.any(String), message: expect.any(String), details: expect.any(Array) } });
  if (res.body.error.code !== 'bad_json') {
    expect(res.body.error.details.length, where).toBeGreaterThan(0);
    for (const d of res.body.error.details) expect(d, where).toEqual({ path: expect.any(String), message: expect.any(String) });
  }
  expect(stored(), where).toEqual(before);
  return res;
}

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  projectId = (await designer.get('/api/projects')).body.projects[0].id;
  deckId = (await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'before the fuzz' })).body.deck.id;
  // Without its last CRLF, so that the CRLF before the delimiter is the body's, not the content's.
  csvTemplate = (await designer.get('/api/imports/girder-layout/template?units=US')).text.trimEnd();
});
afterAll(() => ctx.close());

describe.each(routes)('malformed multipart bodies on the $name route', (route) => {
  it('accepts the well-formed body the malformed ones are made from (so a refusal means something)', async () => {
    const before = stored();
    const res = await post(route, MULTIPART('fuzz-boundary'), body('fuzz-boundary', route.parts()));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(stored()).not.toEqual(before);
  });

  it('refuses the body truncated at every byte before its closing delimiter', async () => {
    const b = 'cut-here';
    const text = body(b, route.parts());
    const raw = Buffer.from(text, 'utf8');
    const end = Buffer.byteLength(text.slice(0, closeEnd(text, b)), 'utf8');
    for (let cut = 0; cut < end; cut++) await expectRefused(route, MULTIPART(b), raw.subarray(0, cut));
  });

  it('refuses random boundaries with random truncation', async () => {
    await fc.assert(
      fc.asyncProperty(boundaryArb, fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), async (b, at) => {
        const text = body(b, route.parts());
        await expectRefused(route, MULTIPART(`"${b}"`), text.slice(0, Math.floor(at * closeEnd(text, b))));
      }),
      { numRuns: 40 },
    );
  });

  it('refuses header-only parts (headers and no content, or no blank line after them)', async () => {
    await fc.assert(
      fc.asyncProperty(boundaryArb, fc.boolean(), fc.constantFrom('', '\r\n', '\r\n\r\n'), async (b, withClose, after) => {
        const [field, file] = route.parts();
        const head = partHead(file).replace(/\r\n\r\n$/, '\r\n');
        const text = `--${b}\r\n${partHead(field)}${field.content}\r\n--${b}\r\n${head}${after}${withClose ? `\r\n--${b}--\r\n` : ''}`;
        await expectRefused(route, MULTIPART(`"${b}"`), text);
      }),
      { numRuns: 40 },
    );
  });

  it('refuses bodies with CRLFs lost or turned into bare LFs', async () => {
    await fc.assert(
      fc.asyncProperty(boundaryArb, fc.nat(), fc.constantFrom('', '\n', '\r'), async (b, pick, replacement) => {
        const text = body(b, route.parts());
        const crlfs = framingCrlfs(text, b, route.parts());
        const at = crlfs[pick % crlfs.length];
        await expectRefused(route, MULTIPART(`"${b}"`), text.slice(0, at) + replacement + text.slice(at + 2));
      }),
      { numRuns: 60 },
    );
    const b = 'lf-only';
    await expectRefused(route, MULTIPART(b), body(b, route.parts()).replace(/\r\n/g, '\n'));
  });

  it('refuses a part header line longer than the parser allows', async () => {
    await fc.assert(
      fc.asyncProperty(boundaryArb, fc.integer({ min: 17 * 1024, max: 96 * 1024 }), fc.boolean(), async (b, size, inDisposition) => {
        const [field, file] = route.parts();
        const long = inDisposition ? `Content-Disposition: form-data; name="file"; filename="${'x'.repeat(size)}.pdf"` : `X-Padding: ${'y'.repeat(size)}\r\nContent-Disposition: form-data; name="file"; filename="a.pdf"`;
        const text = `--${b}\r\n${partHead(field)}${field.content}\r\n--${b}\r\n${long}\r\n\r\n${file.content}\r\n--${b}--\r\n`;
        await expectRefused(route, MULTIPART(`"${b}"`), text);
      }),
      { numRuns: 6 },
    );
  });

  it('names the limit a well-framed body breaks: a second file, too many parts, a long field, a file too large', async () => {
    const b = 'limits';
    const [field, file] = route.parts();
    const second = await expectRefused(route, MULTIPART(b), body(b, [field, file, { ...file, filename: 'again.pdf' }]));
    expect(second.body.error.details[0].path).toBe('file');
    const many = Array.from({ length: 25 }, (_, i) => ({ name: `extra${i}`, content: 'x' }));
    expect((await expectRefused(route, MULTIPART(b), body(b, [field, ...many, file]))).status).toBe(400);
    const long = await expectRefused(route, MULTIPART(b), body(b, [{ ...field, content: 'x'.repeat(10_001) }, file]));
    expect(long.status).toBe(413);
    expect(long.body.error.details[0].path).toBe(field.name);
    const big = await expectRefused(route, MULTIPART(b), body(b, [field, { ...file, content: file.content + ' '.repeat(21 * 1024 * 1024) }]));
    expect(big.status).toBe(413);
    expect(big.body.error.details[0].path).toBe('file');
  });

  it('refuses a well-formed body under a wrong or incomplete Content-Type', async () => {
    const text = body('right-boundary', route.parts());
    for (const type of [null, 'text/plain', 'application/octet-stream', 'application/json', 'application/x-www-form-urlencoded', 'multipart/form-data', 'multipart/form-data; boundary=', 'multipart/form-data; boundary=wrong-boundary', 'multipart/mixed; boundary=right-boundary', 'multipart/form-data; charset=utf-8']) {
      await expectRefused(route, type, text);
    }
  });
});
