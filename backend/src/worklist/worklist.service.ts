import { Injectable } from '@nestjs/common';
import {
  REVIEW_SECTIONS,
  UPLOAD_SECTIONS,
  WORKLIST_DEFAULT_LIMIT,
  type WorklistView,
  type WorklistSectionKey,
} from '@gyre/shared';
import type { Caller } from '../auth/decorators';
import { WorklistError, worklistError } from './worklist.errors';
import { nowIso } from '../common/time';
import { FlagsService } from '../flags/flags.service';
import type { Flag } from '../flags/flag.entity';
import { BlindingService } from '../blinding/blinding.service';
import { VisitReviewsService } from '../visit-reviews/visit-reviews.service';
import { WorklistQueryDto } from './dto/worklist-query.dto';
import {
  reviewSections,
  SECTION_TITLES,
  SectionItems,
  shownItem,
  sortItems,
  uploadSections,
} from './worklist-sections';
import { CHUNK, WorklistSources } from './worklist-sources';

/**
 * The home screen's worklist. Analysts and monitors get the study's review work (a monitor
 * reads the same list and cannot act on it); technicians get their site's uploads that need
 * attention. Built from a fixed number of queries whatever the number of visits.
 */
@Injectable()
export class WorklistService {
  constructor(
    private readonly sources: WorklistSources,
    private readonly reviews: VisitReviewsService,
    private readonly flags: FlagsService,
    private readonly blinding: BlindingService,
  ) {}

  async forCaller(caller: Caller, query: WorklistQueryDto): Promise<WorklistView> {
    const kind = caller.ability.can('read', 'VisitReview') ? 'review' : 'uploads';
    const keys: readonly WorklistSectionKey[] =
      kind === 'review' ? REVIEW_SECTIONS : UPLOAD_SECTIONS;
    if (query.section !== undefined && !keys.includes(query.section)) {
      throw worklistError(
        WorklistError.SectionNotYours,
        `section: "${query.section}" is not a section of your worklist; expected one of ${keys.join(', ')}`,
        { field: 'section', found: query.section, expected: keys },
      );
    }
    const items =
      kind === 'review'
        ? await this.shown(caller, await this.reviewItems(caller))
        : await this.uploadItems(caller);
    const sort = query.sort ?? 'oldest';
    const limit = query.limit ?? WORKLIST_DEFAULT_LIMIT;
    const offset = query.offset ?? 0;
    return {
      kind,
      readOnly: kind === 'review' && !caller.ability.can('create', 'VisitReview'),
      sort,
      limit,
      offset,
      generatedAt: nowIso(),
      sections: keys
        .filter((key) => query.section === undefined || key === query.section)
        .map((key) => {
          const all = items[key] ?? [];
          return {
            key,
            title: SECTION_TITLES[key],
            total: all.length,
            items: sortItems(all, sort).slice(offset, offset + limit),
          };
        }),
    };
  }

  private async reviewItems(caller: Caller): Promise<SectionItems> {
    const studyId = caller.user.studyId;
    if (studyId === null) return {};
    const [recordings, reports, reviews] = [
      await this.sources.currentRecordings(caller),
      await this.sources.reports(caller),
      await this.reviews.latestByVisit({ studyIds: [studyId] }),
    ];
    // Flags only of the visits whose task run suggests slowing: usually a few.
    const suggesting = [
      ...new Set(
        recordings.filter((r) => r.kind === 'task' && r.suggestsSlowing).map((r) => r.visitId),
      ),
    ];
    const flags: Flag[] = [];
    for (let i = 0; i < suggesting.length; i += CHUNK) {
      flags.push(...(await this.flags.forVisits(suggesting.slice(i, i + CHUNK))));
    }
    return reviewSections({ recordings, reports, reviews, flags });
  }

  /** Blinded review: each item of a visit blinded for the caller under its code (before sorting). */
  private async shown(caller: Caller, items: SectionItems): Promise<SectionItems> {
    const all = Object.values(items).flat();
    const blinded = await this.blinding.blindedVisits(caller, [
      ...new Set(all.map((i) => i.visitId)),
    ]);
    if (blinded.size === 0) return items;
    return Object.fromEntries(
      Object.entries(items).map(([key, list]) => [key, list.map((i) => shownItem(i, blinded))]),
    );
  }

  private async uploadItems(caller: Caller): Promise<SectionItems> {
    const today = nowIso().slice(0, 10);
    const uploads = await this.sources.uploads(caller);
    const visitsDue = await this.sources.visitsUpTo(caller, today);
    const warnings = await this.sources.warningsOf(
      uploads.filter((u) => u.hasWarnings && u.state !== 'rejected').map((u) => u.recordingId),
    );
    return uploadSections({ uploads, visitsDue, warnings });
  }
}
