import type { OutboxMessageView, OutboxState, Page } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/mail/outbox`: outgoing e-mail and its delivery state, newest first (no bodies). */
export function outboxKey(state: OutboxState | null, page: number, pageSize: number): string {
  return withQuery('/api/mail/outbox', { state, page, pageSize, sort: 'createdAt', order: 'desc' });
}

export function getOutbox(key: string): Promise<Page<OutboxMessageView>> {
  return apiFetch<Page<OutboxMessageView>>(key);
}

export function useOutbox(state: OutboxState | null, page: number, pageSize: number) {
  return useSWR<Page<OutboxMessageView>>(outboxKey(state, page, pageSize), getOutbox, {
    keepPreviousData: true,
    // Queued messages go out within seconds; follow them while any is waiting.
    refreshInterval: (latest) => (latest?.items.some((m) => m.state === 'queued') ? 3000 : 0),
  });
}
