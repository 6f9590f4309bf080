/** Versioned analysis settings per study: defaults, validation, new versions, audit. */
import type { AnalysisSettingsView } from '@gyre/shared';
import { getAs, postAs } from './helpers/api-call';
import { useTestApp } from './helpers/test-app';

describe('analysis settings', () => {
  const t = useTestApp();
  let path: string;
  beforeAll(() => {
    path = `/api/studies/${t.seed.studies.A.id}/analysis-settings`;
  });

  const valid = {
    bandHz: [7.5, 12.5],
    method: 'morlet',
    morletCycles: 6,
    epochWindowS: [-1, 2],
    baselineWindowS: [-0.5, 0],
    postWindowS: [0.3, 0.9],
    rejectionThresholdUv: 120,
    flagThresholdHz: -0.25,
    roi: ['O1', 'O2', 'Oz'],
    onsetLabel: 'stimulus',
    amplitudeGatePercentile: 20,
    cycleDisagreementHz: 0.15,
    compareConditions: ['faces', 'houses'],
    reason: 'Pilot review: narrower window after onset',
  };

  it('starts at version 1 with the defaults of docs/method.md §2–3', async () => {
    const response = await getAs(t, 'monitor', path);
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({
      version: 1,
      bandHz: null,
      method: 'filter',
      morletCycles: 7,
      epochWindowS: [-1, 2],
      baselineWindowS: [-0.5, 0],
      postWindowS: [0.2, 0.8],
      rejectionThresholdUv: 100,
      flagThresholdHz: -0.2,
      roi: ['O1', 'O2', 'Oz', 'POz', 'PO3', 'PO4', 'PO7', 'PO8', 'Pz', 'P3', 'P4'],
      onsetLabel: null,
    });
  });

  it.each([
    ['a band wider than 1–40 Hz', { bandHz: [0.5, 13] }, /bandHz: \[0.5,13\] found/],
    [
      'a baseline ending after the post window starts',
      { baselineWindowS: [-0.5, 0.4] },
      /postWindowS: .* found, a start at or after/,
    ],
    [
      'a post window outside the epoch',
      { postWindowS: [0.2, 2.5] },
      /postWindowS: \[0.2,2.5\] found, start < end, inside epochWindowS/,
    ],
    [
      'a positive flag threshold',
      { flagThresholdHz: 0.2 },
      /flagThresholdHz: 0.2 found, a negative change/,
    ],
    ['an unknown electrode', { roi: ['O1', 'Q7'] }, /roi: \["Q7"\] found, 10-10 electrode names/],
    [
      'a reason under 10 characters',
      { reason: 'short' },
      /reason must be longer than or equal to 10 characters/,
    ],
    ['an unknown method', { method: 'wavelet' }, /method must be one of/],
    [
      'an amplitude-gate percentile above 90',
      { amplitudeGatePercentile: 95 },
      /amplitudeGatePercentile: 95 found, off \(null\) or a percentile from 1 to 90/,
    ],
    [
      'an amplitude-gate percentile that is not a number',
      { amplitudeGatePercentile: 'high' },
      /amplitudeGatePercentile must be a number/,
    ],
    [
      'a zero disagreement threshold',
      { cycleDisagreementHz: 0 },
      /cycleDisagreementHz: 0 found, 0 < difference ≤ 2 Hz/,
    ],
    [
      'the same condition twice',
      { compareConditions: ['Faces', 'faces'] },
      /compareConditions: \["Faces","faces"\] found, two different, non-empty onset labels/,
    ],
    [
      'one condition instead of two',
      { compareConditions: ['faces'] },
      /compareConditions must contain at least 2 elements/,
    ],
  ])('refuses %s (400, naming the field and value)', async (_name, change, message) => {
    const response = await postAs(t, 'analyst', path, { ...valid, ...change });
    expect(response.status).toBe(400);
    expect(response.body.message).toMatch(message);
    const current = await getAs(t, 'analyst', path);
    expect(current.body.version).toBe(1);
  });

  it('adds a version (audited with before, after and reason) and lists versions newest first', async () => {
    const response = await postAs(t, 'analyst', path, valid);
    expect(response.status).toBe(201);
    const created = response.body as AnalysisSettingsView;
    expect(created).toMatchObject({
      version: 2,
      bandHz: [7.5, 12.5],
      method: 'morlet',
      roi: ['O1', 'O2', 'Oz'],
      amplitudeGatePercentile: 20,
      cycleDisagreementHz: 0.15,
      compareConditions: ['faces', 'houses'],
    });
    expect(created.changes).toEqual(
      expect.arrayContaining([
        { field: 'amplitudeGatePercentile', before: null, after: 20 },
        { field: 'cycleDisagreementHz', before: 0.1, after: 0.15 },
        { field: 'compareConditions', before: null, after: ['faces', 'houses'] },
      ]),
    );
    const stored = await getAs(t, 'analyst', path);
    expect(stored.body).toMatchObject({
      version: 2,
      amplitudeGatePercentile: 20,
      cycleDisagreementHz: 0.15,
      compareConditions: ['faces', 'houses'],
    });
    expect(created.createdById).toBe(t.seed.users.analyst.id);

    const [entry] = (await t.dataSource.query(
      `SELECT "action", "objectId", "before", "after", "reason", "actorId" FROM "audit_entry" WHERE "objectType" = 'AnalysisSettings'`,
    )) as Array<{
      action: string;
      objectId: string;
      before: string;
      after: string;
      reason: string;
      actorId: string;
    }>;
    expect(entry).toMatchObject({
      action: 'update',
      objectId: created.id,
      reason: valid.reason,
      actorId: t.seed.users.analyst.id,
    });
    expect(JSON.parse(entry.before)).toMatchObject({
      version: 1,
      bandHz: null,
      method: 'filter',
      amplitudeGatePercentile: null,
      cycleDisagreementHz: 0.1,
      compareConditions: null,
    });
    expect(JSON.parse(entry.after)).toMatchObject({
      version: 2,
      bandHz: [7.5, 12.5],
      method: 'morlet',
      amplitudeGatePercentile: 20,
      cycleDisagreementHz: 0.15,
      compareConditions: ['faces', 'houses'],
    });

    const versions = await getAs(t, 'analyst', `${path}/versions`, { pageSize: 1 });
    expect(versions.status).toBe(200);
    expect(versions.body).toMatchObject({ total: 2, page: 1, pageSize: 1 });
    expect(versions.body.items[0].version).toBe(2);
    const oldest = await getAs(t, 'analyst', `${path}/versions`, { order: 'asc' });
    expect(oldest.body.items.map((s: AnalysisSettingsView) => s.version)).toEqual([1, 2]);
  });
});
