import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import type { VisitBlindingView } from '@gyre/shared';
import type { Caller } from '../auth/decorators';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { nowIso } from '../common/time';
import { Study } from '../studies/study.entity';
import { newBlindCode } from './blind-codes';
import { blindedClock, type BlindedClock, type BlindedVisit } from './blinded-visit-facts';
import { BlindingError, blindingError } from './blinding.errors';
import { VisitBlindCode } from './visit-blind-code.entity';
import { VisitUnblinding } from './visit-unblinding.entity';

/** Bound parameters per IN (…) list, well under SQLite's limit. */
const CHUNK = 500;

/** A visit as blinding needs it: which visit, in which study. */
export interface VisitRef {
  id: string;
  studyId: string;
}

/**
 * Blinded review (docs/user-guide.md, "Blinded review"): while a study has it on, each of its
 * analysts sees every visit under a stored random code until they record their decision on
 * it. This service answers, for any read, which visits are blinded for the caller; other
 * roles and other studies are never blinded. It reads the study, visit and flag rows itself
 * so that the visits module can ask it without a cycle.
 */
@Injectable()
export class BlindingService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteTransactionsService,
  ) {}

  /** Whether blinded review applies to the caller: an analyst of a study that has it on. */
  async appliesTo(caller: Caller): Promise<boolean> {
    if (caller.user.role !== 'analyst' || caller.user.studyId === null) return false;
    const study = await this.dataSource
      .getRepository(Study)
      .findOne({ where: { id: caller.user.studyId }, select: { id: true, blindedReview: true } });
    return study?.blindedReview === true;
  }

  /**
   * The visits among `visitIds` (of the caller's study) still blinded for the caller, each
   * with its code; empty for every caller blinded review does not apply to.
   */
  async blindedCodes(caller: Caller, visitIds: readonly string[]): Promise<Map<string, string>> {
    const studyId = caller.user.studyId;
    if (visitIds.length === 0 || studyId === null || !(await this.appliesTo(caller))) {
      return new Map();
    }
    const unblinded = new Set<string>();
    for (let i = 0; i < visitIds.length; i += CHUNK) {
      const rows = await this.dataSource.getRepository(VisitUnblinding).find({
        where: { userId: caller.user.id, visitId: In(visitIds.slice(i, i + CHUNK)) },
        select: { visitId: true },
      });
      for (const row of rows) unblinded.add(row.visitId);
    }
    const blinded = [...new Set(visitIds)].filter((id) => !unblinded.has(id));
    return this.codesOf(studyId, blinded);
  }

  /**
   * For lists of visits: null when blinded review does not apply to the caller, else the only
   * visits of their study they may see listed (those they recorded their decision on).
   */
  async unblindedVisitIds(caller: Caller): Promise<string[] | null> {
    if (!(await this.appliesTo(caller))) return null;
    const rows = await this.dataSource
      .getRepository(VisitUnblinding)
      .find({ where: { userId: caller.user.id }, select: { visitId: true } });
    return rows.map((row) => row.visitId);
  }

  /**
   * For participant pages: null when blinded review does not apply to the caller, else the
   * only participants of their study they may open (those with a visit they decided on).
   */
  async unblindedParticipantIds(caller: Caller): Promise<Set<string> | null> {
    if (!(await this.appliesTo(caller))) return null;
    const rows = await this.dataSource
      .getRepository(VisitUnblinding)
      .find({ where: { userId: caller.user.id }, select: { participantId: true } });
    return new Set(rows.map((row) => row.participantId));
  }

  /**
   * Refuses (403) a participant's page to an analyst who has decided on none of the
   * participant's visits: the page would tie still-blinded visits to the participant.
   */
  async assertParticipantVisible(caller: Caller, participantId: string): Promise<void> {
    const open = await this.unblindedParticipantIds(caller);
    if (open === null || open.has(participantId)) return;
    throw blindingError(
      BlindingError.ParticipantBlinded,
      `Blinded review is on for this study: participant ${participantId} opens for you once you have recorded your decision on one of their visits (on its Review screen).`,
      { participantId },
    );
  }

  /**
   * Refuses (403) a study-wide surface (overview, exports) to an analyst of a study with
   * blinded review on: it ties every visit to its date, planned visit, group and participant.
   */
  async assertStudyOpen(caller: Caller, studyId: string, surface: string): Promise<void> {
    if (studyId !== caller.user.studyId || !(await this.appliesTo(caller))) return;
    throw blindingError(
      BlindingError.StudyClosed,
      `Blinded review is on for this study: ${surface} closed to analysts until an admin switches blinded review off (Study set-up). Your worklist and Review stay open.`,
      { studyId },
    );
  }

  /**
   * The visits among `visitIds` still blinded for the caller, each with its code and the clock
   * that shows its time stamps as the distance from its first upload (blinded-visit-facts.ts).
   */
  async blindedVisits(
    caller: Caller,
    visitIds: readonly string[],
  ): Promise<Map<string, BlindedVisit>> {
    const codes = await this.blindedCodes(caller, visitIds);
    const out = new Map<string, BlindedVisit>();
    const blinded = [...codes.keys()];
    for (let i = 0; i < blinded.length; i += CHUNK) {
      const chunk = blinded.slice(i, i + CHUNK);
      const rows = (await this.dataSource.query(
        `SELECT "visitId", MIN("createdAt") AS "origin" FROM "recording"
          WHERE "visitId" IN (${chunk.map(() => '?').join(',')}) GROUP BY "visitId"`,
        chunk,
      )) as Array<{ visitId: string; origin: string }>;
      const origins = new Map(rows.map((row) => [row.visitId, row.origin]));
      for (const visitId of chunk) {
        out.set(visitId, {
          code: codes.get(visitId) ?? '',
          clock: blindedClock(origins.get(visitId) ?? null),
        });
      }
    }
    return out;
  }

  /** The visit's blinded clock when it is blinded for the caller; null: shown as it is. */
  async clockOf(caller: Caller, visitId: string): Promise<BlindedClock | null> {
    return (await this.blindedVisits(caller, [visitId])).get(visitId)?.clock ?? null;
  }

  /** Whether one visit is blinded for the caller. */
  async isBlinded(caller: Caller, visit: VisitRef): Promise<boolean> {
    if (visit.studyId !== caller.user.studyId) return false;
    return (await this.blindedCodes(caller, [visit.id])).has(visit.id);
  }

  /** Refuses (403) a read that would show a visit's details to an analyst it is blinded for. */
  async assertVisible(caller: Caller, visit: VisitRef): Promise<void> {
    if (await this.isBlinded(caller, visit)) {
      throw blindingError(
        BlindingError.VisitBlinded,
        `Visit ${visit.id} is under blinded review: its details are hidden from you until you record your decision (GET /api/visits/${visit.id}/blinding).`,
        { visitId: visit.id },
      );
    }
  }

  /** What the caller may know of the visit's blinding (a visit already checked for scope). */
  async viewOf(caller: Caller, visit: VisitRef): Promise<VisitBlindingView> {
    const study = await this.dataSource.getRepository(Study).findOneByOrFail({ id: visit.studyId });
    const decision =
      caller.user.role === 'analyst'
        ? await this.dataSource
            .getRepository(VisitUnblinding)
            .findOneBy({ userId: caller.user.id, visitId: visit.id })
        : null;
    const code = study.blindedReview
      ? ((await this.codesOf(visit.studyId, [visit.id])).get(visit.id) ?? null)
      : null;
    return {
      visitId: visit.id,
      studyId: visit.studyId,
      code,
      blinded: await this.isBlinded(caller, visit),
      decision:
        decision === null
          ? null
          : {
              decision: decision.decision,
              reason: decision.reason,
              flagId: decision.flagId,
              decidedAt: decision.unblindedAt,
            },
    };
  }

  /**
   * The stored codes of the visits, made (random, unique within the study) for those that have
   * none yet, in one write transaction.
   */
  async codesOf(studyId: string, visitIds: readonly string[]): Promise<Map<string, string>> {
    const out = await this.storedCodes(visitIds);
    const missing = visitIds.filter((id) => !out.has(id));
    if (missing.length === 0) return out;
    await this.writes.run(async (manager) => {
      const repository = manager.getRepository(VisitBlindCode);
      const taken = new Set(
        (await repository.find({ where: { studyId }, select: { code: true } })).map((r) => r.code),
      );
      // Read again inside the transaction: another request may have made some meanwhile.
      const now = await this.storedCodes(missing, manager.getRepository(VisitBlindCode));
      const rows = missing
        .filter((visitId) => !now.has(visitId))
        .map((visitId) => {
          const code = newBlindCode(taken);
          taken.add(code);
          return Object.assign(new VisitBlindCode(), {
            visitId,
            studyId,
            code,
            createdAt: nowIso(),
          });
        });
      for (let i = 0; i < rows.length; i += CHUNK) {
        await repository.insert(rows.slice(i, i + CHUNK));
      }
      for (const [visitId, code] of now) out.set(visitId, code);
      for (const row of rows) out.set(row.visitId, row.code);
    });
    return out;
  }

  private async storedCodes(
    visitIds: readonly string[],
    repository = this.dataSource.getRepository(VisitBlindCode),
  ): Promise<Map<string, string>> {
    const out = new Map<string, string>();
    for (let i = 0; i < visitIds.length; i += CHUNK) {
      const rows = await repository.find({
        where: { visitId: In(visitIds.slice(i, i + CHUNK)) },
        select: { visitId: true, code: true },
      });
      for (const row of rows) out.set(row.visitId, row.code);
    }
    return out;
  }
}
