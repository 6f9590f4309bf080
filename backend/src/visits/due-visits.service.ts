import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, Not, IsNull, Repository, type FindOptionsWhere } from 'typeorm';
import { dueVisits, isCalendarDate, type DueListView, type DueParticipantView } from '@gyre/shared';
import { scopedWhere } from '../auth/access-scope';
import { Caller } from '../auth/decorators';
import { Participant } from '../participants/participant.entity';
import { ParticipantsService } from '../participants/participants.service';
import { PlannedVisitsService } from '../schedule/planned-visits.service';
import { StudiesService } from '../studies/studies.service';
import { Visit } from './visit.entity';
import { VisitsError, visitsError } from './visits.errors';

/**
 * What is due in a study on a day: per participant in the caller's scope, the planned visits
 * whose window is open or has closed without a visit (the rule is `dueVisits` in @gyre/shared).
 */
@Injectable()
export class DueVisitsService {
  constructor(
    @InjectRepository(Visit) private readonly visits: Repository<Visit>,
    private readonly studies: StudiesService,
    private readonly participants: ParticipantsService,
    private readonly plannedVisits: PlannedVisitsService,
  ) {}

  async list(
    caller: Caller,
    studyId: string,
    query: { asOf?: string; siteId?: string },
  ): Promise<DueListView> {
    await this.studies.findInScope(caller, 'read', studyId);
    const asOf = query.asOf ?? new Date().toISOString().slice(0, 10);
    if (!isCalendarDate(asOf)) {
      throw visitsError(
        VisitsError.BadDate,
        `asOf: ${JSON.stringify(asOf)} is not a calendar date (YYYY-MM-DD)`,
        { field: 'asOf', value: asOf },
      );
    }
    const where: FindOptionsWhere<Participant> = { studyId };
    if (query.siteId !== undefined) where.siteId = query.siteId;
    // Whoever may read a site's visits sees what is due there.
    const participants = await this.participants.listInScopeOf(caller, 'read', 'Visit', where);
    const schedule = await this.plannedVisits.ofStudy(studyId);
    const enrolled = participants.filter((p) => p.enrolmentDate !== null);
    const done = new Map<string, Set<string>>();
    if (schedule.length > 0 && enrolled.length > 0) {
      const rows = await this.visits.find({
        select: { participantId: true, plannedVisitId: true },
        where: scopedWhere<Visit>(caller.ability, 'read', 'Visit', {
          studyId,
          participantId: In(enrolled.map((p) => p.id)),
          plannedVisitId: Not(IsNull()),
        }),
      });
      for (const row of rows) {
        const set = done.get(row.participantId) ?? new Set<string>();
        set.add(row.plannedVisitId ?? '');
        done.set(row.participantId, set);
      }
    }
    const items: DueParticipantView[] = [];
    for (const participant of enrolled) {
      const due = dueVisits({
        schedule,
        enrolmentDate: participant.enrolmentDate ?? '',
        done: done.get(participant.id) ?? new Set(),
        asOf,
      });
      if (due.length === 0) continue;
      items.push({
        participantId: participant.id,
        participantCode: participant.code,
        siteId: participant.siteId,
        groupId: participant.groupId,
        enrolmentDate: participant.enrolmentDate ?? '',
        due,
      });
    }
    // Most urgent first: the window that closed (or closes) first, then the code.
    items.sort(
      (a, b) =>
        a.due[0].closes.localeCompare(b.due[0].closes) ||
        a.participantCode.localeCompare(b.participantCode),
    );
    return {
      studyId,
      asOf,
      participants: items,
      withoutEnrolmentDate: participants.length - enrolled.length,
    };
  }
}
