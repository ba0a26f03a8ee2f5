/** Review rounds: the lists, the open round with its refined-analysis summary, and its actions. */
import { defineStore } from 'pinia';
import { ref } from 'vue';
import * as reviewsApi from '@/api/reviews';
import type { CommentAnchor, ComputeJob, RefinedRefusal, RefinedSummary, ReviewDetail, ReviewState, ReviewSummary, ReviewView, Reviewer } from '@/api/reviews';
import type { Page } from '@/api/types';
import { appendNextPage } from '@/composables/usePagedList';

export const useReviewStore = defineStore('reviews', () => {
  const list = ref<ReviewSummary[]>([]);
  const listPage = ref<Page | null>(null);
  const listView = ref<ReviewView>('assigned');
  const listState = ref<ReviewState | undefined>(undefined);
  const loadingList = ref(false);
  const current = ref<ReviewDetail | null>(null);
  const summary = ref<RefinedSummary | null>(null);
  /** The refined job the open round's summary waits for (null when the summary is here). */
  const job = ref<ComputeJob | null>(null);
  /** Why the server could not start the refined run now (the page offers to try again). */
  const refusal = ref<RefinedRefusal | null>(null);
  /** A failure while following the job (the page offers to try again). */
  const jobError = ref<unknown>(null);
  let pollTimer: ReturnType<typeof setTimeout> | null = null;
  /** Poll interval, ms. */
  const POLL_MS = 1000;
  const reviewers = ref<Reviewer[]>([]);

  async function fetchList(view: ReviewView = listView.value, state: ReviewState | undefined = listState.value): Promise<void> {
    listView.value = view;
    listState.value = state;
    loadingList.value = true;
    try {
      const answer = await reviewsApi.listReviews({ view, state });
      list.value = answer.reviews;
      listPage.value = answer.page;
    } finally {
      loadingList.value = false;
    }
  }

  /** Appends the next page of the list (rounds changed earlier). */
  async function fetchMore(): Promise<void> {
    loadingList.value = true;
    try {
      await appendNextPage(list, listPage, async (cursor) => {
        const answer = await reviewsApi.listReviews({ view: listView.value, state: listState.value, cursor });
        return { rows: answer.reviews, page: answer.page };
      });
    } finally {
      loadingList.value = false;
    }
  }

  function stopFollowing(): void {
    if (pollTimer) clearTimeout(pollTimer);
    pollTimer = null;
  }

  /** Opens a round without waiting for its refined run: the summary follows when its job is done. */
  async function open(reviewId: number): Promise<void> {
    stopFollowing();
    jobError.value = null;
    const answer = await reviewsApi.getReviewWithoutWaiting(reviewId);
    current.value = answer.review;
    summary.value = answer.summary;
    job.value = answer.job;
    refusal.value = answer.refusal;
    if (answer.job) follow(reviewId, answer.job);
  }

  function follow(reviewId: number, j: ComputeJob): void {
    pollTimer = setTimeout(async () => {
      pollTimer = null;
      if (current.value?.id !== reviewId) return;
      try {
        const now = await reviewsApi.getJob(j.url);
        if (current.value?.id !== reviewId) return;
        job.value = now;
        if (now.state === 'done') await open(reviewId);
        else if (reviewsApi.jobIsLive(now)) follow(reviewId, now);
      } catch (e) {
        jobError.value = e;
      }
    }, POLL_MS);
  }

  /** Cancels the refined job the open round waits for; the card then says it was cancelled. */
  async function cancelJob(): Promise<void> {
    if (!job.value) return;
    const cancelled = await reviewsApi.cancelJob(job.value);
    stopFollowing();
    job.value = cancelled;
  }

  async function reload(): Promise<void> {
    if (current.value) await open(current.value.id);
  }

  async function fetchReviewers(): Promise<void> {
    reviewers.value = await reviewsApi.listReviewers();
  }

  async function submit(input: { versionId: number; reviewerId: number; note?: string }): Promise<ReviewSummary> {
    return reviewsApi.submitForReview(input);
  }

  async function comment(body: string, anchor?: CommentAnchor, parentId?: number): Promise<void> {
    if (!current.value) return;
    await reviewsApi.addComment(current.value.id, { body, ...(anchor ? { anchor } : {}), ...(parentId ? { parentId } : {}) });
    await reload();
  }

  async function recordRefined(justified: boolean, reason: string): Promise<void> {
    if (!current.value) return;
    await reviewsApi.recordRefinedDecision(current.value.id, { justified, reason });
    await reload();
  }

  async function decide(outcome: 'approve' | 'send-back', note: string): Promise<void> {
    if (!current.value) return;
    await reviewsApi.decide(current.value.id, { outcome, note });
    await reload();
  }

  async function withdraw(): Promise<void> {
    if (!current.value) return;
    await reviewsApi.withdraw(current.value.id);
    await reload();
  }

  return { list, listPage, listView, listState, loadingList, current, summary, job, jobError, refusal, reviewers, fetchList, fetchMore, open, reload, stopFollowing, cancelJob, fetchReviewers, submit, comment, recordRefined, decide, withdraw };
});
