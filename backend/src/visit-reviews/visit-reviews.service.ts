import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, Repository } from 'typeorm';
import { subject } from '@gyre/shared';
import type { VisitReviewView, VisitReviewStateView } from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import type { Caller } from '../auth/decorators';
import { blindedVisitReviewView } from '../blinding/blinded-views';
import { BlindingService } from '../blinding/blinding.service';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { nowIso } from '../common/time';
import type { Recording } from '../recordings/recording.entity';
import { RecordingsService } from '../recordings/recordings.service';
import type { Visit } from '../visits/visit.entity';
import { VisitsService } from '../visits/visits.service';
import { reviewFingerprintOf } from './review-fingerprint';
import { VisitReview } from './visit-review.entity';
import { VisitReviewsError, visitReviewsError } from './visit-reviews.errors';
import type { GyreException } from '../common/errors/gyre.exception';

const COMPUTING: ReadonlySet<Recording['state']> = new Set(['queued', 'computing']);

/**
 * "Visit reviewed": an analyst records that they have looked at the visit's current results.
 * The act names the runs it covered by their fingerprint; when the visit's results change (a
 * new run, a replaced recording), the fingerprint differs and the visit is no longer reviewed.
 */
@Injectable()
export class VisitReviewsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
    private readonly visits: VisitsService,
    private readonly recordings: RecordingsService,
    private readonly blinding: BlindingService,
  ) {}

  async state(caller: Caller, visitId: string): Promise<VisitReviewStateView> {
    const visit = await this.visitInScope(caller, 'read', visitId);
    return this.stateOf(caller, visit);
  }

  async markReviewed(
    caller: Caller,
    visitId: string,
    seenFingerprint: string,
  ): Promise<VisitReviewStateView> {
    const visit = await this.visitInScope(caller, 'create', visitId);
    await this.writes.run(async (manager) => {
      // Read again inside the write transaction: nothing can change the runs meanwhile.
      const current = await this.recordings.currentOfVisits([visitId]);
      const now = reviewFingerprintOf(current);
      if (now === null) {
        throw visitReviewsError(
          VisitReviewsError.NoResults,
          `Visit ${visitId} has no results to review yet.`,
          { visitId },
        );
      }
      if (now.fingerprint !== seenFingerprint) {
        throw visitReviewsError(
          VisitReviewsError.ResultsChanged,
          `fingerprint: the visit's results have changed since you loaded them (found ${seenFingerprint}, now ${now.fingerprint}); review them again.`,
          { field: 'fingerprint', found: seenFingerprint, expected: now.fingerprint },
        );
      }
      const computing = current.filter((r) => COMPUTING.has(r.state));
      if (computing.length > 0) {
        throw visitReviewsError(
          VisitReviewsError.Computing,
          `The ${computing.map((r) => r.kind).join(' and ')} recording of visit ${visitId} is being computed; review when it is done.`,
          { visitId, recordingIds: computing.map((r) => r.id) },
        );
      }
      const latest = await this.latestOf(visitId, manager.getRepository(VisitReview));
      if (latest !== null && latest.fingerprint === now.fingerprint) {
        throw visitReviewsError(
          VisitReviewsError.AlreadyReviewed,
          `${latest.reviewedByName} reviewed these results of visit ${visitId} at ${latest.reviewedAt}; nothing has changed since.`,
          { reviewId: latest.id, reviewedAt: latest.reviewedAt },
        );
      }
      const row = Object.assign(new VisitReview(), {
        id: randomUUID(),
        visitId,
        participantId: visit.participantId,
        studyId: visit.studyId,
        siteId: visit.siteId,
        reviewedById: caller.user.id,
        reviewedByName: caller.user.name,
        reviewedAt: nowIso(),
        fingerprint: now.fingerprint,
        runIdsJson: JSON.stringify(now.runIds),
      });
      await manager.getRepository(VisitReview).insert(row);
      await this.audit.recordBy(caller, visit, {
        action: 'review',
        objectType: 'VisitReview',
        objectId: row.id,
        before: latest === null ? null : toVisitReviewView(latest),
        after: toVisitReviewView(row),
      });
    });
    return this.stateOf(caller, visit);
  }

  /**
   * For other modules (the worklist), unscoped: the newest review of each visit among
   * `visitIds`, or of every visit of `studyIds` when `visitIds` is null. One query; SQLite
   * takes the bare columns of an aggregate query from the row that holds MAX()
   * (sqlite.org/lang_select.html, "bare columns in an aggregate query").
   */
  async latestByVisit(filter: {
    studyIds: readonly string[];
    visitIds?: readonly string[];
  }): Promise<Map<string, VisitReviewView>> {
    const query = this.dataSource
      .getRepository(VisitReview)
      .createQueryBuilder('review')
      .select('review.visitId', 'visitId')
      .addSelect('MAX(review.reviewedAt)', 'reviewedAt')
      .addSelect('review.id', 'id')
      .addSelect('review.reviewedById', 'reviewedById')
      .addSelect('review.reviewedByName', 'reviewedByName')
      .addSelect('review.fingerprint', 'fingerprint')
      .addSelect('review.runIdsJson', 'runIdsJson')
      .where('review.studyId IN (:...studyIds)', { studyIds: [...filter.studyIds] })
      .groupBy('review.visitId');
    if (filter.visitIds !== undefined) {
      if (filter.visitIds.length === 0) return new Map();
      query.andWhere('review.visitId IN (:...visitIds)', { visitIds: [...filter.visitIds] });
    }
    const rows: VisitReview[] = await query.getRawMany();
    return new Map(rows.map((row) => [row.visitId, toVisitReviewView(row)]));
  }

  private async stateOf(caller: Caller, visit: Visit): Promise<VisitReviewStateView> {
    const current = await this.recordings.currentOfVisits([visit.id]);
    const now = reviewFingerprintOf(current);
    const latest = await this.latestOf(visit.id, this.dataSource.getRepository(VisitReview));
    const reviewed = latest !== null && now !== null && latest.fingerprint === now.fingerprint;
    const mayReview = caller.ability.can('create', subject('VisitReview', visit));
    const computing = current.some((r) => COMPUTING.has(r.state));
    const cannotReviewReason = !mayReview
      ? 'Your role does not mark visits reviewed.'
      : now === null
        ? 'This visit has no results to review yet.'
        : reviewed
          ? 'These results are reviewed; nothing has changed since.'
          : computing
            ? 'A recording of this visit is being computed; review when it is done.'
            : null;
    return {
      visitId: visit.id,
      currentFingerprint: now?.fingerprint ?? null,
      currentRunIds: now?.runIds ?? [],
      latest: latest === null ? null : await this.shownReview(caller, latest),
      reviewed,
      changedSinceReview: latest !== null && !reviewed,
      canReview: cannotReviewReason === null,
      cannotReviewReason,
    };
  }

  /** The mark as the caller may see it: by the visit's blinded clock under blinded review. */
  private async shownReview(caller: Caller, review: VisitReview): Promise<VisitReviewView> {
    const clock = await this.blinding.clockOf(caller, review.visitId);
    const view = toVisitReviewView(review);
    return clock === null ? view : blindedVisitReviewView(view, clock);
  }

  private latestOf(
    visitId: string,
    repository: Repository<VisitReview>,
  ): Promise<VisitReview | null> {
    return repository.findOne({
      where: { visitId },
      order: { reviewedAt: 'DESC', id: 'DESC' },
    });
  }

  /** The visit if the caller may `action` its review, else 404 VISIT_REVIEW_VISIT_NOT_FOUND. */
  private visitInScope(caller: Caller, action: 'read' | 'create', visitId: string): Promise<Visit> {
    return this.visits.findInScopeOf(caller, action, 'VisitReview', visitId, visitNotFound);
  }
}

function visitNotFound(visitId: string): GyreException {
  return visitReviewsError(VisitReviewsError.VisitNotFound, `No visit ${visitId}.`, { visitId });
}

export function toVisitReviewView(row: VisitReview): VisitReviewView {
  return {
    id: row.id,
    visitId: row.visitId,
    reviewedById: row.reviewedById,
    reviewedByName: row.reviewedByName,
    reviewedAt: row.reviewedAt,
    fingerprint: row.fingerprint,
    runIds: JSON.parse(row.runIdsJson) as string[],
  };
}
