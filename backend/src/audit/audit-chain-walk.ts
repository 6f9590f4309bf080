import type { AuditVerifyResult } from '@gyre/shared';
import { chainHash, ChainedContent, GENESIS_HASH } from './audit-chain';

/** A stored entry: its content and both hashes. */
export interface ChainRow extends ChainedContent {
  prevHash: string;
  hash: string;
}

export type ChainWalkResult = Omit<AuditVerifyResult, 'anchors'>;

/**
 * Recomputes the chain entry by entry in sequence order and stops at the first entry whose
 * sequence number, link or hash does not hold. Fed by the server (TypeORM pages) and by the
 * restore command (its own connection), so both judge a trail the same way.
 */
export class ChainWalk {
  private previous = GENESIS_HASH;
  private expectedSeq = 1;
  private checked = 0;
  private broken: { seq: number; reason: string } | null = null;

  /** Checks the next entry; false once the chain is broken (feed no more). */
  push(row: ChainRow): boolean {
    if (this.broken !== null) return false;
    if (row.seq !== this.expectedSeq) {
      return this.fail(
        row.seq,
        `sequence jumps from ${this.expectedSeq - 1} to ${row.seq}: entries are missing`,
      );
    }
    if (row.prevHash !== this.previous) {
      return this.fail(row.seq, 'its previous-hash link does not match the entry before it');
    }
    if (chainHash(row.prevHash, contentOf(row)) !== row.hash) {
      return this.fail(row.seq, 'its content does not match its hash: the entry was altered');
    }
    this.previous = row.hash;
    this.expectedSeq += 1;
    this.checked += 1;
    return true;
  }

  result(): ChainWalkResult {
    if (this.broken !== null) {
      return {
        intact: false,
        checked: this.checked,
        firstBroken: this.broken,
        lastHash: this.previous,
      };
    }
    return {
      intact: true,
      checked: this.checked,
      firstBroken: null,
      lastHash: this.checked === 0 ? null : this.previous,
    };
  }

  private fail(seq: number, reason: string): false {
    this.broken = { seq, reason };
    return false;
  }
}

/** Exactly the fields the hash covers, whatever else the row carries. */
export function contentOf(row: ChainedContent): ChainedContent {
  return {
    seq: row.seq,
    at: row.at,
    actorId: row.actorId,
    actorEmail: row.actorEmail,
    action: row.action,
    objectType: row.objectType,
    objectId: row.objectId,
    studyId: row.studyId,
    siteId: row.siteId,
    before: row.before,
    after: row.after,
    reason: row.reason,
    clientIp: row.clientIp,
  };
}
