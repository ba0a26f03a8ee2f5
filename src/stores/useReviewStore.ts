/** Review rounds: the lists, the open round with its refined-analysis summary, and its actions. */
import { defineStore } from 'pinia';
import { ref } from 'vue';
import * as reviewsApi from '@/api/reviews';
import type { CommentAnchor, RefinedSummary, ReviewDetail, ReviewState, ReviewSummary, ReviewView, Reviewer } from '@/api/reviews';
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

  async function open(reviewId: number): Promise<void> {
    const { review, summary: s } = await reviewsApi.getReview(reviewId);
    current.value = review;
    summary.value = s;
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

  return { list, listPage, listView, listState, loadingList, current, summary, reviewers, fetchList, fetchMore, open, reload, fetchReviewers, submit, comment, recordRefined, decide, withdraw };
});
