import type { OutboxMessageView, OutboxState } from '@gyre/shared';
import { withQuery } from '../../../lib/api-client';
import { usePage } from '../../../lib/use-page';

/** `GET /api/mail/outbox`: outgoing e-mail and its delivery state, newest first (no bodies). */
export function outboxKey(state: OutboxState | null, page: number, pageSize: number): string {
  return withQuery('/api/mail/outbox', { state, page, pageSize, sort: 'createdAt', order: 'desc' });
}

export function useOutbox(state: OutboxState | null, page: number, pageSize: number) {
  return usePage<OutboxMessageView>(outboxKey(state, page, pageSize), {
    // Queued messages go out within seconds; follow them while any is waiting.
    refreshInterval: (latest) => (latest?.items.some((m) => m.state === 'queued') ? 3000 : 0),
  });
}
