/** Drawings attached to projects: type from the content, size limit, random names outside the
 *  web root, downloads for the project's firm only, deletion audited. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, otherFirm, send, type WorkflowContext } from './workflowHelpers.js';
import { detectDrawingType, MAX_ATTACHMENT_BYTES } from '../../server/api/attachments/attachmentStore.js';

let ctx: WorkflowContext;
let designer: Agent;
let reviewer: Agent;
let trainee: Agent;
let outsider: Agent;
let projectId: number;

// The smallest valid files of each kind (signatures: PDF 1.7 "%PDF-", PNG 8-byte signature of
// the PNG specification §5.2, JPEG SOI marker FF D8 followed by a marker FF).
const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');
const PNG = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010806000000', 'hex');
const JPEG = Buffer.from('ffd8ffe000104a46494600010100000100010000ffd9', 'hex');

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  reviewer = await signIn(ctx.app, demo.reviewer);
  trainee = await signIn(ctx.app, demo.trainee);
  outsider = await otherFirm(ctx);
  projectId = (await designer.get('/api/projects')).body.projects[0].id;
});
afterAll(() => ctx.close());

const upload = (a: Agent, content: Buffer, filename: string, contentType = 'application/octet-stream', title?: string) => {
  const req = a.post(`/api/projects/${projectId}/attachments`).set('X-CSRF-Token', a.csrf);
  if (title) req.field('title', title);
  return req.attach('file', content, { filename, contentType });
};

describe('drawings', () => {
  it('detects the type from the first bytes', () => {
    expect(detectDrawingType(PDF)).toBe('application/pdf');
    expect(detectDrawingType(PNG)).toBe('image/png');
    expect(detectDrawingType(JPEG)).toBe('image/jpeg');
    expect(detectDrawingType(Buffer.from('GIF89a'))).toBeNull();
    expect(detectDrawingType(Buffer.from('%PD'))).toBeNull();
  });

  it('stores PDF, PNG and JPEG under random names outside the web root; the firm downloads them', async () => {
    const pdf = await upload(designer, PDF, 'General arrangement.pdf', 'application/pdf', 'General arrangement, sheet 1');
    expect(pdf.status).toBe(201);
    expect(pdf.body.attachment).toMatchObject({ title: 'General arrangement, sheet 1', originalName: 'General arrangement.pdf', contentType: 'application/pdf', sizeBytes: PDF.length });
    // The browser's claimed type is ignored: a PNG sent as "application/pdf" is stored as a PNG.
    const png = await upload(reviewer, PNG, 'section.png', 'application/pdf');
    expect(png.body.attachment.contentType).toBe('image/png');
    const jpg = await upload(designer, JPEG, '../../etc/site photo.jpg', 'image/jpeg');
    expect(jpg.body.attachment.originalName).toBe('site photo.jpg');

    const files = readdirSync(ctx.attachmentsDir);
    expect(files).toHaveLength(3);
    for (const f of files) expect(f).toMatch(/^[0-9a-f]{32}$/);
    expect(ctx.attachmentsDir.startsWith(ctx.config.clientDist)).toBe(false);

    const list = await trainee.get(`/api/projects/${projectId}/attachments`);
    expect(list.body.attachments.map((a: { originalName: string }) => a.originalName)).toEqual(['site photo.jpg', 'section.png', 'General arrangement.pdf']);
    const dl = await trainee.get(pdf.body.attachment.downloadUrl).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(dl.status).toBe(200);
    expect(dl.headers['content-type']).toBe('application/pdf');
    expect(dl.headers['content-disposition']).toContain('attachment; filename="General arrangement.pdf"');
    expect(dl.headers['x-content-type-options']).toBe('nosniff');
    expect(Buffer.compare(dl.body as Buffer, PDF)).toBe(0);
    expect(readFileSync(join(ctx.attachmentsDir, files.find((f) => readFileSync(join(ctx.attachmentsDir, f)).equals(PDF))!)).equals(PDF)).toBe(true);
  });

  it('refuses other content, empty and oversized files, and a missing file field', async () => {
    const html = await upload(designer, Buffer.from('<html><script>alert(1)</script></html>'), 'drawing.pdf', 'application/pdf');
    expect(html.status).toBe(400);
    expect(html.body.error.details).toEqual([{ path: 'file', message: 'the content is not a PDF, PNG or JPEG file (checked from its first bytes, not its name)' }]);
    expect((await upload(designer, Buffer.alloc(0), 'empty.pdf')).status).toBe(400);
    const big = Buffer.concat([PDF, Buffer.alloc(MAX_ATTACHMENT_BYTES)]);
    const tooBig = await upload(designer, big, 'huge.pdf');
    expect(tooBig.status).toBe(413);
    expect(tooBig.body.error.message).toBe('file: a drawing may be at most 20 MB');
    const none = await designer.post(`/api/projects/${projectId}/attachments`).set('X-CSRF-Token', designer.csrf).field('title', 'x');
    expect(none.status).toBe(400);
    expect(none.body.error.details[0].path).toBe('file');
    const longTitle = await upload(designer, PNG, 'a.png', 'image/png', 'x'.repeat(201));
    expect(longTitle.body.error.details[0]).toEqual({ path: 'body.title', message: 'title must be at most 200 characters' });
    // Nothing refused was written to the attachments folder.
    expect(readdirSync(ctx.attachmentsDir)).toHaveLength(3);
  });

  it('roles and firms: trainees cannot upload or delete; another firm gets 404', async () => {
    expect((await upload(trainee, PNG, 'a.png')).status).toBe(403);
    const list = (await designer.get(`/api/projects/${projectId}/attachments`)).body.attachments;
    const id = list[0].id;
    expect((await send.del(trainee, `/api/attachments/${id}`)).status).toBe(403);
    expect((await send.del(reviewer, `/api/attachments/${id}`)).status).toBe(403);
    expect((await outsider.get(`/api/attachments/${id}/download`)).status).toBe(404);
    expect((await outsider.get(`/api/projects/${projectId}/attachments`)).status).toBe(404);
    expect((await send.del(outsider, `/api/attachments/${id}`)).status).toBe(404);
    const theirs = await outsider.post(`/api/projects/${projectId}/attachments`).set('X-CSRF-Token', outsider.csrf).attach('file', PNG, 'x.png');
    expect(theirs.status).toBe(404);
    expect((await request(ctx.app).get(`/api/attachments/${id}/download`)).status).toBe(401);
  });

  it('deletes the row and the file, audited', async () => {
    const list = (await designer.get(`/api/projects/${projectId}/attachments`)).body.attachments;
    const before = readdirSync(ctx.attachmentsDir).length;
    expect((await send.del(designer, `/api/attachments/${list[0].id}`)).status).toBe(204);
    expect(readdirSync(ctx.attachmentsDir)).toHaveLength(before - 1);
    expect((await designer.get(`/api/attachments/${list[0].id}/download`)).status).toBe(404);
    const audit = (await designer.get(`/api/projects/${projectId}/audit`)).body.entries.filter((e: { entityType: string }) => e.entityType === 'attachment');
    expect(audit.map((e: { action: string }) => e.action)).toEqual(['delete', 'upload', 'upload', 'upload']);
    expect(audit[0].summary).toBe(`deleted drawing “${list[0].title}” (${list[0].originalName})`);
    expect(existsSync(ctx.attachmentsDir)).toBe(true);
  });

  it('keeps a UTF-8 file name as the browser sent it: upload, list, download header', async () => {
    // Browsers send the name's UTF-8 bytes in filename="…" (WHATWG HTML, multipart/form-data
    // encoding); the download names it in RFC 6266 / RFC 5987 filename*=UTF-8'' with an ASCII fallback.
    const name = 'ü-ñ-橋梁-🦀.pdf';
    const up = await upload(designer, PDF, name, 'application/pdf');
    expect(up.status).toBe(201);
    expect(up.body.attachment).toMatchObject({ originalName: name, title: name });
    const list = (await reviewer.get(`/api/projects/${projectId}/attachments`)).body.attachments;
    expect(list.find((a: { id: number }) => a.id === up.body.attachment.id).originalName).toBe(name);
    const dl = await reviewer.get(up.body.attachment.downloadUrl);
    expect(dl.status).toBe(200);
    const header = dl.headers['content-disposition'];
    expect(header).toBe(`attachment; filename="u-n-__-_.pdf"; filename*=UTF-8''%C3%BC-%C3%B1-%E6%A9%8B%E6%A2%81-%F0%9F%A6%80.pdf`);
    expect(decodeURIComponent(/filename\*=UTF-8''(.+)$/.exec(header)![1])).toBe(name);
    const audit = (await designer.get(`/api/projects/${projectId}/audit`)).body.entries[0];
    expect(audit.summary).toContain(`(${name}, application/pdf`);
  });
});

describe('file names', () => {
  it('a file name keeps its letters but loses bidirectional overrides and control characters (stored NFC)', async () => {
    // "plan\u202Efdp.exe" would read as "planexe.pdf" on screen; "Pont de l’Aube\u0301" is NFD
    const spoof = await upload(designer, PDF, 'plan\u202Efdp.exe.pdf', 'application/pdf');
    expect(spoof.status).toBe(201);
    expect(spoof.body.attachment.originalName).toBe('planfdp.exe.pdf');
    const nfd = await upload(designer, PDF, 'Pont de l’Aube\u0301\u0085.pdf', 'application/pdf');
    expect(nfd.body.attachment.originalName).toBe('Pont de l’Aubé.pdf');
  });

  it('a polyglot (a PDF header with HTML after it) is kept as a PDF and only ever downloaded, never rendered', async () => {
    const polyglot = Buffer.concat([Buffer.from('%PDF-1.4\n'), Buffer.from('<html><script>alert(document.cookie)</script></html>\n%%EOF\n')]);
    const up = await upload(designer, polyglot, 'sheet.html', 'text/html');
    expect(up.status).toBe(201);
    expect(up.body.attachment.contentType).toBe('application/pdf');
    const dl = await designer.get(`/api/attachments/${up.body.attachment.id}/download`);
    expect(dl.status).toBe(200);
    expect(dl.headers['content-type']).toBe('application/pdf');
    expect(dl.headers['content-disposition']).toMatch(/^attachment;/);
    expect(dl.headers['x-content-type-options']).toBe('nosniff');
    expect(dl.headers['content-security-policy']).toMatch(/script-src 'self'/);
  });
});
