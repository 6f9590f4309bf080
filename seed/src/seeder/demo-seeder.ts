/**
 * Loads the invented demo study into a running, empty Gyre through its own HTTP API, the way
 * its people would: the admin sets up the study, sites and invitations; each invited person
 * activates their account from the e-mail; each site's technician registers participants
 * and visits and uploads both recordings of every visit (multipart, as the Intake screen
 * does); the server validates and computes them; the analyst raises one slowing flag, signs
 * one visit report per site and marks a few visits reviewed; one reviewed visit's resting
 * recording is then replaced, so its results change since the review.
 * No result is written by the seeder: every number comes out of Gyre's own pipeline.
 */
import { join } from 'node:path';
import type {
  DemoAccount,
  DemoParticipant,
  DemoScenario,
  DemoVisit,
} from '../scenario/demo-scenario';
import {
  generateRetakeResting,
  generateVisitRecordings,
  truncatedCopy,
} from '../scenario/demo-recordings';
import { waitForLinkToken } from './captured-mail';
import {
  DemoCredential,
  formatAccounts,
  formatAccountsForLog,
  generatePassword,
  writeAccountsFile,
} from './demo-accounts-file';
import { GyreApiError, GyreClient } from './gyre-client';

/** The only step outside the API: the first admin of an empty installation. */
export type CreateFirstAdmin = (input: {
  email: string;
  name: string;
  password: string;
}) => Promise<{ created: boolean }>;

export interface SeedDemoOptions {
  /** The running server, e.g. `http://127.0.0.1:3000`. */
  baseUrl: string;
  /** The server's DATA_DIR: invitation e-mails are read from its `mail/`, the accounts file goes here. */
  dataDir: string;
  /** Shown in the accounts file. */
  signInUrl: string;
  scenario: DemoScenario;
  createFirstAdmin: CreateFirstAdmin;
  log?: (line: string) => void;
  /** Wait until every recording is computed, then raise the flag (default true). */
  waitForResults?: boolean;
  /** Default 15 minutes. */
  resultTimeoutMs?: number;
}

export interface SeededVisit {
  label: string;
  visitId: string;
  /** The generated truth of this visit. */
  truth: DemoVisit;
  restingRecordingId: string;
  taskRecordingId: string;
}

export interface SeededParticipant {
  code: string;
  participantId: string;
  truth: DemoParticipant;
  visits: SeededVisit[];
}

export interface DemoSeedResult {
  status: 'seeded' | 'not-empty';
  credentials: DemoCredential[];
  accountsFile: string | null;
  studyId: string | null;
  participants: SeededParticipant[];
  rejectedRecordingId: string | null;
  flaggedVisitId: string | null;
  /** Visits whose report the analyst signed. */
  signedVisitIds: string[];
  /** Visits the analyst marked reviewed (the replaced one included). */
  reviewedVisitIds: string[];
  /** The reviewed visit whose resting recording was replaced afterwards. */
  replacedAfterReviewVisitId: string | null;
  /** Recordings by state when seeding ended. */
  recordingStates: Record<string, number>;
  timingsMs: { accounts: number; uploads: number; results: number; total: number };
}

interface IdOnly {
  id: string;
}

interface SignOffStatus {
  meaning: string;
  draftFingerprint: string | null;
  canSign: boolean;
  cannotSignReason: string | null;
}

interface ReviewState {
  currentFingerprint: string | null;
  canReview: boolean;
  cannotReviewReason: string | null;
}

interface RecordingSummary {
  id: string;
  state: string;
  progressPercent: number | null;
  failureMessage: string | null;
}

const SETTLED = new Set(['ready', 'rejected', 'failed', 'superseded']);
const POLL_MS = 1000;
const PROGRESS_EVERY_MS = 10_000;

