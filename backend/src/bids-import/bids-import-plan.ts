import {
  isCalendarDate,
  PARTICIPANT_CODE_PATTERN,
  subject,
  type AppAbility,
  type BidsImportFilePreview,
} from '@gyre/shared';
import type { Participant } from '../participants/participant.entity';
import type { PlannedVisit } from '../schedule/planned-visit.entity';
import type { Visit } from '../visits/visit.entity';
import type { ReceivedBidsUpload } from './bids-import-receiver';
import { folderProblem, parseBidsName, type BidsName } from './bids-paths';
import {
  badChannels,
  eventsToOnsets,
  kindOfTask,
  readEegSidecar,
  scanDates,
  SidecarError,
} from './bids-sidecars';

/** What the study holds that the mapping needs. */
export interface PlanContext {
  studyId: string;
  ability: AppAbility;
  participants: Participant[];
  schedule: PlannedVisit[];
  visits: Visit[];
  /** Create participants for unknown `sub-` labels at this site (null: do not create). */
  newParticipantSiteId: string | null;
  /** The visit date when no `*_scans.tsv` gives one. */
  visitDate: string | null;
}

/** One recording of the upload, mapped: its preview and what the import needs. */
export interface PlannedFile {
  preview: BidsImportFilePreview;
  participant: Participant | null;
  planned: PlannedVisit | null;
  visit: Visit | null;
  onsetsCsv: Buffer | null;
}

/**
 * Maps every `*_eeg.edf|bdf` of an upload to a participant (its `sub-` label), a planned visit
 * (its `ses-` label) and a kind (its task), and reads its sidecars; every problem is named on
 * the file. Reads nothing itself: the study's rows come in `context`.
 */
export function planImport(upload: ReceivedBidsUpload, context: PlanContext): PlannedFile[] {
  const sidecars = [...upload.sidecars.entries()].map(([path, bytes]) => ({
    path,
    bytes,
    dir: path.slice(0, path.lastIndexOf('/') + 1),
    name: parseBidsName(path),
  }));
  const byCode = new Map(context.participants.map((p) => [codeKey(p.code), p]));
  const byVisitName = new Map(context.schedule.map((p) => [sessionKey(p.name), p]));
  const planned: PlannedFile[] = [];
  for (const path of [...upload.recordings.keys()].sort()) {
    const file = emptyPreview(path);
    const problems = file.problems;
    const entry: PlannedFile = {
      preview: file,
      participant: null,
      planned: null,
      visit: null,
      onsetsCsv: null,
    };
    planned.push(entry);
    const name = parseBidsName(path);
    if (name === null || name.suffix !== 'eeg') {
      problems.push(
        `${path}: not a BIDS file name; sub-<label>[_ses-<label>]_task-<label>[_run-<index>]_eeg.edf|bdf expected`,
      );
      continue;
    }
    const folder = folderProblem(path, name);
    if (folder !== null) problems.push(folder);
    file.subject = name.entities.sub;
    file.session = name.entities.ses ?? null;
    file.task = name.entities.task ?? '';
    if (name.entities.task === undefined) {
      problems.push(`${path}: no task- entity; the EEG-BIDS file name requires task-<label>`);
    }
    // Sidecars: the one beside the file with the most of its entities (BIDS inheritance).
    const dir = path.slice(0, path.lastIndexOf('/') + 1);
    const sidecar = (suffix: string, extension: string) =>
      sidecars
        .filter(
          (s) =>
            s.dir === dir &&
            s.name !== null &&
            s.name.suffix === suffix &&
            s.name.extension === extension &&
            Object.entries(s.name.entities).every(([k, v]) => name.entities[k] === v),
        )
        .sort((a, b) => entityCount(b.name) - entityCount(a.name))[0] ?? null;
    const read = <T>(
      found: { path: string; bytes: Buffer } | null,
      use: (bytes: Buffer, p: string) => T,
    ): T | null => {
      if (found === null) return null;
      try {
        return use(found.bytes, found.path);
      } catch (error) {
        if (!(error instanceof SidecarError)) throw error;
        problems.push(error.message);
        return null;
      }
    };
    const eegJson = sidecar('eeg', '.json');
    if (eegJson === null) {
      problems.push(
        `${path}: no ${name.stem}_eeg.json beside it; EEG-BIDS requires the sidecar with TaskName and PowerLineFrequency`,
      );
    }
    const json = read(eegJson, readEegSidecar);
    file.taskName = json?.taskName ?? null;
    file.lineFrequencyHz = json?.lineFrequencyHz ?? null;
    if (eegJson !== null && json !== null && json.lineFrequencyHz === null) {
      file.warnings.push('PowerLineFrequency is n/a: both line-noise checks (50 and 60 Hz) apply');
    }
    file.kind = kindOfTask(file.task, file.taskName);
    file.channelsLeftOut = read(sidecar('channels', '.tsv'), badChannels) ?? [];
    const events = read(sidecar('events', '.tsv'), (bytes, p) =>
      eventsToOnsets(bytes, p, file.task === '' ? 'stimulus' : file.task),
    );
    if (events !== null && file.kind === 'task') {
      file.onsetCount = events.count;
      file.conditions = events.conditions;
      entry.onsetsCsv = Buffer.from(events.onsetsCsv, 'utf8');
    } else if (events !== null && events.count > 0) {
      file.warnings.push(
        `${events.count} events of the events file are not used: a resting recording has no stimulus onsets`,
      );
    }

    mapParticipant(entry, context, byCode);
    mapVisit(entry, context, byVisitName, sidecars, name);
  }
  markDuplicates(planned);
  return planned;
}

