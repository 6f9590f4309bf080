import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import {
  isCalendarDate,
  isOutOfWindow,
  RECORDING_KINDS,
  subject,
  visitScheduleStatus,
  type BulkUploadReport,
  type BulkUploadRowReport,
  type BulkUploadStrayFile,
  type RecordingKind,
} from '@gyre/shared';
import { AuditService, studyEntryScope } from '../audit/audit.service';
import type { Caller } from '../auth/decorators';
import { Participant } from '../participants/participant.entity';
import type { AcceptedFileCheck } from '../recordings/recordings.service';
import { RecordingsService } from '../recordings/recordings.service';
import type { PlannedVisit } from '../schedule/planned-visit.entity';
import { PlannedVisitsService } from '../schedule/planned-visits.service';
import { Visit } from '../visits/visit.entity';
import { VisitsService } from '../visits/visits.service';
import type { ReceivedBulkUpload } from './bulk-upload-receiver';
import { BulkUploadsError, bulkUploadsError } from './bulk-uploads.errors';
import { parseManifest, type ManifestRow } from './manifest';

/** A row that passed every check, with what the import needs. */
interface PlannedRow {
  report: BulkUploadRowReport;
  participant: Participant;
  planned: PlannedVisit;
  /** The existing visit, or the key of the visit the import creates. */
  visit: Visit | null;
  visitDate: string;
  check: AcceptedFileCheck;
}

/**
 * Bulk upload of a study's recordings from a CSV manifest: every row is checked on its own
 * (participant in the caller's sites, planned visit, kind, files, visit date, the recordings
 * module's own validation lane and kind check, no replacement), then either every visit,
 * recording and job is written in one transaction or nothing is.
 */
