import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { EventEmitter2 } from '@nestjs/event-emitter';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager } from 'typeorm';
import {
  subject,
  type BidsBadChannel,
  type BidsImportPreview,
  type VisitAnalysisOverrideValues,
} from '@gyre/shared';
import { AnalysisEvents, type VisitOverrideChanged } from '../analysis/analysis.events';
import { AnalysisSettingsService, valuesOf } from '../analysis/analysis-settings.service';
import { VisitAnalysisOverride } from '../analysis/visit-analysis-override.entity';
import {
  valuesOfOverrideJson,
  VisitAnalysisOverridesService,
} from '../analysis/visit-analysis-overrides.service';
import { AuditService, studyEntryScope } from '../audit/audit.service';
import { AuditedWrites } from '../audit/audited-writes';
import type { Caller } from '../auth/decorators';
import { nowIso } from '../common/time';
import { Participant } from '../participants/participant.entity';
import { toParticipantView } from '../participants/participant-view';
import type { AcceptedFileCheck } from '../recordings/recordings.service';
import { RecordingsService } from '../recordings/recordings.service';
import { PlannedVisitsService } from '../schedule/planned-visits.service';
import { normaliseChannelLabel } from '@gyre/shared/channel-labels';
import { SitesService } from '../sites/sites.service';
import { Visit } from '../visits/visit.entity';
import { VisitsService } from '../visits/visits.service';
import { BidsImportFile } from './bids-import-file.entity';
import { planImport, type PlannedFile } from './bids-import-plan';
import type { ReceivedBidsUpload } from './bids-import-receiver';
import { BidsImportError, bidsImportError } from './bids-import.errors';

/** A file that passed every check, with its checked recording. */
type CheckedFile = PlannedFile & { check: AcceptedFileCheck };

/** What a new visit's bad channels change: the visit's region of interest. */
interface RoiChange {
  visitKey: string;
  values: VisitAnalysisOverrideValues;
  previousRevision: number;
  reason: string;
}

/**
 * EEG-BIDS import of a study's recordings: maps every recording of the uploaded folder to a
 * participant and planned visit (bids-import-plan.ts), checks each file exactly as an upload is
 * checked (the recordings module's validation lane and kind check), answers the preview, and on
 * confirmation writes every participant, visit, recording, region-of-interest change and audit
 * entry in one transaction, or nothing.
 */