function mapParticipant(
  entry: PlannedFile,
  context: PlanContext,
  byCode: Map<string, Participant>,
): void {
  const file = entry.preview;
  if (file.subject === '') return;
  const participant = byCode.get(codeKey(file.subject)) ?? null;
  if (participant !== null) {
    file.participantCode = participant.code;
    file.participant = 'existing';
    const where = (): { studyId: string; siteId: string } => ({
      studyId: context.studyId,
      siteId: participant.siteId,
    });
    if (
      !context.ability.can('upload', subject('Recording', where())) ||
      !context.ability.can('create', subject('Visit', where()))
    ) {
      file.problems.push(
        `sub-${file.subject}: participant ${participant.code} belongs to a site you do not upload for`,
      );
    }
    entry.participant = participant;
    return;
  }
  const code = file.subject.toUpperCase();
  if (context.newParticipantSiteId === null) {
    file.problems.push(
      `sub-${file.subject}: no participant ${code} in this study; add the participant first or allow the import to create participants`,
    );
    return;
  }
  if (!PARTICIPANT_CODE_PATTERN.test(code)) {
    file.problems.push(
      `sub-${file.subject}: '${code}' is not a participant code (3 to 24 upper-case letters and digits, at least one digit)`,
    );
    return;
  }
  file.participantCode = code;
  file.participant = 'new';
}

function mapVisit(
  entry: PlannedFile,
  context: PlanContext,
  byVisitName: Map<string, PlannedVisit>,
  sidecars: Array<{ path: string; bytes: Buffer; name: BidsName | null }>,
  name: BidsName,
): void {
  const file = entry.preview;
  if (file.session === null) {
    file.problems.push(
      `${file.path}: no ses- entity; each session maps to a planned visit, so sub-<label>/ses-<label>/eeg/ is expected`,
    );
    return;
  }
  const planned = byVisitName.get(sessionKey(file.session)) ?? null;
  if (planned === null) {
    file.problems.push(
      context.schedule.length === 0
        ? `ses-${file.session}: the study has no visit schedule, so no planned visit matches`
        : `ses-${file.session}: no planned visit matches; one of ${context.schedule.map((p) => `ses-${sessionKey(p.name)} (${p.name})`).join(', ')} expected`,
    );
    return;
  }
  entry.planned = planned;
  file.plannedVisit = planned.name;
  if (entry.participant !== null) {
    entry.visit =
      context.visits.find(
        (v) => v.participantId === entry.participant?.id && v.plannedVisitId === planned.id,
      ) ?? null;
  }
  if (entry.visit !== null) {
    file.visit = 'existing';
    file.visitId = entry.visit.id;
    file.visitDate = entry.visit.visitDate;
    return;
  }
  file.visit = 'new';
  // Common principles, "Scans file": sub-<label>[_ses-<label>]_scans.tsv with acq_time.
  const recordingName = file.path.slice(file.path.lastIndexOf('/') + 1);
  let date: string | null = null;
  for (const s of sidecars) {
    if (s.name?.suffix !== 'scans' || s.name.entities.sub !== name.entities.sub) continue;
    if (s.name.entities.ses !== undefined && s.name.entities.ses !== name.entities.ses) continue;
    try {
      date = scanDates(s.bytes, s.path).get(recordingName) ?? date;
    } catch (error) {
      if (!(error instanceof SidecarError)) throw error;
      file.problems.push(error.message);
    }
  }
  date ??= context.visitDate;
  if (date === null || !isCalendarDate(date)) {
    file.problems.push(
      date === null
        ? `ses-${file.session}: the visit does not exist yet and no acq_time in a scans.tsv or visit date was given to create it`
        : `visit date: '${date}' found, a calendar date YYYY-MM-DD expected`,
    );
    return;
  }
  file.visitDate = date;
}

/** Two files for the same participant, planned visit and kind: a duplicate session. */
function markDuplicates(planned: PlannedFile[]): void {
  const seen = new Map<string, string>();
  for (const { preview } of planned) {
    if (preview.participantCode === null || preview.plannedVisit === null) continue;
    const key = `${preview.participantCode}|${preview.plannedVisit}|${preview.kind}`;
    const first = seen.get(key);
    if (first === undefined) seen.set(key, preview.path);
    else {
      preview.problems.push(
        `duplicate session: ${first} already brings the ${preview.kind} recording of ${preview.participantCode} at ${preview.plannedVisit}`,
      );
    }
  }
}

/** Participant codes match `sub-` labels without their hyphens, in any case (AC-0042 ↔ AC0042). */
function codeKey(code: string): string {
  return code.replace(/-/g, '').toUpperCase();
}

/** Planned visit names match `ses-` labels by letters and digits only (Week 4 ↔ ses-week4). */
function sessionKey(name: string): string {
  return name.replace(/[^a-zA-Z0-9]/g, '').toLowerCase();
}

function entityCount(name: BidsName | null): number {
  return name === null ? 0 : Object.keys(name.entities).length;
}

function emptyPreview(path: string): BidsImportFilePreview {
  return {
    path,
    subject: '',
    participantCode: null,
    participant: null,
    session: null,
    plannedVisit: null,
    visit: null,
    visitDate: null,
    task: '',
    taskName: null,
    kind: 'task',
    onsetCount: null,
    conditions: [],
    channelsLeftOut: [],
    lineFrequencyHz: null,
    problems: [],
    warnings: [],
    recordingId: null,
    visitId: null,
  };
}