@Injectable()
export class BulkUploadsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly plannedVisits: PlannedVisitsService,
    private readonly recordings: RecordingsService,
    private readonly visits: VisitsService,
    private readonly audit: AuditService,
  ) {}

  async run(
    caller: Caller,
    studyId: string,
    upload: ReceivedBulkUpload,
    options: { dryRun: boolean; maxRows: number },
  ): Promise<BulkUploadReport> {
    const rows = parseManifest(upload.manifest, options.maxRows);
    const planned = await this.check(caller, studyId, rows, upload);
    const report = reportOf(studyId, options.dryRun, planned.reports, planned.strays);
    if (report.summary.errors > 0 || report.strayFiles.length > 0) {
      if (options.dryRun) return report;
      throw bulkUploadsError(
        BulkUploadsError.RowsInvalid,
        `Nothing was imported: ${report.summary.errors} of ${report.summary.rows} rows failed${report.strayFiles.length > 0 ? `, ${report.strayFiles.length} uploaded file(s) are not in the manifest` : ''}. See details.report.`,
        { report },
      );
    }
    if (options.dryRun) return report;
    await this.importAll(caller, studyId, planned.rows);
    return { ...report, imported: true };
  }

  /** Every row checked and reported on its own; the rows that passed, ready to import. */
  private async check(
    caller: Caller,
    studyId: string,
    rows: ManifestRow[],
    upload: ReceivedBulkUpload,
  ): Promise<{
    reports: BulkUploadRowReport[];
    rows: PlannedRow[];
    strays: BulkUploadStrayFile[];
  }> {
    const codes = [...new Set(rows.map((r) => r.cells.participant_code))];
    const participants = new Map(
      (
        await this.dataSource
          .getRepository(Participant)
          .find({ where: { studyId, code: In(codes) } })
      ).map((p) => [p.code.toLowerCase(), p]),
    );
    const schedule = await this.plannedVisits.ofStudy(studyId);
    const byName = new Map(schedule.map((p) => [p.name.toLowerCase(), p]));
    const visits = await this.dataSource.getRepository(Visit).find({
      where: { participantId: In([...participants.values()].map((p) => p.id)), studyId },
    });
    const visitOf = (participantId: string, plannedId: string): Visit | null =>
      visits.find((v) => v.participantId === participantId && v.plannedVisitId === plannedId) ??
      null;

    const reports: BulkUploadRowReport[] = [];
    const passing: Array<
      Omit<PlannedRow, 'check'> & { onsetsCsv: Buffer | null; confirm: boolean }
    > = [];
    const seenSlot = new Map<string, number>();
    const seenFile = new Map<string, number>();
    const newVisitDates = new Map<string, { date: string; row: number }>();
    const named = new Set<string>();

    for (const { row, cells } of rows) {
      const report: BulkUploadRowReport = {
        row,
        participantCode: cells.participant_code,
        plannedVisit: cells.planned_visit,
        kind: cells.kind,
        file: cells.file,
        onsetsFile: cells.onsets_file === '' ? null : cells.onsets_file,
        status: 'ok',
        errors: [],
        warnings: [],
        visit: null,
        recordingId: null,
        visitId: null,
      };
      reports.push(report);
      const errors = report.errors;
      if (cells.file !== '') named.add(cells.file);
      if (report.onsetsFile !== null) named.add(report.onsetsFile);

      const participant = participants.get(cells.participant_code.toLowerCase()) ?? null;
      if (cells.participant_code === '') errors.push('participant_code: empty');
      else if (participant === null) {
        errors.push(`participant_code: no participant ${cells.participant_code} in this study`);
      } else if (
        !caller.ability.can(
          'upload',
          subject('Recording', { studyId, siteId: participant.siteId }),
        ) ||
        !caller.ability.can('create', subject('Visit', { studyId, siteId: participant.siteId }))
      ) {
        errors.push(
          `participant_code: ${cells.participant_code} belongs to a site you do not upload for`,
        );
      }
      const plannedVisit = byName.get(cells.planned_visit.toLowerCase()) ?? null;
      if (plannedVisit === null) {
        errors.push(
          schedule.length === 0
            ? `planned_visit: the study has no visit schedule, so '${cells.planned_visit}' names nothing`
            : `planned_visit: '${cells.planned_visit}' found, one of ${schedule.map((p) => p.name).join(', ')} expected`,
        );
      }
      const kind = (RECORDING_KINDS as readonly string[]).includes(cells.kind.toLowerCase())
        ? (cells.kind.toLowerCase() as RecordingKind)
        : null;
      if (kind === null) {
        errors.push(`kind: '${cells.kind}' found, one of ${RECORDING_KINDS.join(', ')} expected`);
      }
      const confirm = cells.confirm_kind.toLowerCase();
      if (!['', 'true', 'false'].includes(confirm)) {
        errors.push(`confirm_kind: '${cells.confirm_kind}' found, true, false or empty expected`);
      }
      const file = upload.recordings.get(cells.file) ?? null;
      if (cells.file === '')
        errors.push('file: empty, the name of an uploaded EDF/EDF+ file expected');
      else if (file === null) {
        errors.push(
          upload.onsets.has(cells.file)
            ? `file: ${cells.file} is a CSV, an EDF/EDF+ recording expected`
            : `file: ${cells.file} is not among the uploaded files`,
        );
      } else if (seenFile.has(cells.file)) {
        errors.push(`file: ${cells.file} is already named by row ${seenFile.get(cells.file)}`);
      } else {
        const sameBytes = [...seenFile.keys()].find(
          (other) => upload.recordings.get(other)?.sha256 === file.sha256,
        );
        if (sameBytes !== undefined) {
          errors.push(
            `file: ${cells.file} has the same content as ${sameBytes} (row ${seenFile.get(sameBytes)})`,
          );
        }
      }
      if (cells.file !== '' && !seenFile.has(cells.file)) seenFile.set(cells.file, row);
      let onsetsCsv: Buffer | null = null;
      if (report.onsetsFile !== null) {
        onsetsCsv = upload.onsets.get(report.onsetsFile) ?? null;
        if (onsetsCsv === null) {
          errors.push(
            /\.csv$/i.test(report.onsetsFile)
              ? `onsets_file: ${report.onsetsFile} is not among the uploaded files`
              : `onsets_file: ${report.onsetsFile} found, a file name ending in .csv expected`,
          );
        }
        if (kind === 'resting') errors.push('onsets_file: onsets only beside a task recording');
      }
      if (participant !== null && plannedVisit !== null && kind !== null) {
        const slot = `${participant.id}|${plannedVisit.id}|${kind}`;
        const earlier = seenSlot.get(slot);
        if (earlier !== undefined) {
          errors.push(
            `duplicate row: row ${earlier} already uploads the ${kind} recording of ${participant.code} at ${plannedVisit.name}`,
          );
        } else seenSlot.set(slot, row);
      }

      // The visit: existing, or created with visit_date; its date against the window.
      let visit: Visit | null = null;
      let visitDate = cells.visit_date;
      if (participant !== null && plannedVisit !== null) {
        visit = visitOf(participant.id, plannedVisit.id);
        report.visit = visit === null ? 'new' : 'existing';
        report.visitId = visit?.id ?? null;
        if (visit === null) {
          if (visitDate === '') {
            errors.push(
              `visit_date: ${participant.code} has no visit at ${plannedVisit.name} yet; give its date (YYYY-MM-DD) to create it`,
            );
          } else if (!isCalendarDate(visitDate)) {
            errors.push(`visit_date: '${visitDate}' found, a calendar date YYYY-MM-DD expected`);
          } else {
            const key = `${participant.id}|${plannedVisit.id}`;
            const other = newVisitDates.get(key);
            if (other === undefined) newVisitDates.set(key, { date: visitDate, row });
            else if (other.date !== visitDate) {
              errors.push(
                `visit_date: ${visitDate} found, row ${other.row} creates this visit on ${other.date}`,
              );
            }
          }
        } else {
          if (visitDate !== '' && visitDate !== visit.visitDate) {
            report.warnings.push(
              `visit_date: the visit exists (${visit.visitDate}); ${visitDate} is ignored`,
            );
          }
          visitDate = visit.visitDate;
        }
        if (isCalendarDate(visitDate) && participant.enrolmentDate !== null) {
          const status = visitScheduleStatus({
            visitDate,
            enrolmentDate: participant.enrolmentDate,
            planned: plannedVisit,
          });
          if (isOutOfWindow(status.window)) {
            report.warnings.push(
              `visit date ${visitDate} is ${status.window} for ${plannedVisit.name}: study day ${status.studyDay}, target day ${plannedVisit.targetDay} (window −${plannedVisit.windowBeforeDays}/+${plannedVisit.windowAfterDays} days)`,
            );
          }
        }
      }
      if (errors.length === 0 && visit !== null && kind !== null && file !== null) {
        const conflict = await this.recordings.conflictWithVisit(visit.id, kind, file.sha256);
        if (conflict !== null) errors.push(conflict);
      }
      if (errors.length === 0 && participant !== null && plannedVisit !== null) {
        passing.push({
          report,
          participant,
          planned: plannedVisit,
          visit,
          visitDate,
          onsetsCsv,
          confirm: confirm === 'true',
        });
      }
    }

    // The file checks last, one after another in the validation lane.
    const ready: PlannedRow[] = [];
    for (const row of passing) {
      const file = upload.recordings.get(row.report.file);
      if (file === undefined) continue;
      const check = await this.recordings.checkFile(
        file,
        row.report.kind.toLowerCase() as RecordingKind,
        row.onsetsCsv,
        row.confirm,
      );
      if (!check.ok) {
        row.report.errors.push(`${check.code}: ${check.message}`);
        continue;
      }
      if (check.warning !== null) row.report.warnings.push(check.warning);
      ready.push({ ...row, check });
    }
    for (const report of reports) {
      report.status =
        report.errors.length > 0 ? 'error' : report.warnings.length > 0 ? 'warning' : 'ok';
    }
    const strays: BulkUploadStrayFile[] = [
      ...[...upload.recordings.keys(), ...upload.onsets.keys()]
        .filter((name) => !named.has(name))
        .map((file) => ({ file, message: `${file} was uploaded but no manifest row names it` })),
      ...upload.repeatedNames.map((file) => ({
        file,
        message: `${file} was uploaded more than once`,
      })),
    ];
    return { reports, rows: ready, strays };
  }

  /**
   * One transaction: the new visits, every recording (queued, with its job and its audit
   * entries) and the bulk-upload entry; the stored files are put in place as its last step, so
   * a crash before the commit leaves only files that start-up removes (no recording names them).
   */
  private async importAll(caller: Caller, studyId: string, rows: PlannedRow[]): Promise<void> {
    await this.recordings.acceptInOneTransaction({
      checks: rows.map((r) => r.check),
      write: async (tx) => {
        const recordingIds: string[] = [];
        const created = new Map<string, Visit>();
        for (const row of rows) {
          let visit = row.visit;
          if (visit === null) {
            const key = `${row.participant.id}|${row.planned.id}`;
            visit = created.get(key) ?? null;
            if (visit === null) {
              visit = await this.visits.insertPlanned(tx, caller, {
                participant: row.participant,
                planned: row.planned,
                visitDate: row.visitDate,
                reason: 'bulk upload',
              });
              created.set(key, visit);
            }
          }
          const recording = await this.recordings.createAccepted(tx, caller, visit, row.check);
          recordingIds.push(recording.id);
          row.report.recordingId = recording.id;
          row.report.visitId = visit.id;
        }
        const siteIds = rows.map((r) => r.participant.siteId);
        await this.audit.recordBy(caller, studyEntryScope(studyId, siteIds), {
          action: 'bulk-upload',
          objectType: 'Study',
          objectId: studyId,
          after: {
            rows: rows.map((r) => ({
              row: r.report.row,
              participantCode: r.report.participantCode,
              plannedVisit: r.report.plannedVisit,
              kind: r.report.kind,
              file: r.report.file,
              checksumSha256: r.check.file.sha256,
              visitId: r.report.visitId,
              recordingId: r.report.recordingId,
              newVisit: r.visit === null,
              warnings: r.report.warnings,
            })),
          },
        });
        return recordingIds;
      },
      rolledBack: () => {
        for (const row of rows) {
          row.report.recordingId = null;
          row.report.visitId = row.visit?.id ?? null;
        }
      },
      conflict: () =>
        bulkUploadsError(
          BulkUploadsError.Conflict,
          'Nothing was imported: another upload created one of these visits or recordings meanwhile. Check again (dry run) and retry.',
        ),
    });
  }
}

function reportOf(
  studyId: string,
  dryRun: boolean,
  rows: BulkUploadRowReport[],
  strayFiles: BulkUploadStrayFile[],
): BulkUploadReport {
  const newVisits = new Set(
    rows
      .filter((r) => r.visit === 'new' && r.status !== 'error')
      .map((r) => `${r.participantCode.toLowerCase()}|${r.plannedVisit.toLowerCase()}`),
  );
  return {
    studyId,
    dryRun,
    imported: false,
    rows,
    strayFiles,
    summary: {
      rows: rows.length,
      ok: rows.filter((r) => r.status === 'ok').length,
      warnings: rows.filter((r) => r.status === 'warning').length,
      errors: rows.filter((r) => r.status === 'error').length,
      newVisits: newVisits.size,
    },
  };
}
