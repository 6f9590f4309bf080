import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import type { WorkerPrincipal } from '../auth/auth-user';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { GyreException } from '../common/errors/gyre.exception';
import { nowIso } from '../common/time';
import { WorkerToken } from './worker-token.entity';
import { parseWorkerToken, secretMatches } from './worker-token-secret';
import { WorkerTokensError, workerTokensError } from './worker-tokens.errors';

/**
 * "Last used" is written at most once a minute per token: a worker polling several times a
 * second must not queue a database write behind every request.
 */
export const LAST_USED_RESOLUTION_MS = 60_000;

/** A SHA-256 of nothing in particular, compared when the id is unknown so that both take alike. */
const UNKNOWN_ID_HASH = '0'.repeat(64);

/** Checks a presented worker token against the database on every request (revocation is immediate). */
@Injectable()
export class WorkerTokenAuthService {
  constructor(
    @InjectRepository(WorkerToken) private readonly tokens: Repository<WorkerToken>,
    private readonly writes: WriteTransactionsService,
  ) {}

  /** The worker the token names; 401 when it is malformed, unknown or revoked. */
  async authenticate(token: string): Promise<WorkerPrincipal> {
    const parsed = parseWorkerToken(token);
    if (parsed === null) throw invalid('This is not a well-formed worker token.');
    const row = await this.tokens.findOneBy({ id: parsed.id });
    const matches = secretMatches(parsed.secret, row?.secretHash ?? UNKNOWN_ID_HASH);
    if (row === null || !matches) throw invalid('This worker token is unknown.');
    if (row.revokedAt !== null) throw invalid('This worker token was revoked.');
    if (
      row.lastUsedAt === null ||
      Date.now() - Date.parse(row.lastUsedAt) >= LAST_USED_RESOLUTION_MS
    ) {
      await this.writes.run((manager) =>
        manager.update(WorkerToken, { id: row.id }, { lastUsedAt: nowIso() }),
      );
    }
    return { tokenId: row.id, name: row.name };
  }
}

function invalid(message: string): GyreException {
  return workerTokensError(WorkerTokensError.Invalid, message);
}
