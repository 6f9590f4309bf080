/**
 * The invented demo study. Every name here is made up for Gyre: no real people,
 * institutions, places or brands. The numbers are the generated truth each participant's
 * recordings are built from, so the demo (and its test) can say what Gyre should find.
 */
import { SeededRandom } from '@gyre/backend/signal';

export type DemoRole = 'technician' | 'analyst' | 'monitor' | 'coordinator' | 'admin';

export interface DemoSite {
  /** Key used inside the scenario. */
  key: string;
  name: string;
  code: string;
}

export interface DemoAccount {
  role: DemoRole;
  email: string;
  displayName: string;
  /** For technicians and coordinators: the site key. */
  siteKey: string | null;
}

/** How a participant's alpha behaves over the study. */
export type DemoProfile = 'drifting' | 'onset-slowing' | 'stable';

/** One visit of the study's schedule (days counted from enrolment, the enrolment date = day 0). */
export interface DemoPlannedVisit {
  name: string;
  targetDay: number;
  windowBeforeDays: number;
  windowAfterDays: number;
}

/** A group (arm) of the demo study. */
export interface DemoGroup {
  key: string;
  name: string;
  description: string;
}

export interface DemoVisit {
  /** The planned visit's name (the visit is registered on it). */
  label: string;
  /** Visit date, ISO `YYYY-MM-DD`. */
  date: string;
  /** Start of the resting recording, local ISO date-time; the task follows 15 minutes later. */
  restStart: string;
  taskStart: string;
  /** Generated resting IAF of this visit, in Hz (the PAF Gyre should find). */
  iafHz: number;
  /** Generated post-onset change of this visit, in Hz (Gyre's Δf; negative = slowing). */
  deltaFHz: number;
  /** Whether the technician also uploads the onset CSV with the task recording. */
  withOnsetCsv: boolean;
}

export interface DemoParticipant {
  code: string;
  siteKey: string;
  /** `YYYY-MM-DD`, day 0 of the schedule (the baseline visit's day). */
  enrolmentDate: string;
  groupKey: string;
  profile: DemoProfile;
  /** Generated drift of the resting IAF, in Hz per year (0 = stable). */
  iafTrendHzPerYear: number;
  /** Occipital alpha amplitude at rest and in the task, in µV. */
  restAlphaUv: number;
  taskAlphaUv: number;
  visits: DemoVisit[];
}

export interface DemoScenario {
  /** Root of every random stream of the demo: change it and every file changes. */
  seedKey: string;
  study: { name: string; code: string; description: string };
  sites: DemoSite[];
  /** The study's visit schedule, in order. */
  schedule: DemoPlannedVisit[];
  groups: DemoGroup[];
  accounts: DemoAccount[];
  participants: DemoParticipant[];
  recording: { sampleRateHz: number; restDurationS: number; taskTrialCount: number };
  /** One upload sent truncated first, so a rejection is on show; the good file follows. */
  malformedUpload: { participantCode: string; visitLabel: string; kind: 'task' };
  /** One visit carries an analyst's slowing flag. */
  flag: { participantCode: string; visitLabel: string; reason: string };
  /** Visits whose report the analyst signs, so each site's coordinator has one to open. */
  signedReports: Array<{ participantCode: string; visitLabel: string }>;
  /**
   * Visits the analyst marks reviewed once everything is computed, so the worklist holds both
   * reviewed and unreviewed visits.
   */
  reviewedVisits: Array<{ participantCode: string; visitLabel: string }>;
  /**
   * One reviewed visit whose resting recording is then re-recorded and replaced by its site's
   * technician: its results change, so it is back on the worklist as "changed since review".
   */
  replacedAfterReview: { participantCode: string; visitLabel: string; reason: string };
}

export type DemoSize = 'full' | 'small';

const DEMO_SEED_KEY = 'gyre-demo-v1';
const DAY_MS = 24 * 60 * 60 * 1000;
const DAYS_PER_YEAR = 365.25;

