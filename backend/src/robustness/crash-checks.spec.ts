import { createHash, randomUUID } from 'node:crypto';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DataSource } from 'typeorm';
import { sqliteOptions } from '../database/database-options';
import { Recording } from '../recordings/recording.entity';
import { checkAfterCrashes, CheckInput } from './crash/crash-checks';
import { seedCrashData } from './crash/crash-seed';
import type { TrackedUpload } from './crash/crash-workload';

/**
 * The crash test's checks against a data folder laid out by hand: each damage a crash could
 * leave must be named, and an undamaged folder must pass. Without this a check that can never
 * fail would pass the crash test as well.
 */
describe('checks after crashes', () => {
  const dataDir = mkdtempSync(join(tmpdir(), 'gyre-crash-checks-'));
  const uploadsDir = join(dataDir, 'uploads');
  let dataSource: DataSource;
  let base: Pick<Recording, 'studyId' | 'siteId' | 'participantId' | 'uploadedById'>;
  let visitIds: string[];

  beforeAll(async () => {
    dataSource = new DataSource(sqliteOptions(join(dataDir, 'gyre.sqlite')));
    await dataSource.initialize();
    visitIds = (await seedCrashData(dataSource, 4)).visitIds;
    const [visit] = (await dataSource.query(
      `SELECT "studyId", "siteId", "participantId" FROM "visit" WHERE "id" = ?`,
      [visitIds[0]],
    )) as Array<{ studyId: string; siteId: string; participantId: string }>;
    const [user] = (await dataSource.query(`SELECT "id" FROM "user" LIMIT 1`)) as Array<{
      id: string;
    }>;
    base = { ...visit, uploadedById: user.id };
  });

  afterAll(async () => {
    await dataSource.destroy();
    rmSync(dataDir, { recursive: true, force: true });
  });

  beforeEach(async () => {
    await dataSource.query(`DELETE FROM "recording"`);
    rmSync(uploadsDir, { recursive: true, force: true });
    mkdirSync(join(uploadsDir, 'tmp'), { recursive: true });
  });

  /** A recording row; with `content`, its stored file too (named by the content's SHA-256). */
  async function recording(
    state: Recording['state'],
    content: string | null,
    visit = 0,
  ): Promise<Recording> {
    const checksum = createHash('sha256')
      .update(content ?? randomUUID())
      .digest('hex');
    const stored = content !== null && state !== 'rejected';
    if (content !== null) writeFileSync(join(uploadsDir, `${checksum}.edf`), content);
    const now = new Date().toISOString();
    const row = Object.assign(new Recording(), {
      ...base,
      id: randomUUID(),
      visitId: visitIds[visit],
      kind: 'resting' as const,
      state,
      checksumSha256: checksum,
      sizeBytes: content?.length ?? 0,
      storedFile: stored ? `${checksum}.edf` : null,
      factsJson: null,
      csvOnsetsJson: null,
      onsetsChecksumSha256: null,
      rejectionJson: state === 'rejected' ? '{"message":"bad"}' : null,
      kindConfirmed: false,
      replacesId: null,
      replacementReason: null,
      supersededById: null,
      latestRunId: null,
      roiUsageJson: null,
      resultWarningsJson: null,
      failureMessage: state === 'failed' ? 'Attempt 3 of 3 failed: test' : null,
      createdAt: now,
      updatedAt: now,
    });
    await dataSource.getRepository(Recording).insert(row);
    return row;
  }

  const input = (uploads: TrackedUpload[] = []): CheckInput => ({
    dataSource,
    dataDir,
    uploads,
    auditVerify: { status: 200, body: { intact: true, checked: 3 } },
  });

  const accepted = (id: string): TrackedUpload => ({
    action: 0,
    visitId: visitIds[0],
    kind: 'resting',
    expect: 'accepted',
    description: 'resting',
    status: 201,
    recordingId: id,
    replacesId: null,
  });

  it('passes a settled folder: a failed recording with its file and a rejected one without', async () => {
    await recording('failed', 'file A');
    await recording('rejected', null);
    const result = await checkAfterCrashes(input());
    expect(result.problems).toEqual([]);
    expect(result.storedFiles).toBe(1);
  });

  it('names a recording left computing and an accepted upload that did not end ready', async () => {
    const row = await recording('computing', 'file B');
    const { problems } = await checkAfterCrashes(input([accepted(row.id)]));
    expect(problems).toEqual([
      `recording ${row.id} (resting) left computing`,
      `accepted resting (${row.id}) ended computing, ready expected`,
    ]);
  });

  it('names a stored file that no longer matches its checksum', async () => {
    const row = await recording('failed', 'file C');
    writeFileSync(join(uploadsDir, `${row.checksumSha256}.edf`), 'file C, damaged');
    const { problems } = await checkAfterCrashes(input());
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatch(new RegExp(`^recording ${row.id}: file hashes to [0-9a-f]{64}`));
  });

  it('names an orphan file of a rejected recording and a temporary file left behind', async () => {
    // What a kill between moving the file into place and committing the acceptance leaves.
    const row = await recording('rejected', null);
    writeFileSync(join(uploadsDir, `${row.checksumSha256}.edf`), 'never accepted');
    writeFileSync(join(uploadsDir, 'tmp', 'abc.part'), 'half an upload');
    const { problems } = await checkAfterCrashes(input());
    expect(problems).toEqual([
      `orphan file uploads/${row.checksumSha256}.edf (its checksum belongs to ${row.id} rejected)`,
      'temporary file left: uploads/tmp/abc.part',
    ]);
  });

  it('names a broken audit chain', async () => {
    const { problems } = await checkAfterCrashes({
      ...input(),
      auditVerify: { status: 200, body: { intact: false, checked: 9 } },
    });
    expect(problems).toEqual(['audit verify: HTTP 200 {"intact":false,"checked":9}']);
  });
});
