import { createHash } from 'node:crypto';
import { once } from 'node:events';
import { Injectable } from '@nestjs/common';
import archiver from 'archiver';
import type { Response } from 'express';
import { AuditService } from '../audit/audit.service';
import type { Caller } from '../auth/decorators';
import { BlindingService } from '../blinding/blinding.service';
import { bidsFiles, measureRowCount } from './bids-layout';
import { CONDITION_FREE_TEXT, CONDITION_HEADER, conditionRows } from './condition-columns';
import type { StudyExportModel } from './export-model';
import { measuresOf } from './measures';
import {
  DICTIONARY_HEADER,
  dictionaryRows,
  RESULT_COLUMNS,
  RESULT_FREE_TEXT,
  RESULT_HEADER,
} from './results-columns';
import { StudyExportSources } from './study-export-sources';
import { tableText } from './table-text';

/** A piece of results.csv and the data rows it holds. */
interface CsvChunk {
  text: string;
  rows: number;
}

/** results.csv in pieces: the header, then one piece per recording (its measures' rows). */
export function* resultsCsvChunks(model: StudyExportModel): Generator<CsvChunk> {
  yield { text: tableText('csv', [], { header: RESULT_HEADER }), rows: 0 };
  const participants = new Map(model.participants.map((p) => [p.id, p]));
  for (const visit of model.visits) {
    const participant = participants.get(visit.participantId)!;
    for (const recording of visit.recordings) {
      const rows = measuresOf(recording).map((measure) =>
        RESULT_COLUMNS.map((c) =>
          c.value({ studyCode: model.study.code, participant, visit, recording, measure }),
        ),
      );
      yield { text: tableText('csv', rows, { freeText: RESULT_FREE_TEXT }), rows: rows.length };
    }
  }
}

/** The zip's folder (the derivative dataset's root) and the download's name. */
export function exportNames(studyCode: string, day: string): { root: string; file: string } {
  const root = `gyre-${studyCode}-derivatives`;
  return { root, file: `${root}-${day}.zip` };
}

/**
 * The study results exports: results.csv (tidy long format), its data dictionary and
 * export.zip (a BIDS derivatives folder). Each download is written to the audit trail before
 * its first byte, with what it holds and a SHA-256 the receiver can check (of the CSV's bytes;
 * of the zip's manifest of file checksums, since the zip's own bytes carry time stamps).
 * Both are streamed: the CSV a recording's rows at a time, the zip a file at a time.
 */
@Injectable()
export class StudyExportsService {
  constructor(
    private readonly sources: StudyExportSources,
    private readonly audit: AuditService,
    private readonly blinding: BlindingService,
  ) {}

  /** The study's export model; refused (403) to its analysts while blinded review is on. */
  private async openModel(caller: Caller, studyId: string): Promise<StudyExportModel> {
    await this.blinding.assertStudyOpen(caller, studyId, 'study exports are');
    return this.sources.model(caller, studyId);
  }

  async resultsCsv(caller: Caller, studyId: string, response: Response): Promise<void> {
    const model = await this.openModel(caller, studyId);
    // First pass: what the file holds, for the audit entry (rows and checksum; nothing kept).
    const hash = createHash('sha256');
    let rows = 0;
    for (const chunk of resultsCsvChunks(model)) {
      hash.update(chunk.text, 'utf8');
      rows += chunk.rows;
    }
    const sha256 = hash.digest('hex');
    const fileName = `gyre-${model.study.code}-results-${today()}.csv`;
    await this.record(caller, model, {
      export: 'results.csv',
      fileName,
      rows,
      columns: RESULT_HEADER.length,
      visits: model.visits.filter((v) => v.recordings.length > 0).length,
      sha256,
    });
    startDownload(response, 'text/csv; charset=utf-8', fileName);
    response.setHeader('X-Content-SHA256', sha256);
    for (const chunk of resultsCsvChunks(model)) {
      if (response.destroyed) return;
      if (!response.write(chunk.text)) await drained(response);
    }
    response.end();
  }