const SITES: DemoSite[] = [
  { key: 'cedar', name: 'Cedar Unit', code: 'CDR' },
  { key: 'amber', name: 'Amber Clinic', code: 'AMB' },
];

interface ParticipantPlan {
  code: string;
  siteKey: string;
  profile: DemoProfile;
  /** IAF at the first visit, Hz. */
  firstIafHz: number;
  iafTrendHzPerYear: number;
  /** Δf of the task at every visit, Hz, before a small visit-to-visit variation. */
  deltaFHz: number;
  visitCount: 3 | 4;
  /** Days after the study's first enrolment day. */
  enrolmentDay: number;
  withOnsetCsv: boolean;
}

/**
 * Twelve participants, six per site: four drift slower over the year, four show a clear
 * post-onset slowing, four are stable. IAFs stay within 9.3–10.9 Hz, inside the default
 * 8–13 Hz band even after slowing (a typical adult range, Klimesch 1999).
 */
const PARTICIPANTS: ParticipantPlan[] = [
  p('LAF-C101', 'cedar', 'drifting', 10.45, -0.45, -0.08, 4, 0, false),
  p('LAF-C102', 'cedar', 'onset-slowing', 9.9, 0, -0.62, 4, 9, false),
  p('LAF-C103', 'cedar', 'stable', 10.2, 0, -0.05, 3, 16, false),
  p('LAF-C104', 'cedar', 'drifting', 9.95, -0.35, -0.5, 4, 23, false),
  p('LAF-C105', 'cedar', 'stable', 9.6, 0, -0.1, 3, 37, false),
  p('LAF-C106', 'cedar', 'onset-slowing', 10.6, 0, -0.48, 3, 44, false),
  p('LAF-A201', 'amber', 'stable', 10.05, 0, -0.07, 4, 5, true),
  p('LAF-A202', 'amber', 'drifting', 10.7, -0.5, -0.1, 3, 12, true),
  p('LAF-A203', 'amber', 'onset-slowing', 9.7, 0, -0.7, 4, 19, true),
  p('LAF-A204', 'amber', 'stable', 10.4, 0, -0.04, 3, 30, true),
  p('LAF-A205', 'amber', 'drifting', 10.15, -0.4, -0.06, 4, 41, true),
  p('LAF-A206', 'amber', 'onset-slowing', 9.55, 0, -0.55, 3, 51, true),
];

/** The small version for tests: one participant of each kind over both sites, three visits, shorter files. */
const SMALL_PARTICIPANTS = ['LAF-C101', 'LAF-C102', 'LAF-A201'];

function p(
  code: string,
  siteKey: string,
  profile: DemoProfile,
  firstIafHz: number,
  iafTrendHzPerYear: number,
  deltaFHz: number,
  visitCount: 3 | 4,
  enrolmentDay: number,
  withOnsetCsv: boolean,
): ParticipantPlan {
  return {
    code,
    siteKey,
    profile,
    firstIafHz,
    iafTrendHzPerYear,
    deltaFHz,
    visitCount,
    enrolmentDay,
    withOnsetCsv,
  };
}

/**
 * The study's schedule: a baseline on the enrolment day (up to two weeks later), then visits
 * every four months with a three-week window either side, and four weeks at Month 12.
 */
const SCHEDULE: DemoPlannedVisit[] = [
  { name: 'Baseline', targetDay: 0, windowBeforeDays: 0, windowAfterDays: 14 },
  { name: 'Month 4', targetDay: 121, windowBeforeDays: 21, windowAfterDays: 21 },
  { name: 'Month 8', targetDay: 243, windowBeforeDays: 21, windowAfterDays: 21 },
  { name: 'Month 12', targetDay: 365, windowBeforeDays: 28, windowAfterDays: 28 },
];

