/**
 * The rollback of the one write transaction behind bulk upload and BIDS import
 * (`RecordingsService.acceptInOneTransaction`), on the real app and SQLite file, called
 * directly because no request can make it fail half-way: a failure after a file was put in
 * place leaves no row, no audit entry and no stored file, and a unique violation (another
 * upload made the same row meanwhile) becomes the caller's conflict. Generated test data.
 */
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, unlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { defineAbilityFor } from '@gyre/shared';
import type { Caller } from '../src/auth/decorators';
import { ErrorKind, GyreException } from '../src/common/errors/gyre.exception';
import { type AcceptedFileCheck, RecordingsService } from '../src/recordings/recordings.service';
import { importFootprint } from './helpers/sqlite-rows';
import { useTestApp } from './helpers/test-app';
import { syntheticRestEdf } from './recordings-fixtures';

describe('one transaction for a bulk entry point: rollback', () => {
  const t = useTestApp();
  let recordings: RecordingsService;
  let caller: Caller;

  beforeAll(() => {
    recordings = t.app.get(RecordingsService);
    const user = t.seed.users.technician;
    caller = {
      user: { ...user, name: 'Technician' },
      ability: defineAbilityFor(user),
      clientIp: null,
    };
  });

  /** A generated resting file received into the upload folder's tmp/, checked as an upload is. */
  async function checkedFile(seed: number): Promise<AcceptedFileCheck> {
    const bytes = syntheticRestEdf({ durationS: 20, seed });
    const tmp = join(t.config.uploadsDir, 'tmp');
    mkdirSync(tmp, { recursive: true });
    const tempPath = join(tmp, `rollback-${seed}.edf`);
    writeFileSync(tempPath, bytes);
    const sha256 = createHash('sha256').update(bytes).digest('hex');
    const check = await recordings.checkFile(
      { tempPath, sha256, sizeBytes: bytes.length },
      'resting',
      null,
      false,
    );
    if (!check.ok) throw new Error(`generated file refused: ${check.message}`);
    return check;
  }

  const conflict = () => new GyreException(ErrorKind.Conflict, 'RECORDINGS_CONFLICT_TEST', 'taken');

  it('takes away the file it stored and every row when a later file cannot be stored', async () => {
    const before = importFootprint(t, {});
    const first = await checkedFile(71);
    const second = await checkedFile(72);
    unlinkSync(second.file.tempPath); // the second file can no longer be moved into place
    let rolledBack = 0;
    const attempt = recordings.acceptInOneTransaction({
      checks: [first, second],
      write: async (tx) => [
        (await recordings.createAccepted(tx, caller, t.seed.visits.A1, first)).id,
      ],
      rolledBack: () => rolledBack++,
      conflict,
    });
    await expect(attempt).rejects.toMatchObject({ code: 'ENOENT' });
    expect(rolledBack).toBe(1);
    // The first file was moved out of tmp/ to its checksum's name, then taken away again.
    expect(existsSync(first.file.tempPath)).toBe(false);
    expect(importFootprint(t, {})).toEqual(before);
  });

  it('answers the caller’s conflict for a unique violation, with nothing written', async () => {
    const before = importFootprint(t, {});
    const first = await checkedFile(73);
    const second = await checkedFile(74);
    let rolledBack = 0;
    // Two current resting recordings on one visit break UQ_recording_visit_kind_current.
    const attempt = recordings.acceptInOneTransaction({
      checks: [first, second],
      write: async (tx) => [
        (await recordings.createAccepted(tx, caller, t.seed.visits.A1, first)).id,
        (await recordings.createAccepted(tx, caller, t.seed.visits.A1, second)).id,
      ],
      rolledBack: () => rolledBack++,
      conflict,
    });
    await expect(attempt).rejects.toBeInstanceOf(GyreException);
    await expect(attempt).rejects.toMatchObject({ code: 'RECORDINGS_CONFLICT_TEST' });
    expect(rolledBack).toBe(1);
    expect(importFootprint(t, {})).toEqual({
      ...before,
      temporary: [...before.temporary, 'rollback-73.edf', 'rollback-74.edf'].sort(),
    });
    for (const check of [first, second]) unlinkSync(check.file.tempPath);
  });
});
