import type {
  ParticipantView,
  RecordingDto,
  RecordingKind,
  ReportSignOffDto,
  SiteView,
  StudyView,
  VisitView,
} from '@gyre/shared';
import { SIGNATURE_MEANING } from '@gyre/shared';
import { api, createFirstAdmin, E2E_PASSWORD, inviteAndAccept, signInApi } from './accounts';
import { edfWriter, seededNoise } from './edf-files';
import type { RunningGyre } from './gyre-server';

const SAMPLE_RATE_HZ = 256;
const CHANNELS = ['O1', 'O2', 'Oz', 'Pz', 'P3', 'P4'];

/**
 * Generated test data: 20 µV alpha at `alphaHz` on six posterior 10-10 channels over ±3 µV
 * noise, 256 Hz, as EDF+C (Kemp & Olivan 2003). A task recording has a "stimulus" annotation
 * every 4 s and a smooth dip of `dipHz` from +0.1 to +0.9 s after each; the phase is the
 * running integral of the frequency.
 */
export function writeAlphaRecording(options: {
  kind: RecordingKind;
  alphaHz: number;
  dipHz: number;
  durationS: number;
  startDate: string;
}): Uint8Array {
  const n = SAMPLE_RATE_HZ * options.durationS;
  const onsetsS: number[] = [];
  if (options.kind === 'task') for (let t = 5; t <= options.durationS - 5; t += 4) onsetsS.push(t);
  const frequencyHz = new Float64Array(n).fill(options.alphaHz);
  for (const onset of onsetsS) {
    const from = Math.floor((onset + 0.1) * SAMPLE_RATE_HZ);
    for (let i = from; i < (onset + 0.9) * SAMPLE_RATE_HZ; i++) {
      const u = (i / SAMPLE_RATE_HZ - onset - 0.1) / 0.8;
      frequencyHz[i] -= options.dipHz * Math.sin(Math.PI * u) ** 2;
    }
  }
  const noise = seededNoise(options.kind === 'task' ? 7 : 11);
  const signals = CHANNELS.map((label, channel) => {
    const samples = new Float32Array(n);
    let phase = channel * 0.7;
    for (let i = 0; i < n; i++) {
      samples[i] = 20 * Math.sin(phase) + 3 * noise();
      phase += (2 * Math.PI * frequencyHz[i]) / SAMPLE_RATE_HZ;
    }
    return { label, sampleRateHz: SAMPLE_RATE_HZ, physicalMin: -500, physicalMax: 500, samples };
  });
  return edfWriter().writeEdf({
    format: 'EDF+C',
    startDate: options.startDate,
    signals,
    annotations: onsetsS.map((onsetS) => ({ onsetS, durationS: null, text: 'stimulus' })),
  });
}

/** Uploads one recording to a visit through the API, as the Intake screen does. */
export async function uploadRecording(
  baseUrl: string,
  token: string,
  visit: VisitView,
  kind: RecordingKind,
  bytes: Uint8Array,
): Promise<RecordingDto> {
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
  return JSON.parse(text) as RecordingDto;
}

/** Asks for the recording until it is ready (throws if it is rejected or fails). */
export async function waitUntilReady(
  baseUrl: string,
  token: string,
  recording: RecordingDto,
  timeoutMs = 240_000,
): Promise<RecordingDto> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const now = await api<RecordingDto>(baseUrl, token, 'GET', `/api/recordings/${recording.id}`);
    if (now.state === 'ready') return now;
    if (now.state === 'rejected' || now.state === 'failed') {
      throw new Error(`${recording.kind} recording ${now.state}: ${JSON.stringify(now)}`);
    }
    if (Date.now() > deadline) throw new Error(`${recording.kind} recording still ${now.state}`);
    await new Promise((wait) => setTimeout(wait, 500));
  }
}

export type Person = { email: string; name: string };

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
  await createFirstAdmin(gyre.dataDir, { ...people.admin, password: E2E_PASSWORD });
  const adminToken = await signInApi(gyre.baseUrl, people.admin.email, E2E_PASSWORD);
  const study = await api<StudyView>(gyre.baseUrl, adminToken, 'POST', '/api/studies', {
    code: 'ALPHA-LAYOUT',
    name: 'Alpha layout check (invented)',
  });
  const site = await api<SiteView>(gyre.baseUrl, adminToken, 'POST', '/api/sites', {
    studyId: study.id,
    code: 'WEST',
    name: 'West clinic',
  });
  for (const role of ['technician', 'analyst', 'monitor', 'coordinator'] as const) {
    await inviteAndAccept(gyre.baseUrl, gyre.dataDir, adminToken, {
      ...people[role],
      role,
      studyId: study.id,
      ...(role === 'technician' || role === 'coordinator' ? { siteId: site.id } : {}),
    });
  }
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
  const techToken = await signInApi(gyre.baseUrl, people.technician.email, E2E_PASSWORD);
  const participant = await api<ParticipantView>(
    gyre.baseUrl,
    techToken,
    'POST',
    '/api/participants',
    { code: 'LW-0031', enrolmentDate: '2025-04-01' },
  );
  const visit = await api<VisitView>(gyre.baseUrl, techToken, 'POST', '/api/visits', {
    participantId: participant.id,
    plannedVisitId: baseline.id,
    visitDate: '2025-04-07',
  });
  const startDate = '2025-04-07T10:00:00';
  const rest = await uploadRecording(
    gyre.baseUrl,
    techToken,
    visit,
    'resting',
    writeAlphaRecording({ kind: 'resting', alphaHz: 10.1, dipHz: 0, durationS: 60, startDate }),
  );
  await waitUntilReady(gyre.baseUrl, techToken, rest);
  const task = await uploadRecording(
    gyre.baseUrl,
    techToken,
    visit,
    'task',
    writeAlphaRecording({ kind: 'task', alphaHz: 10.1, dipHz: 0.5, durationS: 120, startDate }),
  );
  await waitUntilReady(gyre.baseUrl, techToken, task);

  const analystToken = await signInApi(gyre.baseUrl, people.analyst.email, E2E_PASSWORD);
  const signOff = await api<ReportSignOffDto>(
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
