import type {
  ParticipantView,
  RecordingView,
  RecordingKind,
  ReportSignOffView,
  Role,
  SiteView,
  StudyView,
  VisitView,
} from '@gyre/shared';
import { SIGNATURE_MEANING } from '@gyre/shared';
import { api, createFirstAdmin, E2E_PASSWORD, inviteAndAccept, signInApi } from './accounts';
import { writeAlphaRecording } from './edf-files';
import type { RunningGyre } from './gyre-server';

/**
 * The one builder of the browser tests' invented studies: each test file says who and what
 * its study holds, and these functions make it through the API as the product's users would.
 */

export type Person = { email: string; name: string };

/** Roles that work at one site; the others see the whole study. */
const SITE_ROLES: ReadonlySet<Role> = new Set<Role>(['technician', 'coordinator']);

export interface StudyTeam {
  study: StudyView;
  site: SiteView;
  adminToken: string;
  /** The access token of the member in `role`, signed in through the API. */
  tokenOf: (role: Role) => string;
}

/**
 * An empty installation opened by its first admin (`admin`), a study with one site, and each
 * member invited in their role and signed up with the mailed token (site roles at the site).
 */
export async function setUpStudy(
  gyre: RunningGyre,
  options: {
    admin: Person;
    study: { code: string; name: string };
    /** Default: East clinic. */
    site?: { code: string; name: string };
    /** One person per role, invited in this order. */
    members: Partial<Record<Role, Person>>;
  },
): Promise<StudyTeam> {
  await createFirstAdmin(gyre.dataDir, { ...options.admin, password: E2E_PASSWORD });
  const adminToken = await signInApi(gyre.baseUrl, options.admin.email, E2E_PASSWORD);
  const study = await api<StudyView>(
    gyre.baseUrl,
    adminToken,
    'POST',
    '/api/studies',
    options.study,
  );
  const site = await api<SiteView>(gyre.baseUrl, adminToken, 'POST', '/api/sites', {
    studyId: study.id,
    ...(options.site ?? { code: 'EAST', name: 'East clinic' }),
  });
  const tokens = new Map<Role, string>();
  for (const [role, person] of Object.entries(options.members) as Array<[Role, Person]>) {
    await inviteAndAccept(gyre.baseUrl, gyre.dataDir, adminToken, {
      ...person,
      role,
      studyId: study.id,
      ...(SITE_ROLES.has(role) ? { siteId: site.id } : {}),
    });
    tokens.set(role, await signInApi(gyre.baseUrl, person.email, E2E_PASSWORD));
  }
  const tokenOf = (role: Role): string => {
    const token = tokens.get(role);
    if (token === undefined) throw new Error(`the study has no ${role}`);
    return token;
  };
  return { study, site, adminToken, tokenOf };
}

/** A participant enrolled by `token`'s technician. */
export function addParticipant(
  gyre: RunningGyre,
  token: string,
  participant: { code: string; enrolmentDate?: string },
): Promise<ParticipantView> {
  return api<ParticipantView>(gyre.baseUrl, token, 'POST', '/api/participants', participant);
}

/** A visit of `participant`: a planned one (`plannedVisitId`), else unscheduled with `label`. */
export function addVisit(
  gyre: RunningGyre,
  token: string,
  participant: ParticipantView,
  visit: { visitDate: string; label?: string; plannedVisitId?: string },
): Promise<VisitView> {
  return api<VisitView>(gyre.baseUrl, token, 'POST', '/api/visits', {
    participantId: participant.id,
    ...(visit.plannedVisitId === undefined ? { unscheduled: true } : {}),
    ...visit,
  });
}

/** Uploads one recording to a visit through the API, as the Intake screen does. */
export async function uploadRecording(
  baseUrl: string,
  token: string,
  visit: VisitView,
  kind: RecordingKind,
  bytes: Uint8Array,
): Promise<RecordingView> {
  const form = new FormData();
  form.append('kind', kind);
  form.append('file', new Blob([new Uint8Array(bytes)]), `${visit.label}-${kind}.edf`);
  const response = await fetch(`${baseUrl}/api/visits/${visit.id}/recordings`, {
    method: 'POST',
    headers: { authorization: `Bearer ${token}` },
    body: form,
  });
  const text = await response.text();
  if (!response.ok) throw new Error(`upload answered ${response.status}: ${text}`);
  return JSON.parse(text) as RecordingView;
}

