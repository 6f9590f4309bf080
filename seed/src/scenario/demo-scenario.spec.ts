import { scipyReference, ScratchFolder } from '../generator/testing/scipy-reference';
import { buildDemoScenario, DemoRole } from './demo-scenario';
import { generateVisitRecordings, truncatedCopy } from './demo-recordings';

const DAY_MS = 86_400_000;
const days = (from: string, to: string): number => (Date.parse(to) - Date.parse(from)) / DAY_MS;

describe('buildDemoScenario (the invented demo study)', () => {
  const scenario = buildDemoScenario('full');

  it('has two or more sites and ten or more participants with pseudonymous codes', () => {
    expect(scenario.sites.length).toBeGreaterThanOrEqual(2);
    expect(scenario.participants.length).toBeGreaterThanOrEqual(10);
    const codes = scenario.participants.map((p) => p.code);
    expect(new Set(codes).size).toBe(codes.length);
    for (const code of codes) expect(code).toMatch(/^LAF-[CA]\d{3}$/);
    for (const site of scenario.sites) {
      expect(scenario.participants.some((p) => p.siteKey === site.key)).toBe(true);
    }
  });

  it('gives everyone 3–4 visits in date order, spread over about a year', () => {
    for (const participant of scenario.participants) {
      const { visits } = participant;
      expect(visits.length).toBeGreaterThanOrEqual(3);
      expect(visits.length).toBeLessThanOrEqual(4);
      for (let i = 1; i < visits.length; i++) {
        expect(days(visits[i - 1].date, visits[i].date)).toBeGreaterThan(60);
      }
      const span = days(visits[0].date, visits[visits.length - 1].date);
      expect(span).toBeGreaterThan(350);
      expect(span).toBeLessThan(380);
      for (const visit of visits) {
        expect(visit.restStart.startsWith(visit.date)).toBe(true);
        expect(Date.parse(visit.taskStart) - Date.parse(visit.restStart)).toBe(15 * 60 * 1000);
      }
    }
  });

  it('has drifting, onset-slowing and stable participants whose generated truth says so', () => {
    const byProfile = (profile: string) =>
      scenario.participants.filter((p) => p.profile === profile);
    expect(byProfile('drifting').length).toBeGreaterThanOrEqual(3);
    expect(byProfile('onset-slowing').length).toBeGreaterThanOrEqual(3);
    expect(byProfile('stable').length).toBeGreaterThanOrEqual(3);
    for (const p of scenario.participants) {
      const first = p.visits[0];
      const last = p.visits[p.visits.length - 1];
      const years = days(first.date, last.date) / 365.25;
      const change = last.iafHz - first.iafHz;
      // The visit IAFs follow the participant's line within the ±0.03 Hz wobble of each end.
      expect(Math.abs(change - p.iafTrendHzPerYear * years)).toBeLessThanOrEqual(0.061);
      if (p.profile === 'drifting') expect(p.iafTrendHzPerYear).toBeLessThanOrEqual(-0.3);
      else expect(p.iafTrendHzPerYear).toBe(0);
      for (const v of p.visits) {
        if (p.profile === 'onset-slowing') expect(v.deltaFHz).toBeLessThanOrEqual(-0.4);
        if (p.profile === 'stable') expect(v.deltaFHz).toBeGreaterThan(-0.15);
        // Slowed alpha stays inside the default 8–13 Hz band (docs/method.md §2).
        expect(v.iafHz + v.deltaFHz).toBeGreaterThan(8.5);
        expect(v.iafHz).toBeLessThan(11.5);
      }
    }
  });

  it('has one demo account per role, a technician and a coordinator per site', () => {
    const count = (role: DemoRole, siteKey: string | null = null) =>
      scenario.accounts.filter((a) => a.role === role && a.siteKey === siteKey).length;
    expect(count('admin')).toBe(1);
    expect(count('analyst')).toBe(1);
    expect(count('monitor')).toBe(1);
    for (const site of scenario.sites) {
      expect(count('technician', site.key)).toBe(1);
      expect(count('coordinator', site.key)).toBe(1);
    }
    // Addresses under a reserved example domain (RFC 2606 reserves .example).
    for (const account of scenario.accounts) expect(account.email).toMatch(/\.example$/);
  });

  it('names existing visits for the rejected upload, the analyst flag and the signed reports', () => {
    for (const target of [scenario.malformedUpload, scenario.flag, ...scenario.signedReports]) {
      const participant = scenario.participants.find((p) => p.code === target.participantCode);
      expect(participant?.visits.some((v) => v.label === target.visitLabel)).toBe(true);
    }
    expect(scenario.flag.reason.length).toBeGreaterThan(20);
    const flagged = scenario.participants.find((p) => p.code === scenario.flag.participantCode);
    expect(flagged?.profile).toBe('onset-slowing');
    // One signed report per site, so each coordinator has one.
    const sitesSigned = scenario.signedReports.map(
      (r) => scenario.participants.find((p) => p.code === r.participantCode)?.siteKey,
    );
    expect(new Set(sitesSigned)).toEqual(new Set(scenario.sites.map((s) => s.key)));
  });

  it('is the same every time it is built', () => {
    expect(buildDemoScenario('full')).toEqual(scenario);
  });

  it('has a small version for tests: one participant of each kind, both sites, three visits, short files', () => {
    const small = buildDemoScenario('small');
    expect(small.participants).toHaveLength(3);
    expect(new Set(small.participants.map((p) => p.siteKey)).size).toBe(2);
    expect(new Set(small.participants.map((p) => p.profile)).size).toBe(3);
    expect(small.participants.every((p) => p.visits.length === 3)).toBe(true);
    expect(small.recording.restDurationS).toBeLessThan(scenario.recording.restDurationS);
    for (const target of [small.malformedUpload, small.flag, ...small.signedReports]) {
      const participant = small.participants.find((p) => p.code === target.participantCode);
      expect(participant?.visits.some((v) => v.label === target.visitLabel)).toBe(true);
    }
  });
});

describe('generateVisitRecordings and truncatedCopy (generated data)', () => {
  const scratch = new ScratchFolder();
  afterAll(() => scratch.dispose());
  const scenario = buildDemoScenario('small');
  const participant = scenario.participants[0];
  const visit = participant.visits[1];
  const { resting, task } = generateVisitRecordings(scenario, participant, visit);

  it('builds both recordings of a visit with its truth and the participant code in the patient field', () => {
    expect(resting.truth).toEqual({ iafHz: visit.iafHz, deltaFHz: null });
    expect(task.truth).toEqual({ iafHz: visit.iafHz, deltaFHz: visit.deltaFHz });
    expect(task.onsetsS).toHaveLength(scenario.recording.taskTrialCount);
    const summary = scipyReference<{ patient: string; record_count: number }>({
      op: 'edf_summary',
      edf: scratch.write('rest.edf', resting.edf),
    });
    expect(summary.patient).toBe(`${participant.code} X X X`);
    expect(summary.record_count).toBe(scenario.recording.restDurationS);
  });

  it('cuts the copy in its last record, so the size disagrees with the header (Kemp et al. 1992)', () => {
    const broken = truncatedCopy(task.edf);
    expect(broken.length).toBeLessThan(task.edf.length);
    expect(
      Buffer.from(broken.subarray(0, 256)).equals(Buffer.from(task.edf.subarray(0, 256))),
    ).toBe(true);
    expect(() =>
      scipyReference({ op: 'edf_summary', edf: scratch.write('broken.edf', broken) }),
    ).toThrow(/file size does not match the header/);
  });
});
