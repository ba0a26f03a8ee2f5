// @vitest-environment happy-dom
/**
 * The report downloads of a review round: a file whose refined results the server still
 * computes is answered with the job (202); the links say where it is, offer Cancel to the user
 * who asked for it, and download the file when the job is done; a cancelled or failed job keeps
 * its reason. The fetch of the API is a stand-in.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { flushPromises, mount } from '@vue/test-utils';
import ReportLinks from '@/components/review/ReportLinks.vue';
import { useAuthStore } from '@/stores/auth';
import { mayCancel } from '@/components/review/jobWords';

type FetchArgs = [input: string, init: RequestInit];
const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
const pdf = () => new Response(new Blob(['%PDF-1.7']), { status: 200, headers: { 'Content-Type': 'application/pdf', 'Content-Disposition': 'attachment; filename="Deck-v1-calculation-package.pdf"' } });
const dana = { id: 2, email: 'd@x.example', name: 'Dana', firmId: 1, firmName: 'F', roles: ['designer' as const], mustChangePassword: false };
const job = (state: string, over: Record<string, unknown> = {}) => ({
  id: 11,
  url: '/api/jobs/11',
  kind: 'refined',
  state,
  error: null,
  requestedBy: { id: 2, name: 'Dana' },
  createdAt: new Date().toISOString(),
  startedAt: state === 'queued' ? null : new Date().toISOString(),
  progress: state === 'running' ? { phase: 'search', done: 3, total: 96 } : null,
  ...over,
});

let fetchMock: ReturnType<typeof vi.fn<(...args: FetchArgs) => Promise<Response>>>;
let saved: string[];
beforeEach(() => {
  vi.useFakeTimers();
  setActivePinia(createPinia());
  useAuthStore().me = dana;
  fetchMock = vi.fn<(...args: FetchArgs) => Promise<Response>>();
  vi.stubGlobal('fetch', fetchMock);
  saved = [];
  URL.createObjectURL = () => 'blob:package';
  URL.revokeObjectURL = () => undefined;
  vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
    saved.push(this.download);
  });
});
afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

describe('report downloads', () => {
  it('follows the refined job the package waits for, then downloads the file', async () => {
    fetchMock
      .mockResolvedValueOnce(json(202, { job: job('queued') }))
      .mockResolvedValueOnce(json(200, { job: job('running') }))
      .mockResolvedValueOnce(json(200, { job: job('done') }))
      .mockResolvedValueOnce(pdf());
    const w = mount(ReportLinks, { props: { deckId: 3, versionNumber: 1 } });
    await w.get('[data-test="download-pdf"]').trigger('click');
    await flushPromises();
    expect(fetchMock.mock.calls[0][0]).toBe('/api/reports/decks/3/versions/1/package.pdf');
    expect((fetchMock.mock.calls[0][1].headers as Record<string, string>).Prefer).toBe('respond-async');
    const waiting = w.get('[data-test="report-waiting"]');
    expect(waiting.attributes('data-state')).toBe('queued');
    expect(waiting.text()).toContain('Preparing the calculation package (PDF)');
    expect(waiting.text()).toContain('Waiting for a free analysis worker');
    await vi.advanceTimersByTimeAsync(1000);
    expect(w.get('[data-test="report-waiting"]').text()).toContain('finding the governing truck positions, 3 of 96 factors done.');
    await vi.advanceTimersByTimeAsync(1000);
    await flushPromises();
    expect(fetchMock.mock.calls.map((c) => c[0])).toEqual(['/api/reports/decks/3/versions/1/package.pdf', '/api/jobs/11', '/api/jobs/11', '/api/reports/decks/3/versions/1/package.pdf']);
    expect(saved).toEqual(['Deck-v1-calculation-package.pdf']);
    expect(w.find('[data-test="report-waiting"]').exists()).toBe(false);
    expect(w.find('[data-test="report-problem"]').exists()).toBe(false);
    w.unmount();
  });

  it('a file that is ready downloads at once', async () => {
    fetchMock.mockResolvedValueOnce(new Response('girder,value\n', { status: 200, headers: { 'Content-Type': 'text/csv', 'Content-Disposition': 'attachment; filename=Deck-v1-factors.csv' } }));
    const w = mount(ReportLinks, { props: { deckId: 3, versionNumber: 1 } });
    await w.get('[data-test="download-factors"]').trigger('click');
    await flushPromises();
    expect(saved).toEqual(['Deck-v1-factors.csv']);
    w.unmount();
  });

  it('the requester cancels the job; the cancelled reason is kept and nothing downloads', async () => {
    const reason = 'The refined (grillage) analysis of this version was cancelled by Dana while it ran; nothing of it was stored.';
    fetchMock
      .mockResolvedValueOnce(json(202, { job: job('running') }))
      .mockResolvedValueOnce(json(200, { job: job('cancelled', { error: reason }) }))
      .mockResolvedValueOnce(json(200, { job: job('cancelled', { error: reason }) }));
    const w = mount(ReportLinks, { props: { deckId: 3, versionNumber: 1 } });
    await w.get('[data-test="download-envelopes"]').trigger('click');
    await flushPromises();
    await w.get('[data-test="report-cancel"]').trigger('click');
    await flushPromises();
    expect(fetchMock.mock.calls[1][0]).toBe('/api/jobs/11/cancel');
    expect(fetchMock.mock.calls[1][1].method).toBe('POST');
    await vi.advanceTimersByTimeAsync(1000);
    await flushPromises();
    expect(w.get('[data-test="report-problem"]').text()).toContain(`The envelope table (CSV) was not made: ${reason}`);
    expect(saved).toEqual([]);
    w.unmount();
  });

  it('an error answer is shown with its message', async () => {
    fetchMock.mockResolvedValueOnce(json(503, { error: { code: 'package_busy', message: 'The server is laying out as many packages as it can. Try again in 2 s.', details: [] } }));
    const w = mount(ReportLinks, { props: { deckId: 3, versionNumber: 1 } });
    await w.get('[data-test="download-pdf"]').trigger('click');
    await flushPromises();
    expect(w.get('[data-test="report-problem"]').text()).toContain('Could not download the calculation package (PDF): The server is laying out as many packages as it can.');
    w.unmount();
  });
});

describe('who may cancel a job', () => {
  it('the user who asked for it, or an administrator; never a finished job or a package', () => {
    const live = { kind: 'refined' as const, state: 'running' as const, requestedBy: { id: 2, name: 'Dana' } };
    expect(mayCancel(live, { id: 2, roles: ['designer'] })).toBe(true);
    expect(mayCancel(live, { id: 5, roles: ['reviewer'] })).toBe(false);
    expect(mayCancel(live, { id: 9, roles: ['admin'] })).toBe(true);
    expect(mayCancel({ ...live, state: 'done' }, { id: 2, roles: ['designer'] })).toBe(false);
    expect(mayCancel({ ...live, kind: 'package' }, { id: 2, roles: ['designer'] })).toBe(false);
    expect(mayCancel(live, null)).toBe(false);
  });
});

describe('the file name of a download (Content-Disposition, RFC 6266)', () => {
  it('reads the bare, the quoted and the UTF-8 forms', async () => {
    const { fileNameOf } = await import('@/api/http');
    expect(fileNameOf('attachment; filename=Deck-v1-factors.csv')).toBe('Deck-v1-factors.csv');
    expect(fileNameOf('attachment; filename="Deck v1 \\"A\\".pdf"')).toBe('Deck v1 "A".pdf');
    expect(fileNameOf(`attachment; filename="Br-cke.pdf"; filename*=UTF-8''Br%C3%BCcke.pdf`)).toBe('Brücke.pdf');
    expect(fileNameOf('inline')).toBeNull();
  });
});
