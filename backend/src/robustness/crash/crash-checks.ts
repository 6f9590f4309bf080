/**
 * What must hold once a server that was killed many times has settled: nothing left in a
 * transient state, every stored file intact and owned, no temporary file, every accepted
 * upload computed, runs that name their input, and an intact audit chain. Each problem is a
 * sentence naming the recording or file, so a failed run says what to look at.
 */
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { DataSource } from 'typeorm';
import type { TrackedUpload } from './crash-workload';

export const TRANSIENT_RECORDING_STATES = ['received', 'validating', 'queued', 'computing'];

export interface RecordingRow {
  id: string;
  visitId: string;
  kind: string;
  state: string;
  checksumSha256: string;
  storedFile: string | null;
  latestRunId: string | null;
  failureMessage: string | null;
  rejectionJson: string | null;
  createdAt: string;
}

export async function recordingRows(dataSource: DataSource): Promise<RecordingRow[]> {
  return (await dataSource.query(
    `SELECT "id", "visitId", "kind", "state", "checksumSha256", "storedFile", "latestRunId",
            "failureMessage", "rejectionJson", "createdAt"
       FROM "recording" ORDER BY "createdAt"`,
  )) as RecordingRow[];
}

export async function countBy(
  dataSource: DataSource,
  table: 'recording' | 'job',
): Promise<Record<string, number>> {
  const rows = (await dataSource.query(
    `SELECT "state", count(*) AS n FROM "${table}" GROUP BY "state"`,
  )) as Array<{ state: string; n: number }>;
  return Object.fromEntries(rows.map((r) => [r.state, Number(r.n)]));
}

/** Nothing queued, running, received, validating or computing. */
export async function isSettled(dataSource: DataSource): Promise<boolean> {
  const recordings = await countBy(dataSource, 'recording');
  const jobs = await countBy(dataSource, 'job');
  return (
    TRANSIENT_RECORDING_STATES.every((s) => (recordings[s] ?? 0) === 0) &&
    (jobs.queued ?? 0) === 0 &&
    (jobs.running ?? 0) === 0
  );
}

export interface CheckInput {
  dataSource: DataSource;
  dataDir: string;
  uploads: readonly TrackedUpload[];
  /** `GET /api/audit/verify` as read by a monitor. */
  auditVerify: { status: number; body: { intact?: boolean; checked?: number } | null };
}

export interface CheckResult {
  problems: string[];
  storedFiles: number;
  finalStates: Record<string, number>;
  interrupted: Record<string, number>;
  auditEntriesChecked: number;
}

function sha256(path: string): string {
  return createHash('sha256').update(readFileSync(path)).digest('hex');
}