  /** conditions.csv: one row per visit × task recording × condition (audited as results.csv). */
  async conditionsCsv(caller: Caller, studyId: string, response: Response): Promise<void> {
    const model = await this.openModel(caller, studyId);
    const rows = [...conditionRows(model)];
    const text = tableText(
      'csv',
      rows.map((r) => r.cells),
      { header: CONDITION_HEADER, freeText: CONDITION_FREE_TEXT },
    );
    const sha256 = createHash('sha256').update(text, 'utf8').digest('hex');
    const fileName = `gyre-${model.study.code}-conditions-${today()}.csv`;
    await this.record(caller, model, {
      export: 'conditions.csv',
      fileName,
      rows: rows.length,
      columns: CONDITION_HEADER.length,
      visits: new Set(rows.map((r) => r.context.visit.id)).size,
      sha256,
    });
    startDownload(response, 'text/csv; charset=utf-8', fileName);
    response.setHeader('X-Content-SHA256', sha256);
    response.end(text);
  }

  async dictionaryCsv(caller: Caller, studyId: string, response: Response): Promise<void> {
    // The study must be the caller's to export, as for the data; the dictionary holds none.
    await this.sources.model(caller, studyId);
    startDownload(response, 'text/csv; charset=utf-8', 'gyre-results-dictionary.csv');
    response.end(tableText('csv', dictionaryRows(), { header: DICTIONARY_HEADER }));
  }

  async exportZip(caller: Caller, studyId: string, response: Response): Promise<void> {
    const model = await this.openModel(caller, studyId);
    const names = exportNames(model.study.code, today());
    // First pass: the manifest (sha256sum's format, "<hex>  <path>\n" per file, in zip order).
    const manifest = createHash('sha256');
    let files = 0;
    for (const file of bidsFiles(model)) {
      const digest = createHash('sha256').update(file.content, 'utf8').digest('hex');
      manifest.update(`${digest}  ${names.root}/${file.path}\n`, 'utf8');
      files += 1;
    }
    const manifestSha256 = manifest.digest('hex');
    await this.record(caller, model, {
      export: 'export.zip',
      fileName: names.file,
      files,
      rows: measureRowCount(model),
      manifestSha256,
    });
    startDownload(response, 'application/zip', names.file);
    response.setHeader('X-Content-Manifest-SHA256', manifestSha256);
    const archive = archiver('zip', { zlib: { level: 6 } });
    const stop = new AbortController();
    response.once('close', () => stop.abort());
    archive.on('warning', (error) => archive.emit('error', error));
    archive.pipe(response);
    const date = new Date();
    try {
      for (const file of bidsFiles(model)) {
        const added = once(archive, 'entry', { signal: stop.signal });
        archive.append(file.content, { name: `${names.root}/${file.path}`, date });
        // One file at a time: the next is written only when the archive has taken this one.
        await added;
      }
      await archive.finalize();
    } catch (error) {
      archive.abort();
      if (!stop.signal.aborted) response.destroy(error as Error);
    }
  }

  private async record(
    caller: Caller,
    model: StudyExportModel,
    after: Record<string, unknown>,
  ): Promise<void> {
    await this.audit.record({
      actor: caller.user,
      action: 'export',
      objectType: 'Study',
      objectId: model.study.id,
      studyId: model.study.id,
      siteId: null,
      after: { studyCode: model.study.code, ...after },
      clientIp: caller.clientIp,
    });
  }
}

function today(): string {
  return new Date().toISOString().slice(0, 10);
}

function startDownload(response: Response, contentType: string, fileName: string): void {
  response.status(200);
  response.setHeader('Content-Type', contentType);
  response.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
  response.setHeader('Cache-Control', 'no-store');
  response.setHeader(
    'Access-Control-Expose-Headers',
    'Content-Disposition, X-Content-SHA256, X-Content-Manifest-SHA256',
  );
}

function drained(response: Response): Promise<void> {
  return new Promise((resolve) => {
    const done = (): void => {
      response.off('drain', done);
      response.off('close', done);
      resolve();
    };
    response.once('drain', done);
    response.once('close', done);
  });
}