/** Seeds the demo; answers `not-empty` (and changes nothing) when the installation has users. */
export async function seedDemo(options: SeedDemoOptions): Promise<DemoSeedResult> {
  const log = options.log ?? (() => undefined);
  const { scenario } = options;
  const startedAt = Date.now();
  const anonymous = new GyreClient(options.baseUrl);
  const siteName = (key: string | null): string | null =>
    key === null ? null : (scenario.sites.find((s) => s.key === key)?.name ?? key);
  const credentials: DemoCredential[] = scenario.accounts.map((account) => ({
    ...account,
    password: generatePassword(),
    siteName: siteName(account.siteKey),
  }));
  const credentialOf = (
    role: DemoAccount['role'],
    siteKey: string | null = null,
  ): DemoCredential => {
    const found = credentials.find((c) => c.role === role && c.siteKey === siteKey);
    if (found === undefined)
      throw new Error(`The scenario has no ${role} account for site ${siteKey}`);
    return found;
  };

  const admin = credentialOf('admin');
  const first = await options.createFirstAdmin({
    email: admin.email,
    name: admin.displayName,
    password: admin.password,
  });
  if (!first.created) {
    return {
      status: 'not-empty',
      credentials: [],
      accountsFile: null,
      studyId: null,
      participants: [],
      rejectedRecordingId: null,
      flaggedVisitId: null,
      signedVisitIds: [],
      reviewedVisitIds: [],
      replacedAfterReviewVisitId: null,
      recordingStates: {},
      timingsMs: { accounts: 0, uploads: 0, results: 0, total: Date.now() - startedAt },
    };
  }
  log(`created the first admin ${admin.email}`);
  const asAdmin = await anonymous.signIn(admin.email, admin.password);

  // The admin's part: study, sites, invitations (Team screen).
  const study = await asAdmin.post<IdOnly>('/api/studies', scenario.study);
  const siteIds = new Map<string, string>();
  for (const site of scenario.sites) {
    const created = await asAdmin.post<IdOnly>('/api/sites', {
      studyId: study.id,
      code: site.code,
      name: site.name,
    });
    siteIds.set(site.key, created.id);
  }
  // The study's schedule and groups (study set-up, like its sites).
  const plannedVisitIds = new Map<string, string>();
  for (const [position, planned] of scenario.schedule.entries()) {
    const created = await asAdmin.post<IdOnly>(`/api/studies/${study.id}/planned-visits`, {
      ...planned,
      position,
    });
    plannedVisitIds.set(planned.name, created.id);
  }
  const groupIds = new Map<string, string>();
  for (const group of scenario.groups) {
    const created = await asAdmin.post<IdOnly>(`/api/studies/${study.id}/groups`, {
      name: group.name,
      description: group.description,
    });
    groupIds.set(group.key, created.id);
  }
  const idIn = (ids: Map<string, string>, key: string, what: string): string => {
    const id = ids.get(key);
    if (id === undefined) throw new Error(`The scenario names an unknown ${what} '${key}'`);
    return id;
  };
  const siteIdOf = (key: string): string => {
    const id = siteIds.get(key);
    if (id === undefined) throw new Error(`The scenario names an unknown site '${key}'`);
    return id;
  };
  const mailDir = join(options.dataDir, 'mail');
  for (const account of credentials.filter((c) => c.role !== 'admin')) {
    await asAdmin.post('/api/users/invitations', {
      email: account.email,
      name: account.displayName,
      role: account.role,
      studyId: study.id,
      ...(account.siteKey === null ? {} : { siteId: siteIdOf(account.siteKey) }),
    });
  }
  // Each invited person follows the link in their e-mail and chooses a password.
  for (const account of credentials.filter((c) => c.role !== 'admin')) {
    const token = await waitForLinkToken({ mailDir, to: account.email, route: '/accept-invite' });
    await anonymous.post('/api/auth/accept-invitation', { token, password: account.password });
  }
  const accountsFile = writeAccountsFile(
    options.dataDir,
    formatAccounts(credentials, options.signInUrl),
  );
  const accountsMs = Date.now() - startedAt;
  log(`${credentials.length} demo accounts ready (${accountsFile})`);
  // Passwords stay in the 0600 accounts file; the log only says who and where.
  log(formatAccountsForLog(credentials, options.signInUrl, accountsFile));

  // The technicians' part: participants, visits and uploads (Intake screen).
  const technicians = new Map<string, GyreClient>();
  for (const site of scenario.sites) {
    const technician = credentialOf('technician', site.key);
    technicians.set(site.key, await anonymous.signIn(technician.email, technician.password));
  }
  const uploadsStartedAt = Date.now();
  const participants: SeededParticipant[] = [];
  let rejectedRecordingId: string | null = null;
  let uploadCount = 0;
  for (const participant of scenario.participants) {
    const technician = technicians.get(participant.siteKey);
    if (technician === undefined)
      throw new Error(`No technician for site '${participant.siteKey}'`);
    const created = await technician.post<IdOnly>('/api/participants', {
      code: participant.code,
      enrolmentDate: participant.enrolmentDate,
      groupId: idIn(groupIds, participant.groupKey, 'group'),
    });
    const seeded: SeededParticipant = {
      code: participant.code,
      participantId: created.id,
      truth: participant,
      visits: [],
    };
    for (const visit of participant.visits) {
      // Each visit is registered on its planned visit, whose name becomes its label.
      const visitRow = await technician.post<IdOnly>('/api/visits', {
        participantId: created.id,
        plannedVisitId: idIn(plannedVisitIds, visit.label, 'planned visit'),
        visitDate: visit.date,
      });
      const files = generateVisitRecordings(scenario, participant, visit);
      const baseName = `${participant.code}_${visit.label.replace(/\s+/g, '-').toLowerCase()}`;
      // Resting first: the server computes a visit's task with the band around its resting IAF.
      const resting = await technician.upload<IdOnly>(visitRow.id, {
        kind: 'resting',
        fileName: `${baseName}_resting.edf`,
        edf: files.resting.edf,
      });
      const onsetCsv =
        visit.withOnsetCsv && files.task.onsetCsv !== null
          ? { fileName: `${baseName}_onsets.csv`, text: files.task.onsetCsv }
          : null;
      const target = scenario.malformedUpload;
      if (target.participantCode === participant.code && target.visitLabel === visit.label) {
        rejectedRecordingId = await uploadBroken(technician, visitRow.id, {
          fileName: `${baseName}_task.edf`,
          edf: truncatedCopy(files.task.edf),
        });
        log(`${participant.code} ${visit.label}: the cut-off task file was rejected, as intended`);
        uploadCount++;
      }
      const task = await technician.upload<IdOnly>(visitRow.id, {
        kind: 'task',
        fileName: `${baseName}_task.edf`,
        edf: files.task.edf,
        onsetCsv,
      });
      uploadCount += 2;
      seeded.visits.push({
        label: visit.label,
        visitId: visitRow.id,
        truth: visit,
        restingRecordingId: resting.id,
        taskRecordingId: task.id,
      });
    }
    participants.push(seeded);
    log(
      `${participant.code}: ${participant.visits.length} visits uploaded (${uploadCount} files so far)`,
    );
  }
  const uploadsMs = Date.now() - uploadsStartedAt;
  log(`all ${uploadCount} uploads done in ${(uploadsMs / 1000).toFixed(1)} s; computing goes on`);

  const analyst = credentialOf('analyst');
  const asAnalyst = await anonymous.signIn(analyst.email, analyst.password);
  const resultsStartedAt = Date.now();
  let recordingStates: Record<string, number> = {};
  let flaggedVisitId: string | null = null;
  const signedVisitIds: string[] = [];
  const reviewedVisitIds: string[] = [];
  let replacedAfterReviewVisitId: string | null = null;
  const visitOf = (target: { participantCode: string; visitLabel: string }, what: string) => {
    const participant = participants.find((p) => p.code === target.participantCode);
    const visit = participant?.visits.find((v) => v.label === target.visitLabel);
    if (participant === undefined || visit === undefined)
      throw new Error(`The scenario ${what} a visit it does not have`);
    return { participant, visit };
  };
  if (options.waitForResults ?? true) {
    await waitUntilSettled(asAnalyst, {
      expected: uploadCount,
      timeoutMs: options.resultTimeoutMs ?? 15 * 60_000,
      log,
    });
    // The analyst's part: one slowing flag with a written reason (Review screen).
    const flagTarget = participants
      .find((p) => p.code === scenario.flag.participantCode)
      ?.visits.find((v) => v.label === scenario.flag.visitLabel);
    if (flagTarget === undefined) throw new Error('The scenario flags a visit it does not have');
    await asAnalyst.post(`/api/visits/${flagTarget.visitId}/flag/raise`, {
      reason: scenario.flag.reason,
    });
    flaggedVisitId = flagTarget.visitId;
    log(
      `${scenario.flag.participantCode} ${scenario.flag.visitLabel}: slowing flag raised by the analyst`,
    );
    // The analyst signs a report per site (Review sign-off): password again, the stated
    // meaning and the fingerprint of the draft; the server e-mails the site's coordinator.
    for (const target of scenario.signedReports) {
      const visit = participants
        .find((p) => p.code === target.participantCode)
        ?.visits.find((v) => v.label === target.visitLabel);
      if (visit === undefined)
        throw new Error('The scenario signs a report of a visit it does not have');
      const signOff = await asAnalyst.get<SignOffStatus>(
        `/api/visits/${visit.visitId}/report/sign-off`,
      );
      if (!signOff.canSign || signOff.draftFingerprint === null) {
        throw new Error(
          `${target.participantCode} ${target.visitLabel}: the report cannot be signed: ${signOff.cannotSignReason ?? 'no reason given'}`,
        );
      }
      await asAnalyst.post(
        `/api/visits/${visit.visitId}/report/sign`,
        {
          password: analyst.password,
          meaning: signOff.meaning,
          fingerprint: signOff.draftFingerprint,
        },
        [201],
      );
      signedVisitIds.push(visit.visitId);
      log(`${target.participantCode} ${target.visitLabel}: report signed by the analyst`);
    }
    // The analyst marks a few visits reviewed (Review's "Mark reviewed"): the fingerprint of
    // the results on screen goes with the act, as the Review screen sends it.
    for (const target of scenario.reviewedVisits) {
      const { visit } = visitOf(target, 'reviews');
      const state = await asAnalyst.get<ReviewState>(`/api/visits/${visit.visitId}/review`);
      if (!state.canReview || state.currentFingerprint === null) {
        throw new Error(
          `${target.participantCode} ${target.visitLabel}: the visit cannot be marked reviewed: ${state.cannotReviewReason ?? 'no reason given'}`,
        );
      }
      await asAnalyst.post(`/api/visits/${visit.visitId}/review`, {
        fingerprint: state.currentFingerprint,
      });
      reviewedVisitIds.push(visit.visitId);
    }
    log(`${reviewedVisitIds.length} visits marked reviewed by the analyst`);
    // Then the site's technician replaces one reviewed visit's resting recording with a
    // second take (Intake's replace): new results, so the review no longer holds.
    const retake = scenario.replacedAfterReview;
    const { participant, visit } = visitOf(retake, 'replaces a recording of');
    if (!reviewedVisitIds.includes(visit.visitId)) {
      throw new Error('The scenario replaces a recording of a visit it does not review first');
    }
    const technician = technicians.get(participant.truth.siteKey);
    if (technician === undefined)
      throw new Error(`No technician for site '${participant.truth.siteKey}'`);
    const file = generateRetakeResting(scenario, participant.truth, visit.truth);
    const replacement = await technician.upload<IdOnly>(visit.visitId, {
      kind: 'resting',
      fileName: `${participant.code}_${visit.label.replace(/\s+/g, '-').toLowerCase()}_resting-retake.edf`,
      edf: file.edf,
      replaces: { recordingId: visit.restingRecordingId, reason: retake.reason },
    });
    uploadCount++;
    replacedAfterReviewVisitId = visit.visitId;
    log(`${retake.participantCode} ${retake.visitLabel}: resting recording replaced after review`);
    // The visit's task is recomputed when the new take moves the resting IAF (once its run
    // lands), so settle, give that recomputation a moment to be queued, and settle again.
    const waitOptions = {
      expected: uploadCount,
      timeoutMs: options.resultTimeoutMs ?? 15 * 60_000,
      log,
    };
    await waitUntilSettled(asAnalyst, waitOptions);
    await new Promise((resolve) => setTimeout(resolve, 3 * POLL_MS));
    recordingStates = await waitUntilSettled(asAnalyst, waitOptions);
    const replaced = await asAnalyst.get<RecordingSummary>(`/api/recordings/${replacement.id}`);
    if (replaced.state !== 'ready') {
      throw new Error(
        `${retake.participantCode} ${retake.visitLabel}: the replacing resting recording is ${replaced.state}`,
      );
    }
  }
  const resultsMs = Date.now() - resultsStartedAt;
  return {
    status: 'seeded',
    credentials,
    accountsFile,
    studyId: study.id,
    participants,
    rejectedRecordingId,
    flaggedVisitId,
    signedVisitIds,
    reviewedVisitIds,
    replacedAfterReviewVisitId,
    recordingStates,
    timingsMs: {
      accounts: accountsMs,
      uploads: uploadsMs,
      results: resultsMs,
      total: Date.now() - startedAt,
    },
  };
}

