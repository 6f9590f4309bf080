import { randomUUID } from 'node:crypto';
import { Injectable, Logger, OnModuleDestroy, OnModuleInit } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, FindOptionsWhere, In, IsNull, LessThanOrEqual, Repository } from 'typeorm';
import type { OutboxMessageView, Page } from '@gyre/shared';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { pageSliceOf, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { isoAfter, nowIso } from '../common/time';
import { MailContent } from './mail-templates';
import { MailTransportService } from './mail-transport.service';
import { OutboxMessage } from './outbox-message.entity';
import { OutboxQueryDto } from './dto/outbox-query.dto';
import { errorMessage } from '../common/errors/error-message';

/**
 * After this many refusals by the SMTP server (5xx replies) a message is marked `failed` and
 * left for an admin. An unreachable server or a 4xx reply is transient: the message stays
 * queued however long the outage lasts, so it is never lost.
 */
export const MAX_SEND_ATTEMPTS = 6;
/** Longest wait between two attempts (the backoff stops doubling here). */
export const MAX_BACKOFF_MS = 60 * 60 * 1000;
/** Backoff before attempt n+1: 30 s · 2^(n−1), i.e. 30 s, 1 min, 2 min, 4 min, 8 min … 1 h. */
export function backoffMs(attemptsSoFar: number): number {
  return Math.min(MAX_BACKOFF_MS, 30_000 * 2 ** Math.max(0, Math.min(20, attemptsSoFar - 1)));
}

/** A 5xx SMTP reply is permanent (RFC 5321 §4.2.1); no reply at all, or 4xx, is transient. */
export function isPermanentSmtpFailure(error: unknown): boolean {
  const code =
    typeof error === 'object' && error !== null && 'responseCode' in error
      ? Number((error as { responseCode: unknown }).responseCode)
      : NaN;
  return code >= 500 && code < 600;
}

/** Called after a message was handed to SMTP and marked sent (e.g. reports then mark `sent`). */
export type SentListener = (message: { id: string; kind: string }) => Promise<void> | void;
const POLL_INTERVAL_MS = 15_000;

/**
 * Mail leaves Gyre through this table: a message is queued in the same transaction as the
 * change that causes it, then sent; failures are retried with exponential backoff.
 */
@Injectable()
export class OutboxService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('Outbox');
  private timer: NodeJS.Timeout | null = null;
  private draining: Promise<void> | null = null;
  private again = false;
  private stopped = false;
  private readonly sentListeners: SentListener[] = [];

  constructor(
    @InjectRepository(OutboxMessage) private readonly messages: Repository<OutboxMessage>,
    private readonly writes: WriteTransactionsService,
    private readonly transport: MailTransportService,
  ) {}

  onModuleInit(): void {
    this.timer = setInterval(() => this.kick(), POLL_INTERVAL_MS);
    this.timer.unref();
  }

  async onModuleDestroy(): Promise<void> {
    this.stopped = true;
    if (this.timer !== null) clearInterval(this.timer);
    await this.draining;
  }

  /** Queues a message; call {@link kick} once the surrounding transaction has committed. */
  async enqueue(manager: EntityManager, to: string, content: MailContent): Promise<string> {
    const id = randomUUID();
    await manager.insert(OutboxMessage, {
      id,
      kind: content.kind,
      toAddress: to,
      subject: content.subject,
      textBody: content.text,
      state: 'queued',
      attempts: 0,
      nextAttemptAt: nowIso(),
      lastError: null,
      messageId: null,
      createdAt: nowIso(),
      sentAt: null,
    });
    return id;
  }

  /** Registers a listener for delivered messages; a failing listener never undoes the send. */
  onSent(listener: SentListener): void {
    this.sentListeners.push(listener);
  }

  /** Starts sending what is due, unless a round is already running (then one more follows). */
  kick(): void {
    if (this.stopped) return;
    if (this.draining !== null) {
      this.again = true;
      return;
    }
    this.draining = this.drain()
      .catch((error: unknown) => this.logger.error(error instanceof Error ? error.stack : error))
      .finally(() => {
        this.draining = null;
        if (this.again && !this.stopped) {
          this.again = false;
          this.kick();
        }
      });
  }

  /** Resolves when nothing is being sent (tests use it to wait for delivery). */
  async idle(): Promise<void> {
    while (this.draining !== null) await this.draining;
  }

  private async drain(): Promise<void> {
    const due = await this.messages.find({
      where: { state: 'queued', nextAttemptAt: LessThanOrEqual(nowIso()) },
      order: { createdAt: 'ASC' },
      take: 50,
    });
    for (const message of due) {
      if (this.stopped) return;
      await this.sendOne(message);
    }
  }

  private async sendOne(message: OutboxMessage): Promise<void> {
    const attempts = message.attempts + 1;
    try {
      const messageId = await this.transport.send({
        to: message.toAddress,
        subject: message.subject,
        text: message.textBody ?? '',
        // The same Message-ID on every attempt: a receiver can tell a repeat from a new message.
        messageId: `<${message.id}@gyre.invalid>`,
      });
      await this.writes.run((m) =>
        m.update(
          OutboxMessage,
          { id: message.id },
          // The body holds a single-use link: once handed over it is not kept.
          {
            state: 'sent',
            attempts,
            sentAt: nowIso(),
            messageId,
            textBody: null,
            nextAttemptAt: null,
            lastError: null,
          },
        ),
      );
      for (const listener of this.sentListeners) {
        try {
          await listener({ id: message.id, kind: message.kind });
        } catch (error) {
          this.logger.error(error instanceof Error ? error.stack : error);
        }
      }
    } catch (error) {
      const reason = errorMessage(error);
      const failed = attempts >= MAX_SEND_ATTEMPTS && isPermanentSmtpFailure(error);
      this.logger.warn(
        `Sending ${message.kind} to ${message.toAddress} failed (attempt ${attempts}): ${reason}`,
      );
      await this.writes.run((m) =>
        m.update(
          OutboxMessage,
          { id: message.id },
          {
            state: failed ? 'failed' : 'queued',
            attempts,
            lastError: reason.slice(0, 2000),
            nextAttemptAt: failed ? null : isoAfter(backoffMs(attempts)),
            textBody: failed ? null : message.textBody,
          },
        ),
      );
    }
  }

  async list(query: OutboxQueryDto): Promise<Page<OutboxMessageView>> {
    const window = pageWindowOf(query, 'desc');
    const where: FindOptionsWhere<OutboxMessage> = {};
    if (query.state !== undefined) where.state = query.state;
    if (query.id !== undefined) where.id = query.id;
    if (query.to !== undefined) where.toAddress = query.to.toLowerCase();
    const rows = await this.messages.findAndCount({
      where,
      ...pageSliceOf(window, query.sort ?? 'createdAt'),
    });
    return toPage(rows, window, toOutboxView);
  }

  /** For other modules: where the given messages stand (missing ones are left out). */
  async deliveryOf(ids: string[]): Promise<Pick<OutboxMessage, 'id' | 'state' | 'sentAt'>[]> {
    if (ids.length === 0) return [];
    return this.messages.find({
      where: { id: In(ids) },
      select: { id: true, state: true, sentAt: true },
    });
  }

  /** Queued messages never attempted: for the tests and the admin view. */
  countUnsent(): Promise<number> {
    return this.messages.countBy({ state: 'queued', sentAt: IsNull() });
  }
}

export function toOutboxView(message: OutboxMessage): OutboxMessageView {
  return {
    id: message.id,
    kind: message.kind,
    to: message.toAddress,
    subject: message.subject,
    state: message.state,
    attempts: message.attempts,
    nextAttemptAt: message.nextAttemptAt,
    lastError: message.lastError,
    createdAt: message.createdAt,
    sentAt: message.sentAt,
  };
}
