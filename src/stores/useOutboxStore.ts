/** The admins' outbox (messages kept by the local mail service) and invitations. */
import { defineStore } from 'pinia';
import { ref } from 'vue';
import * as mailApi from '@/api/mail';
import type { Invitation, MailKind, OutboxMessage } from '@/api/mail';
import type { Page } from '@/api/types';
import { appendNextPage } from '@/composables/usePagedList';

export const useOutboxStore = defineStore('outbox', () => {
  const messages = ref<OutboxMessage[]>([]);
  /** The last page fetched: its total and the cursor of the next (older) page. */
  const page = ref<Page | null>(null);
  const invitations = ref<Invitation[]>([]);
  const kind = ref<MailKind | undefined>(undefined);
  const loading = ref(false);
  const selected = ref<OutboxMessage | null>(null);

  async function fetchMessages(filter: MailKind | undefined = kind.value): Promise<void> {
    kind.value = filter;
    loading.value = true;
    try {
      const answer = await mailApi.listOutbox(filter ? { kind: filter } : {});
      messages.value = answer.messages;
      page.value = answer.page;
    } finally {
      loading.value = false;
    }
  }

  /** Appends the next (older) page. */
  async function fetchMore(): Promise<void> {
    loading.value = true;
    try {
      await appendNextPage(messages, page, async (cursor) => {
        const answer = await mailApi.listOutbox({ ...(kind.value ? { kind: kind.value } : {}), cursor });
        return { rows: answer.messages, page: answer.page };
      });
    } finally {
      loading.value = false;
    }
  }

  async function select(id: number): Promise<void> {
    selected.value = await mailApi.getOutboxMessage(id);
  }

  async function fetchInvitations(): Promise<void> {
    invitations.value = await mailApi.listInvitations();
  }

  /** Sends an invitation, then looks for its message: the mail service receives it a moment later. */
  async function invite(userId: number): Promise<Invitation> {
    const count = () => messages.value.filter((m) => m.kind === 'invitation').length;
    const before = count();
    const inv = await mailApi.inviteUser(userId);
    await fetchInvitations();
    for (let attempt = 0; attempt < 10; attempt++) {
      await fetchMessages(kind.value);
      if (count() > before || (kind.value !== undefined && kind.value !== 'invitation')) break;
      await new Promise((r) => setTimeout(r, 300));
    }
    return inv;
  }

  return { messages, page, invitations, kind, loading, selected, fetchMessages, fetchMore, select, fetchInvitations, invite };
});