/** Sends a file the server must refuse; returns the id of the `rejected` recording it keeps. */
async function uploadBroken(
  technician: GyreClient,
  visitId: string,
  file: { fileName: string; edf: Uint8Array },
): Promise<string> {
  try {
    await technician.upload(visitId, { kind: 'task', ...file });
  } catch (error) {
    if (error instanceof GyreApiError && error.code === 'RECORDING_REJECTED') {
      const details = error.details as { recording?: { id?: unknown } } | null;
      const id = details?.recording?.id;
      if (typeof id === 'string') return id;
    }
    throw error;
  }
  throw new Error('The cut-off demo file was accepted: Gyre should have rejected it');
}

/** Polls `GET /api/recordings` until all `expected` recordings are ready, rejected or failed. */
async function waitUntilSettled(
  client: GyreClient,
  options: { expected: number; timeoutMs: number; log: (line: string) => void },
): Promise<Record<string, number>> {
  const deadline = Date.now() + options.timeoutMs;
  let lastReport = Date.now();
  for (;;) {
    const all: RecordingSummary[] = [];
    for (let page = 1; ; page++) {
      const result = await client.get<{ items: RecordingSummary[]; total: number }>(
        `/api/recordings?pageSize=200&page=${page}`,
      );
      all.push(...result.items);
      if (all.length >= result.total || result.items.length === 0) break;
    }
    const states: Record<string, number> = {};
    for (const r of all) states[r.state] = (states[r.state] ?? 0) + 1;
    const settled = all.filter((r) => SETTLED.has(r.state)).length;
    if (all.length >= options.expected && settled === all.length) {
      for (const failed of all.filter((r) => r.state === 'failed')) {
        options.log(`recording ${failed.id} failed: ${failed.failureMessage ?? 'no message'}`);
      }
      return states;
    }
    if (Date.now() - lastReport >= PROGRESS_EVERY_MS) {
      lastReport = Date.now();
      const summary = Object.entries(states)
        .map(([state, count]) => `${count} ${state}`)
        .join(', ');
      options.log(`computing: ${summary}`);
    }
    if (Date.now() > deadline) {
      throw new Error(`Recordings still computing after ${options.timeoutMs / 1000} s`);
    }
    await new Promise((resolve) => setTimeout(resolve, POLL_MS));
  }
}