/** Uploads a generated recording (`writeAlphaRecording`) and waits until it is computed. */
export async function uploadComputed(
  gyre: RunningGyre,
  token: string,
  visit: VisitView,
  recording: Parameters<typeof writeAlphaRecording>[0],
): Promise<RecordingView> {
  const uploaded = await uploadRecording(
    gyre.baseUrl,
    token,
    visit,
    recording.kind,
    writeAlphaRecording(recording),
  );
  return waitUntilReady(gyre.baseUrl, token, uploaded);
}

/** Asks for the recording until it is ready (throws if it is rejected or fails). */
export async function waitUntilReady(
  baseUrl: string,
  token: string,
  recording: RecordingView,
  timeoutMs = 240_000,
): Promise<RecordingView> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const now = await api<RecordingView>(baseUrl, token, 'GET', `/api/recordings/${recording.id}`);
    if (now.state === 'ready') return now;
    if (now.state === 'rejected' || now.state === 'failed') {
      throw new Error(`${recording.kind} recording ${now.state}: ${JSON.stringify(now)}`);
    }
    if (Date.now() > deadline) throw new Error(`${recording.kind} recording still ${now.state}`);
    await new Promise((wait) => setTimeout(wait, 500));
  }
}

export interface InventedStudy {
  study: StudyView;
  site: SiteView;
  participant: ParticipantView;
  visit: VisitView;
  people: Record<'admin' | 'technician' | 'analyst' | 'monitor' | 'coordinator', Person>;
}

/**
 * An invented study on a fresh server: the first admin, one site, one person per role, a
 * planned visit, one participant with one visit whose resting and task recordings are
 * computed, and its report signed by the analyst (so every screen has something to show).
 */
export async function setUpInventedStudy(
  gyre: RunningGyre,
  people: InventedStudy['people'],
): Promise<InventedStudy> {
  const { study, site, adminToken, tokenOf } = await setUpStudy(gyre, {
    admin: people.admin,
    study: { code: 'ALPHA-LAYOUT', name: 'Alpha layout check (invented)' },
    site: { code: 'WEST', name: 'West clinic' },
    members: {
      technician: people.technician,
      analyst: people.analyst,
      monitor: people.monitor,
      coordinator: people.coordinator,
    },
  });
  const baseline = await api<{ id: string }>(
    gyre.baseUrl,
    adminToken,
    'POST',
    `/api/studies/${study.id}/planned-visits`,
    {
      name: 'Baseline',
      targetDay: 0,
      windowBeforeDays: 0,
      windowAfterDays: 14,
      position: 0,
    },
  );
  const techToken = tokenOf('technician');
  const participant = await addParticipant(gyre, techToken, {
    code: 'LW-0031',
    enrolmentDate: '2025-04-01',
  });
  const visit = await addVisit(gyre, techToken, participant, {
    plannedVisitId: baseline.id,
    visitDate: '2025-04-07',
  });
  const startDate = '2025-04-07T10:00:00';
  const alpha = { alphaHz: 10.1, startDate } as const;
  await uploadComputed(gyre, techToken, visit, {
    ...alpha,
    kind: 'resting',
    deltaFHz: 0,
    durationS: 60,
  });
  await uploadComputed(gyre, techToken, visit, {
    ...alpha,
    kind: 'task',
    deltaFHz: -0.5,
    durationS: 120,
  });

  const analystToken = tokenOf('analyst');
  const signOff = await api<ReportSignOffView>(
    gyre.baseUrl,
    analystToken,
    'GET',
    `/api/visits/${visit.id}/report/sign-off`,
  );
  if (signOff.cannotSignReason !== null) {
    throw new Error(`the report cannot be signed: ${signOff.cannotSignReason}`);
  }
  await api(gyre.baseUrl, analystToken, 'POST', `/api/visits/${visit.id}/report/sign`, {
    password: E2E_PASSWORD,
    meaning: SIGNATURE_MEANING,
    fingerprint: signOff.draftFingerprint,
  });
  return { study, site, participant, visit, people };
}