/** Two invented arms; participants alternate between them in each site's list. */
const GROUPS: DemoGroup[] = [
  {
    key: 'paced',
    name: 'Arm A · paced breathing',
    description: 'Ten minutes of paced breathing each evening (invented for the demo).',
  },
  {
    key: 'usual',
    name: 'Arm B · usual routine',
    description: 'No change to the daily routine (invented for the demo).',
  },
];

/**
 * Which planned visits each participant attended: four visits, or three with Month 8 missed.
 * Days are the target days before a few days' jitter.
 */
const SCHEDULES: Record<3 | 4, string[]> = {
  3: ['Baseline', 'Month 4', 'Month 12'],
  4: ['Baseline', 'Month 4', 'Month 8', 'Month 12'],
};

/**
 * Visits deliberately outside their window, in days from the target, so the mark shows:
 * LAF-C101 came a month late to Month 4 (both versions), LAF-A202 four weeks early (full).
 */
const OUT_OF_WINDOW: Record<string, { visit: string; daysFromTarget: number }> = {
  'LAF-C101': { visit: 'Month 4', daysFromTarget: 30 },
  'LAF-A202': { visit: 'Month 4', daysFromTarget: -28 },
};

const FIRST_ENROLMENT_UTC = Date.UTC(2024, 0, 15);

const isoDate = (ms: number): string => new Date(ms).toISOString().slice(0, 10);
const round = (value: number, decimals: number): number => Number(value.toFixed(decimals));

/** Builds the demo study; `small` keeps three participants, three visits and shorter recordings. */
export function buildDemoScenario(size: DemoSize = 'full'): DemoScenario {
  const plans =
    size === 'full'
      ? PARTICIPANTS
      : PARTICIPANTS.filter((q) => SMALL_PARTICIPANTS.includes(q.code));
  const participants = plans.map((plan) =>
    buildParticipant(plan, size, PARTICIPANTS.indexOf(plan)),
  );
  const accounts: DemoAccount[] = [
    {
      role: 'admin',
      email: 'admin@lantern-demo.example',
      displayName: 'Demo administrator',
      siteKey: null,
    },
    {
      role: 'analyst',
      email: 'analyst@lantern-demo.example',
      displayName: 'Demo analyst',
      siteKey: null,
    },
    {
      role: 'monitor',
      email: 'monitor@lantern-demo.example',
      displayName: 'Demo monitor',
      siteKey: null,
    },
    ...SITES.flatMap((site): DemoAccount[] => [
      {
        role: 'technician',
        email: `technician.${site.key}@lantern-demo.example`,
        displayName: `Demo technician, ${site.name}`,
        siteKey: site.key,
      },
      {
        role: 'coordinator',
        email: `coordinator.${site.key}@lantern-demo.example`,
        displayName: `Demo coordinator, ${site.name}`,
        siteKey: site.key,
      },
    ]),
  ];
  return {
    seedKey: DEMO_SEED_KEY,
    study: {
      name: 'Lantern Alpha Follow-up Study',
      code: 'LAF',
      description:
        'Invented demo study with generated recordings: resting IAF and post-onset alpha slowing over one year at two sites.',
    },
    sites: SITES.map((s) => ({ ...s })),
    schedule: SCHEDULE.map((v) => ({ ...v })),
    groups: GROUPS.map((g) => ({ ...g })),
    accounts,
    participants,
    recording:
      size === 'full'
        ? { sampleRateHz: 250, restDurationS: 150, taskTrialCount: 48 }
        : { sampleRateHz: 250, restDurationS: 45, taskTrialCount: 30 },
    malformedUpload:
      size === 'full'
        ? { participantCode: 'LAF-A203', visitLabel: 'Month 8', kind: 'task' }
        : { participantCode: 'LAF-A201', visitLabel: 'Month 4', kind: 'task' },
    flag: {
      // A participant with clear onset slowing, present in both versions.
      participantCode: 'LAF-C102',
      visitLabel: 'Month 12',
      reason:
        'Clear post-onset slowing at this visit; the interval excludes zero. Flagged for the study review (demo).',
    },
    signedReports: [
      { participantCode: 'LAF-C102', visitLabel: 'Month 12' },
      { participantCode: 'LAF-A201', visitLabel: 'Month 12' },
    ],
    // Present in both versions: each site has reviewed and unreviewed visits.
    reviewedVisits: [
      { participantCode: 'LAF-C101', visitLabel: 'Baseline' },
      { participantCode: 'LAF-C102', visitLabel: 'Baseline' },
      { participantCode: 'LAF-C102', visitLabel: 'Month 4' },
      { participantCode: 'LAF-A201', visitLabel: 'Baseline' },
      { participantCode: 'LAF-A201', visitLabel: 'Month 12' },
    ],
    replacedAfterReview: {
      participantCode: 'LAF-C102',
      visitLabel: 'Month 4',
      reason:
        'Resting block recorded again the same day: an electrode lost contact in the first take (demo).',
    },
  };
}