export async function checkAfterCrashes(input: CheckInput): Promise<CheckResult> {
  const { dataSource, dataDir, uploads } = input;
  const problems: string[] = [];
  const rows = await recordingRows(dataSource);
  const byId = new Map(rows.map((r) => [r.id, r]));
  const finalStates: Record<string, number> = {};
  for (const r of rows) finalStates[r.state] = (finalStates[r.state] ?? 0) + 1;

  // 1. Nothing transient: every recording settled, every job finished.
  for (const r of rows) {
    if (TRANSIENT_RECORDING_STATES.includes(r.state)) {
      problems.push(`recording ${r.id} (${r.kind}) left ${r.state}`);
    }
  }
  const jobs = (await dataSource.query(
    `SELECT "id", "subjectId", "state", "attempts", "maxAttempts" FROM "job"`,
  )) as Array<{
    id: string;
    subjectId: string;
    state: string;
    attempts: number;
    maxAttempts: number;
  }>;
  for (const j of jobs) {
    if (j.state === 'queued' || j.state === 'running') {
      problems.push(`job ${j.id} of recording ${j.subjectId} left ${j.state}`);
    }
    if (j.attempts > j.maxAttempts) {
      problems.push(`job ${j.id} made ${j.attempts} attempts of ${j.maxAttempts}`);
    }
  }

  // 2. Every stored file is where its row says, named by and matching its checksum.
  const uploadsDir = join(dataDir, 'uploads');
  const owned = new Set<string>();
  let storedFiles = 0;
  for (const r of rows) {
    if (r.storedFile === null) continue;
    if (r.state !== 'rejected') owned.add(r.storedFile);
    const path = join(uploadsDir, r.storedFile);
    if (r.storedFile !== `${r.checksumSha256}.edf`) {
      problems.push(`recording ${r.id}: stored as ${r.storedFile}, not <checksum>.edf`);
    }
    if (!existsSync(path)) {
      problems.push(`recording ${r.id} (${r.state}): stored file ${r.storedFile} missing`);
      continue;
    }
    storedFiles += 1;
    const actual = sha256(path);
    if (actual !== r.checksumSha256) {
      problems.push(`recording ${r.id}: file hashes to ${actual}, row says ${r.checksumSha256}`);
    }
  }

  // 3. No orphan: every file in uploads/ belongs to a recording that was not rejected, and the
  //    temporary folder holds nothing once no request is running.
  if (existsSync(uploadsDir)) {
    for (const name of readdirSync(uploadsDir)) {
      const path = join(uploadsDir, name);
      if (name === 'tmp' && statSync(path).isDirectory()) {
        for (const temp of readdirSync(path))
          problems.push(`temporary file left: uploads/tmp/${temp}`);
        continue;
      }
      if (!owned.has(name)) {
        const owners = rows.filter((r) => `${r.checksumSha256}.edf` === name);
        problems.push(
          `orphan file uploads/${name}` +
            (owners.length > 0
              ? ` (its checksum belongs to ${owners.map((o) => `${o.id} ${o.state}`).join(', ')})`
              : ' (no recording has its checksum)'),
        );
      }
    }
  }

  // 4. Every upload the server accepted (201) ended ready, or superseded when a later
  //    replacement it accepted names it; every upload it refused as bad ended rejected.
  const replacedBy = (status: number): Set<string | null> =>
    new Set(
      uploads.filter((u) => u.status === status && u.replacesId !== null).map((u) => u.replacesId),
    );
  const replaced = replacedBy(201);
  // A replacement cut off by a kill may or may not have been accepted before it.
  const maybeReplaced = replacedBy(0);
  for (const u of uploads) {
    const row = u.recordingId === null ? undefined : byId.get(u.recordingId);
    if (u.status === 201) {
      const expected = replaced.has(u.recordingId) ? 'superseded' : 'ready';
      const allowed =
        maybeReplaced.has(u.recordingId) && row?.state === 'superseded' ? 'superseded' : expected;
      if (row === undefined) problems.push(`accepted upload ${u.recordingId} has no row`);
      else if (row.state !== allowed) {
        problems.push(
          `accepted ${u.description} (${u.recordingId}) ended ${row.state}, ${expected} expected` +
            (row.failureMessage ? `: ${row.failureMessage}` : ''),
        );
      }
    } else if (u.status === 422 && u.expect === 'rejected') {
      if (row !== undefined && row.state !== 'rejected') {
        problems.push(`refused upload ${u.recordingId} ended ${row.state}, rejected expected`);
      }
    } else if (u.status !== 0) {
      problems.push(`${u.description}: HTTP ${u.status} (expected ${u.expect})`);
    }
  }

  // 5. Uploads cut off by a kill: whatever the server had written must have settled, and the
  //    one that was never accepted says why.
  const interrupted: Record<string, number> = {};
  const known = new Set(uploads.map((u) => u.recordingId).filter((id) => id !== null));
  for (const u of uploads.filter((x) => x.status === 0)) {
    const candidates = rows.filter(
      (r) => r.visitId === u.visitId && r.kind === u.kind && !known.has(r.id),
    );
    const outcome =
      candidates.length === 0 ? 'never recorded' : candidates.map((c) => c.state).join('+');
    interrupted[outcome] = (interrupted[outcome] ?? 0) + 1;
    for (const c of candidates) {
      if (c.state === 'rejected' && c.rejectionJson === null) {
        problems.push(`interrupted upload ${c.id} rejected without a reason`);
      }
    }
  }

  // 6. Every ready recording's latest run exists and names the stored file it computed.
  const runs = (await dataSource.query(
    `SELECT "id", "recordingId", "inputChecksumSha256" FROM "analysis_run"`,
  )) as Array<{ id: string; recordingId: string; inputChecksumSha256: string }>;
  const runById = new Map(runs.map((r) => [r.id, r]));
  for (const r of rows.filter((x) => x.state === 'ready')) {
    const run = r.latestRunId === null ? undefined : runById.get(r.latestRunId);
    if (run === undefined) problems.push(`ready recording ${r.id} has no run ${r.latestRunId}`);
    else if (run.recordingId !== r.id || run.inputChecksumSha256 !== r.checksumSha256) {
      problems.push(`run ${run.id} of recording ${r.id} names another input`);
    }
  }

  // 7. At most one current recording of each kind per visit.
  const current = new Map<string, string[]>();
  for (const r of rows.filter((x) =>
    ['queued', 'computing', 'ready', 'failed'].includes(x.state),
  )) {
    const key = `${r.visitId}/${r.kind}`;
    current.set(key, [...(current.get(key) ?? []), r.id]);
  }
  for (const [key, ids] of current) {
    if (ids.length > 1) problems.push(`visit/kind ${key} has ${ids.length} current recordings`);
  }

  // 8. The audit chain is intact.
  const audit = input.auditVerify;
  if (audit.status !== 200 || audit.body?.intact !== true) {
    problems.push(`audit verify: HTTP ${audit.status} ${JSON.stringify(audit.body)}`);
  }

  return {
    problems,
    storedFiles,
    finalStates,
    interrupted,
    auditEntriesChecked: audit.body?.checked ?? 0,
  };
}