@Injectable()
export class BidsImportService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly sites: SitesService,
    private readonly plannedVisits: PlannedVisitsService,
    private readonly recordings: RecordingsService,
    private readonly visits: VisitsService,
    private readonly analysisSettings: AnalysisSettingsService,
    private readonly overrides: VisitAnalysisOverridesService,
    private readonly audit: AuditService,
    private readonly audited: AuditedWrites,
    private readonly events: EventEmitter2,
  ) {}

  async run(
    caller: Caller,
    studyId: string,
    upload: ReceivedBidsUpload,
    dryRun: boolean,
  ): Promise<BidsImportPreview> {
    const newSiteId = await this.newParticipantSite(caller, studyId, upload);
    const participants = await this.dataSource
      .getRepository(Participant)
      .find({ where: { studyId } });
    const visits = await this.dataSource.getRepository(Visit).find({ where: { studyId } });
    const planned = planImport(upload, {
      studyId,
      ability: caller.ability,
      participants,
      schedule: await this.plannedVisits.ofStudy(studyId),
      visits,
      newParticipantSiteId: newSiteId,
      visitDate: upload.fields.visitDate?.trim() || null,
    });
    const problems = [
      ...upload.repeated.map((path) => `${path}: sent more than once`),
      ...(upload.recordings.size === 0
        ? ['no *_eeg.edf or *_eeg.bdf found; a BIDS session folder (sub-*/ses-*/eeg/) expected']
        : []),
    ];
    const checked = await this.check(planned, upload);
    const roiChanges = await this.roiChanges(studyId, checked);
    const preview = previewOf(studyId, dryRun, planned, problems);
    if (preview.summary.withProblems > 0 || problems.length > 0) {
      if (dryRun) return preview;
      throw bidsImportError(
        BidsImportError.FilesInvalid,
        `Nothing was imported: ${[...problems, ...planned.flatMap((f) => f.preview.problems)].join(
          '; ',
        )}`,
        { preview },
      );
    }
    if (dryRun) return preview;
    await this.importAll(caller, studyId, newSiteId, checked, roiChanges);
    return { ...preview, imported: true };
  }

  /** The site unknown `sub-` labels become participants at; null when the form does not ask. */
  private async newParticipantSite(
    caller: Caller,
    studyId: string,
    upload: ReceivedBidsUpload,
  ): Promise<string | null> {
    const create = upload.fields.createParticipants ?? 'false';
    if (create !== 'true' && create !== 'false') {
      throw bidsImportError(
        BidsImportError.FormInvalid,
        `createParticipants: '${create}' found, 'true' or 'false' expected`,
        { field: 'createParticipants' },
      );
    }
    if (create === 'false') return null;
    const siteId = upload.fields.siteId ?? caller.user.siteId;
    if (siteId === null || siteId === undefined) {
      throw bidsImportError(
        BidsImportError.FormInvalid,
        'siteId: required to create participants for your role (you belong to no single site)',
        { field: 'siteId' },
      );
    }
    const site = await this.sites.findInScope(caller, 'read', siteId);
    if (
      site.studyId !== studyId ||
      !caller.ability.can('create', subject('Participant', { studyId, siteId }))
    ) {
      throw bidsImportError(
        BidsImportError.FormInvalid,
        `siteId: ${siteId} is not a site of this study where you may add participants`,
        { field: 'siteId' },
      );
    }
    return siteId;
  }

  /** Each mapped file: no conflict with its visit, then the validation lane and kind check. */
  private async check(planned: PlannedFile[], upload: ReceivedBidsUpload): Promise<CheckedFile[]> {
    const checked: CheckedFile[] = [];
    for (const entry of planned) {
      const file = entry.preview;
      const received = upload.recordings.get(file.path);
      if (received === undefined) continue;
      if (entry.visit !== null && file.problems.length === 0) {
        const conflict = await this.recordings.conflictWithVisit(
          entry.visit.id,
          file.kind,
          received.sha256,
        );
        if (conflict !== null) file.problems.push(`duplicate session: ${conflict}`);
      }
      if (file.problems.length > 0) continue;
      const check = await this.recordings.checkFile(received, file.kind, entry.onsetsCsv, false);
      if (!check.ok) {
        file.problems.push(`${check.code}: ${check.message}`);
        continue;
      }
      if (entry.onsetsCsv !== null) file.onsetCount = check.facts.csvOnsets?.length ?? 0;
      else if (file.kind === 'task') file.onsetCount = check.facts.stimulusOnsetCount;
      checked.push({ ...entry, check });
    }
    return checked;
  }

  /**
   * The channels `*_channels.tsv` marks bad leave the visit's region of interest through the
   * visit's own analysis choices, the same override an analyst sets (reason: the file's
   * `status_description`). A visit whose every region-of-interest channel is bad is refused.
   */
  private async roiChanges(studyId: string, checked: CheckedFile[]): Promise<RoiChange[]> {
    const byVisit = new Map<string, { bad: BidsBadChannel[]; files: CheckedFile[] }>();
    for (const file of checked) {
      if (file.preview.channelsLeftOut.length === 0) continue;
      const key = visitKey(file);
      const group = byVisit.get(key) ?? { bad: [], files: [] };
      group.bad.push(...file.preview.channelsLeftOut);
      group.files.push(file);
      byVisit.set(key, group);
    }
    const changes: RoiChange[] = [];
    for (const [key, { bad, files }] of byVisit) {
      const visitId = files[0].visit?.id ?? null;
      const roiNow =
        visitId === null
          ? valuesOf(await this.analysisSettings.currentFor(studyId)).roi
          : (await this.overrides.effectiveFor(studyId, visitId)).settings.roi;
      const previous =
        visitId === null
          ? null
          : await this.dataSource
              .getRepository(VisitAnalysisOverride)
              .findOne({ where: { visitId }, order: { revision: 'DESC' } });
      const badNames = new Set(bad.map((c) => canonical(c.label)));
      const roi = roiNow.filter((name) => !badNames.has(canonical(name)));
      if (roi.length === roiNow.length) continue;
      if (roi.length === 0) {
        for (const file of files) {
          file.preview.problems.push(
            `channels.tsv: every region-of-interest channel (${roiNow.join(', ')}) is marked bad; nothing would remain to compute`,
          );
        }
        continue;
      }
      const left = roiNow.filter((name) => badNames.has(canonical(name)));
      const values =
        previous === null
          ? { roi: null, bandHz: null, onsetLabel: null }
          : valuesOfOverrideJson(previous.valuesJson);
      changes.push({
        visitKey: key,
        values: { ...values, roi },
        previousRevision: previous?.revision ?? 0,
        reason: `EEG-BIDS channels.tsv marks bad: ${left
          .map((name) => {
            const why = bad.find((c) => canonical(c.label) === canonical(name))?.reason;
            return why === null || why === undefined ? name : `${name} (${why})`;
          })
          .join(', ')}`,
      });
    }
    return changes;
  }

  /**
   * One transaction: new participants and visits, every recording (queued, with its job and
   * audit entries), the visits' region-of-interest changes, the import's rows and its audit
   * entry; the stored files are put in place last, so a crash before the commit leaves only
   * files start-up removes.
   */
  private async importAll(
    caller: Caller,
    studyId: string,
    newSiteId: string | null,
    files: CheckedFile[],
    roiChanges: RoiChange[],
  ): Promise<void> {
    const importId = randomUUID();
    const overrideEvents: VisitOverrideChanged[] = [];
    await this.recordings.acceptInOneTransaction({
      checks: files.map((f) => f.check),
      write: async (tx) => {
        const recordingIds: string[] = [];
        const newParticipants = new Map<string, Participant>();
        const newVisits = new Map<string, Visit>();
        const visitIdOf = new Map<string, Visit>();
        for (const file of files) {
          let participant = file.participant;
          const code = file.preview.participantCode ?? '';
          if (participant === null) {
            participant =
              newParticipants.get(code) ??
              (await this.createParticipant(tx, caller, studyId, newSiteId ?? '', code));
            newParticipants.set(code, participant);
          }
          let visit = file.visit ?? newVisits.get(visitKey(file)) ?? null;
          if (visit === null) {
            visit = await this.createVisit(tx, caller, participant, file);
            newVisits.set(visitKey(file), visit);
          }
          visitIdOf.set(visitKey(file), visit);
          const recording = await this.recordings.createAccepted(
            tx,
            caller,
            visit,
            file.check,
            file.preview.lineFrequencyHz,
          );
          recordingIds.push(recording.id);
          file.preview.recordingId = recording.id;
          file.preview.visitId = visit.id;
          await tx.getRepository(BidsImportFile).insert({
            id: randomUUID(),
            importId,
            recordingId: recording.id,
            visitId: visit.id,
            studyId,
            siteId: visit.siteId,
            path: file.preview.path,
            task: file.preview.task,
            taskName: file.preview.taskName,
            lineFrequencyHz: file.preview.lineFrequencyHz,
            badChannelsJson: JSON.stringify(file.preview.channelsLeftOut),
            importedById: caller.user.id,
            createdAt: nowIso(),
          });
        }
        for (const change of roiChanges) {
          const visit = visitIdOf.get(change.visitKey);
          if (visit === undefined) continue;
          overrideEvents.push(await this.leaveOutChannels(tx, caller, visit, change));
        }
        const siteIds = [...visitIdOf.values()].map((v) => v.siteId);
        await this.audit.recordBy(caller, studyEntryScope(studyId, siteIds), {
          action: 'bids-import',
          objectType: 'Study',
          objectId: studyId,
          after: {
            importId,
            // No paths: a folder's name may say more than the pseudonymous code (as file names
            // are kept out of audit entries, docs/security.md).
            files: files.map((f) => ({
              task: f.preview.task,
              participantCode: f.preview.participantCode,
              plannedVisit: f.preview.plannedVisit,
              kind: f.preview.kind,
              checksumSha256: f.check.file.sha256,
              recordingId: f.preview.recordingId,
              visitId: f.preview.visitId,
              onsetCount: f.preview.onsetCount,
              channelsLeftOut: f.preview.channelsLeftOut,
              lineFrequencyHz: f.preview.lineFrequencyHz,
            })),
          },
        });
        return recordingIds;
      },
      rolledBack: () => {
        for (const file of files) {
          file.preview.recordingId = null;
          file.preview.visitId = file.visit?.id ?? null;
        }
      },
      conflict: () =>
        bidsImportError(
          BidsImportError.Conflict,
          'Nothing was imported: another upload created one of these participants, visits or recordings meanwhile. Check again and retry.',
        ),
    });
    for (const event of overrideEvents) {
      await this.events.emitAsync(AnalysisEvents.VisitOverrideChanged, event);
    }
  }

  private async createParticipant(
    tx: EntityManager,
    caller: Caller,
    studyId: string,
    siteId: string,
    code: string,
  ): Promise<Participant> {
    const at = nowIso();
    const participant: Participant = {
      id: randomUUID(),
      studyId,
      siteId,
      code,
      enrolmentDate: null,
      groupId: null,
      createdAt: at,
      updatedAt: at,
    };
    // The same entry as ParticipantsService writes for a new participant.
    await this.audited.insertIn(tx, caller, {
      entity: Participant,
      objectType: 'Participant',
      row: participant,
      scope: () => ({ studyId, siteId }),
      view: toParticipantView,
      reason: 'EEG-BIDS import',
    });
    return participant;
  }

  private createVisit(
    tx: EntityManager,
    caller: Caller,
    participant: Participant,
    file: CheckedFile,
  ): Promise<Visit> {
    const planned = file.planned;
    if (planned === null || file.preview.visitDate === null) {
      throw new Error(`${file.preview.path}: mapped without a planned visit or date`);
    }
    return this.visits.insertPlanned(tx, caller, {
      participant,
      planned,
      visitDate: file.preview.visitDate,
      reason: 'EEG-BIDS import',
    });
  }

  /** A new revision of the visit's analysis choices without the bad channels (audited). */
  private async leaveOutChannels(
    tx: EntityManager,
    caller: Caller,
    visit: Visit,
    change: RoiChange,
  ): Promise<VisitOverrideChanged> {
    const revision = change.previousRevision + 1;
    await tx.getRepository(VisitAnalysisOverride).insert({
      id: randomUUID(),
      visitId: visit.id,
      studyId: visit.studyId,
      siteId: visit.siteId,
      revision,
      valuesJson: JSON.stringify(change.values),
      reason: change.reason,
      createdById: caller.user.id,
      createdAt: nowIso(),
    });
    await this.audit.recordBy(caller, visit, {
      action: 'update',
      objectType: 'VisitAnalysisOverride',
      objectId: visit.id,
      before: { revision: change.previousRevision },
      after: { revision, ...change.values },
      reason: change.reason,
    });
    return {
      visitId: visit.id,
      revision,
      actor: { id: caller.user.id, email: caller.user.email },
      reason: change.reason,
    };
  }
}

/** The visit a file goes to: its participant (code) and planned visit. */
function visitKey(file: PlannedFile): string {
  return `${file.preview.participantCode ?? ''}|${file.planned?.id ?? ''}`;
}

/** A channel's 10-10 name (`EEG O2-REF` → `O2`), as the region of interest names it. */
function canonical(name: string): string {
  return (normaliseChannelLabel(name) ?? name).toLowerCase();
}

function previewOf(
  studyId: string,
  dryRun: boolean,
  planned: PlannedFile[],
  problems: string[],
): BidsImportPreview {
  const files = planned.map((f) => f.preview);
  const distinct = (keys: string[]): number => new Set(keys).size;
  return {
    studyId,
    dryRun,
    imported: false,
    files,
    problems,
    summary: {
      files: files.length,
      withProblems: files.filter((f) => f.problems.length > 0).length,
      newParticipants: distinct(
        files.filter((f) => f.participant === 'new').map((f) => f.participantCode ?? ''),
      ),
      newVisits: distinct(planned.filter((f) => f.preview.visit === 'new').map((f) => visitKey(f))),
    },
  };
}
