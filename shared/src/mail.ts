export const OUTBOX_STATES = ['queued', 'sent', 'failed'] as const;
export type OutboxState = (typeof OUTBOX_STATES)[number];

/** `GET /api/mail/outbox`: the message's envelope and delivery state, never its body. */
export interface OutboxMessageView {
  id: string;
  kind: string;
  to: string;
  subject: string;
  state: OutboxState;
  attempts: number;
  nextAttemptAt: string | null;
  lastError: string | null;
  createdAt: string;
  sentAt: string | null;
}