function buildParticipant(plan: ParticipantPlan, size: DemoSize, index: number): DemoParticipant {
  const rng = SeededRandom.derive(DEMO_SEED_KEY, `participant-${plan.code}`);
  const enrolmentMs = FIRST_ENROLMENT_UTC + plan.enrolmentDay * DAY_MS;
  const attended = size === 'full' ? SCHEDULES[plan.visitCount] : SCHEDULES[3];
  const schedule = attended.map((label) => {
    const planned = SCHEDULE.find((p) => p.name === label);
    if (planned === undefined) throw new Error(`No planned visit ${label}`);
    return { label, day: planned.targetDay };
  });
  const late = OUT_OF_WINDOW[plan.code] as { visit: string; daysFromTarget: number } | undefined;
  const visits = schedule.map(({ label, day }, visitIndex): DemoVisit => {
    // Visits happen within a week of their target day, at a morning slot (the jitter is drawn
    // for the moved visit too, so the other visits' numbers stay as they were).
    const jitter = visitIndex === 0 ? 0 : Math.round(rng.between(-6, 6));
    const actualDay =
      visitIndex === 0 ? 0 : late?.visit === label ? day + late.daysFromTarget : day + jitter;
    const dateMs = enrolmentMs + actualDay * DAY_MS;
    const date = isoDate(dateMs);
    const hour = 8 + Math.floor(rng.between(0, 4));
    const minute = 15 * Math.floor(rng.between(0, 3));
    const hh = String(hour).padStart(2, '0');
    const mm = String(minute).padStart(2, '0');
    const taskMm = String(minute + 15).padStart(2, '0');
    const years = actualDay / DAYS_PER_YEAR;
    // A small visit-to-visit wobble around each participant's line (generated, not measured).
    const iafHz = round(
      plan.firstIafHz + plan.iafTrendHzPerYear * years + rng.between(-0.03, 0.03),
      3,
    );
    const deltaFHz = round(plan.deltaFHz + rng.between(-0.04, 0.04), 3);
    return {
      label,
      date,
      restStart: `${date}T${hh}:${mm}:00`,
      taskStart: `${date}T${hh}:${taskMm}:00`,
      iafHz,
      deltaFHz: Math.min(deltaFHz, 0),
      withOnsetCsv: plan.withOnsetCsv,
    };
  });
  return {
    code: plan.code,
    siteKey: plan.siteKey,
    enrolmentDate: isoDate(enrolmentMs),
    // Alternate arms down each site's list (C101 A, C102 B, …).
    groupKey: GROUPS[index % GROUPS.length].key,
    profile: plan.profile,
    iafTrendHzPerYear: plan.iafTrendHzPerYear,
    restAlphaUv: round(rng.between(24, 32), 1),
    taskAlphaUv: round(rng.between(18, 22), 1),
    visits,
  };
}
