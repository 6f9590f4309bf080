import { scipyReference, ScratchFolder } from '../generator/testing/scipy-reference';
import { buildDemoScenario, DemoRole } from './demo-scenario';
import { generateRetakeResting, generateVisitRecordings, truncatedCopy } from './demo-recordings';

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

  it('reviews some visits of each site and not others, in both versions, and replaces one reviewed resting file', () => {
    for (const version of [scenario, buildDemoScenario('small')]) {
      const visitsOf = (code: string) =>
        version.participants.find((p) => p.code === code)?.visits ?? [];
      for (const target of version.reviewedVisits) {
        expect(visitsOf(target.participantCode).some((v) => v.label === target.visitLabel)).toBe(
          true,
        );
      }
      const key = (t: { participantCode: string; visitLabel: string }) =>
        `${t.participantCode}/${t.visitLabel}`;
      const reviewed = new Set(version.reviewedVisits.map(key));
      expect(reviewed.size).toBe(version.reviewedVisits.length);
      // Every site has reviewed and unreviewed visits, so its worklist shows both.
      for (const site of version.sites) {
        const all = version.participants
          .filter((p) => p.siteKey === site.key)
          .flatMap((p) => p.visits.map((v) => `${p.code}/${v.label}`));
        const done = all.filter((k) => reviewed.has(k)).length;
        expect({ site: site.key, done: done > 0, left: done < all.length }).toEqual({
          site: site.key,
          done: true,
          left: true,
        });
      }
      // The replaced one is reviewed first, and touches neither the flag nor a signed report.
      const retake = version.replacedAfterReview;
      expect(reviewed.has(key(retake))).toBe(true);
      expect([version.flag, ...version.signedReports].map(key)).not.toContain(key(retake));
      expect(retake.reason.length).toBeGreaterThan(20);
    }
  });

  it('registers every visit on a planned visit of the schedule, one per planned visit', () => {
    const names = scenario.schedule.map((p) => p.name);
    expect(names).toEqual(['Baseline', 'Month 4', 'Month 8', 'Month 12']);
    expect(scenario.groups).toHaveLength(2);
    for (const participant of scenario.participants) {
      const labels = participant.visits.map((v) => v.label);
      expect(new Set(labels).size).toBe(labels.length);
      for (const label of labels) expect(names).toContain(label);
      // The baseline is on the enrolment day: study day 0.
      expect(participant.visits[0]).toMatchObject({
        label: 'Baseline',
        date: participant.enrolmentDate,
      });
      expect(scenario.groups.map((g) => g.key)).toContain(participant.groupKey);
    }
    for (const group of scenario.groups) {
      expect(scenario.participants.filter((p) => p.groupKey === group.key).length).toBe(6);
    }
  });

  it('puts all but two visits inside their window, and those two outside it (day counts by hand)', () => {
    const outside: string[] = [];
    for (const participant of scenario.participants) {
      for (const visit of participant.visits) {
        const planned = scenario.schedule.find((p) => p.name === visit.label);
        const studyDay = days(participant.enrolmentDate, visit.date);
        const offset = studyDay - (planned?.targetDay ?? NaN);
        const inWindow =
          offset >= -(planned?.windowBeforeDays ?? 0) && offset <= (planned?.windowAfterDays ?? 0);
        if (!inWindow) outside.push(`${participant.code} ${visit.label} ${offset}`);
      }
    }
    expect(outside).toEqual(['LAF-C101 Month 4 30', 'LAF-A202 Month 4 -28']);
    // LAF-C101 enrolled on 2024-01-15; Month 4 (day 121) + 30 days = day 151 = 2024-06-14
    // (Python: date(2024, 1, 15) + timedelta(151)).
    const c101 = scenario.participants.find((p) => p.code === 'LAF-C101');
    expect(c101?.enrolmentDate).toBe('2024-01-15');
    expect(c101?.visits.find((v) => v.label === 'Month 4')?.date).toBe('2024-06-14');
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
    // Each visit on its planned visit, spanning the year (trends need ≥ 90 days).
    for (const p of small.participants) {
      expect(p.visits.map((v) => v.label)).toEqual(['Baseline', 'Month 4', 'Month 12']);
      expect(days(p.visits[0].date, p.visits[2].date)).toBeGreaterThan(350);
    }
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

  it('records a second take of the resting block: other samples, the same header layout and the same IAF (scipy.signal.welch)', () => {
    const retake = generateRetakeResting(scenario, participant, visit);
    expect(retake.truth).toEqual(resting.truth);
    expect(Buffer.from(retake.edf).equals(Buffer.from(resting.edf))).toBe(false);
    const file = scratch.write('retake.edf', retake.edf);
    const first = scipyReference<{ record_count: number; sample_rate_hz: number }>({
      op: 'edf_summary',
      edf: scratch.write('rest-first.edf', resting.edf),
    });
    const second = scipyReference<{ record_count: number; sample_rate_hz: number }>({
      op: 'edf_summary',
      edf: file,
    });
    expect(second.record_count).toBe(first.record_count);
    expect(second.sample_rate_hz).toBe(first.sample_rate_hz);
    // The posterior ROI's Welch peak lands on the generated IAF (as the generator's own test).
    const spectra = scipyReference<{ roi_paf_hz: number }>({
      op: 'spectra',
      edf: file,
      roi: ['O1', 'O2', 'Oz', 'P3', 'P4', 'Pz', 'POz', 'PO3', 'PO4', 'PO7', 'PO8'],
    });
    expect(Math.abs(spectra.roi_paf_hz - visit.iafHz)).toBeLessThan(0.1);
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
