/**
 * The one step every paged list of the client shares (the API's `?cursor=`, server/api/
 * pagination.ts): fetch the page after the last one shown and append it, keeping the newest
 * `page` (total, next cursor). Does nothing on the last page.
 */
import type { Ref } from 'vue';
import type { Page } from '@/api/types';

export async function appendNextPage<T>(items: Ref<T[]>, page: Ref<Page | null>, fetchPage: (cursor: string) => Promise<{ rows: T[]; page: Page }>): Promise<void> {
  const cursor = page.value?.nextCursor;
  if (!cursor) return;
  const answer = await fetchPage(cursor);
  items.value = [...items.value, ...answer.rows];
  page.value = answer.page;
}
