import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import type { BlindedDecisionChange, VisitBlindingView } from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import type { Caller } from '../auth/decorators';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { nowIso } from '../common/time';
import { Flag } from '../flags/flag.entity';
import { FlagsService } from '../flags/flags.service';
import { VisitsService } from '../visits/visits.service';
import { BlindingService } from './blinding.service';
import { BlindingError, blindingError } from './blinding.errors';
import { VisitUnblinding } from './visit-unblinding.entity';
import type { GyreException } from '../common/errors/gyre.exception';

/**
 * The reads and the one write of Review under blinded review: what the caller may know of a
 * visit's blinding, and the analyst's decision (a flag raised, or no flag, with a reason),
 * which unblinds the visit for that analyst alone. Decision, unblinding and their audit
 * entries are written in one transaction.
 */
@Injectable()
export class BlindedDecisionsService {
  constructor(
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
    private readonly blinding: BlindingService,
    private readonly flags: FlagsService,
    private readonly visits: VisitsService,
  ) {}

  async state(caller: Caller, visitId: string): Promise<VisitBlindingView> {
    const visit = await this.visits.findInScopeOf(caller, 'read', 'Visit', visitId, visitNotFound);
    return this.blinding.viewOf(caller, visit);
  }

  async decide(
    caller: Caller,
    visitId: string,
    change: BlindedDecisionChange,
  ): Promise<VisitBlindingView> {
    const visit = await this.visits.findInScopeOf(caller, 'create', 'Flag', visitId, visitNotFound);
    const codes = await this.blinding.blindedCodes(caller, [visit.id]);
    const code = codes.get(visit.id);
    if (code === undefined) {
      throw blindingError(
        BlindingError.NotBlinded,
        `Visit ${visitId} is not blinded for you (blinded review is off, or you recorded your decision already); record flags on the Review screen as usual.`,
        { visitId },
      );
    }
    await this.writes.run(async (manager) => {
      // Read again inside the write transaction: a second click must not write twice.
      const decided = await manager
        .getRepository(VisitUnblinding)
        .findOneBy({ userId: caller.user.id, visitId });
      if (decided !== null) {
        throw blindingError(
          BlindingError.NotBlinded,
          `You recorded your decision on visit ${visitId} at ${decided.unblindedAt}; it is unblinded for you.`,
          { visitId },
        );
      }
      let flagId: string | null = null;
      if (change.decision === 'flag') {
        // A flag another analyst raised already stands for the same decision.
        const raised = await manager.getRepository(Flag).findOneBy({ visitId, state: 'raised' });
        flagId = (raised ?? (await this.flags.raiseIn(manager, caller, visit, change.reason))).id;
      }
      const row = Object.assign(new VisitUnblinding(), {
        id: randomUUID(),
        visitId,
        participantId: visit.participantId,
        studyId: visit.studyId,
        siteId: visit.siteId,
        userId: caller.user.id,
        decision: change.decision,
        reason: change.reason,
        flagId,
        unblindedAt: nowIso(),
      });
      await manager.getRepository(VisitUnblinding).insert(row);
      await this.audit.recordBy(caller, visit, {
        action: 'unblind',
        objectType: 'Visit',
        objectId: visitId,
        before: { code, blinded: true },
        after: { code, blinded: false, decision: change.decision, flagId },
        reason: change.reason,
      });
    });
    return this.blinding.viewOf(caller, visit);
  }
}

function visitNotFound(visitId: string): GyreException {
  return blindingError(BlindingError.VisitNotFound, `No visit ${visitId}.`, { visitId });
}
