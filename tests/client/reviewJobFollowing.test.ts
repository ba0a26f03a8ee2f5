// @vitest-environment happy-dom
/**
 * The review page opens a round without waiting for its refined run: the store asks with
 * `Prefer: respond-async` (RFC 7240), takes a 202's round and job, polls the job's address and
 * loads the summary when the job is done; a failed job stops the polling and keeps its reason;
 * a run the server refuses now keeps its reason, with nothing to poll;
 * leaving the page stops it too. The fetch of the API is a stand-in.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { useReviewStore } from '@/stores/useReviewStore';

type FetchArgs = [input: string, init: RequestInit];
const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

const review = { id: 7, deck: { id: 3, name: 'Deck' }, version: { number: 1 }, comments: [] };
const job = (state: string, error: string | null = null) => ({ id: 11, url: '/api/jobs/11', kind: 'refined', state, error, createdAt: '2026-12-03T10:00:00Z', startedAt: null });
const summary = { refined: { available: true } };

let fetchMock: ReturnType<typeof vi.fn<(...args: FetchArgs) => Promise<Response>>>;
beforeEach(() => {
  vi.useFakeTimers();
  setActivePinia(createPinia());
  fetchMock = vi.fn<(...args: FetchArgs) => Promise<Response>>();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

describe('following the refined job of a review round', () => {
  it('shows the round at once, polls the job and loads the summary when it is done', async () => {
    fetchMock
      .mockResolvedValueOnce(json(202, { review, summary: null, job: job('queued') }))
      .mockResolvedValueOnce(json(200, { job: job('running') }))
      .mockResolvedValueOnce(json(200, { job: job('done') }))
      .mockResolvedValueOnce(json(200, { review, summary }));
    const store = useReviewStore();
    await store.open(7);
    expect(fetchMock.mock.calls[0][0]).toBe('/api/reviews/7');
    expect((fetchMock.mock.calls[0][1].headers as Record<string, string>).Prefer).toBe('respond-async');
    expect(store.current?.id).toBe(7);
    expect(store.summary).toBeNull();
    expect(store.job?.state).toBe('queued');
    await vi.advanceTimersByTimeAsync(1000);
    expect(fetchMock.mock.calls[1][0]).toBe('/api/jobs/11');
    expect(store.job?.state).toBe('running');
    await vi.advanceTimersByTimeAsync(1000);
    expect(store.summary).toEqual(summary);
    expect(store.job).toBeNull();
    expect(fetchMock).toHaveBeenCalledTimes(4);
    // nothing more is polled
    await vi.advanceTimersByTimeAsync(5000);
    expect(fetchMock).toHaveBeenCalledTimes(4);
  });

  it('stops at a failed job and keeps its reason', async () => {
    fetchMock
      .mockResolvedValueOnce(json(202, { review, summary: null, job: job('running') }))
      .mockResolvedValueOnce(json(200, { job: job('failed', 'ran longer than the limit') }));
    const store = useReviewStore();
    await store.open(7);
    await vi.advanceTimersByTimeAsync(1000);
    expect(store.job).toMatchObject({ state: 'failed', error: 'ran longer than the limit' });
    await vi.advanceTimersByTimeAsync(5000);
    expect(fetchMock).toHaveBeenCalledTimes(2);
  });

  it('stops polling when the page is left', async () => {
    fetchMock.mockResolvedValueOnce(json(202, { review, summary: null, job: job('queued') }));
    const store = useReviewStore();
    await store.open(7);
    store.stopFollowing();
    await vi.advanceTimersByTimeAsync(5000);
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });

  it('keeps the server\'s refusal (a limit, or a full pool) where the summary would be, and polls nothing', async () => {
    const refusal = { code: 'refined_user_limit', message: 'You already have 4 refined (grillage) analyses queued or running.', retryAfterSeconds: 2 };
    fetchMock.mockResolvedValueOnce(json(200, { review, summary: null, job: null, refusal }));
    const store = useReviewStore();
    await store.open(7);
    expect(store.current?.id).toBe(7);
    expect(store.summary).toBeNull();
    expect(store.job).toBeNull();
    expect(store.refusal).toEqual(refusal);
    await vi.advanceTimersByTimeAsync(5000);
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });

  it('a round whose summary is stored is answered in full (200), with no job to follow', async () => {
    fetchMock.mockResolvedValueOnce(json(200, { review, summary }));
    const store = useReviewStore();
    await store.open(7);
    expect(store.summary).toEqual(summary);
    expect(store.job).toBeNull();
    expect(store.refusal).toBeNull();
    await vi.advanceTimersByTimeAsync(5000);
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });
});
