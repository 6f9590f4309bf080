import {
  createMongoAbility,
  ForcedSubject,
  MongoAbility,
  MongoQuery,
  RawRuleOf,
  subject as asSubject,
} from '@casl/ability';
import { PackRule, packRules, unpackRules } from '@casl/ability/extra';
import { Role } from './roles';

/**
 * Gyre's permission rules, written once and used by both sides: the server checks every route
 * and scopes every query with them, the client only hides what a user cannot do.
 */
export const ACTIONS = [
  'manage',
  'read',
  'create',
  'update',
  'delete',
  'sign',
  'export',
  'rerun',
  'retry',
  'upload',
  'invite',
] as const;
export type Action = (typeof ACTIONS)[number];

/**
 * Everything a study holds: rows that carry the study's `studyId` (and, below the study, a
 * `siteId`), and the per-study views built from them. A monitor reads all of it ("reads
 * everything in the study", the role table of docs/user-guide.md), so a subject listed here is
 * one a monitor of that study can read.
 */
const STUDY_SUBJECTS = [
  'Site',
  'User',
  'Participant',
  'Visit',
  'Recording',
  'AnalysisSettings',
  'AnalysisRun',
  'Result',
  'Flag',
  'Report',
  'AuditEntry',
  /** A study's planned visits (its visit schedule). */
  'PlannedVisit',
  /** A study's groups or arms. */
  'StudyGroup',
  /** The "visit reviewed" act of an analyst (visit-reviews). */
  'VisitReview',
  /** The home screen's list of what waits for the caller (worklist). */
  'Worklist',
  /** A study's overview: group courses, completion matrix, site quality (study-overview). */
  'StudyOverview',
  /** A site's calibration run: Gyre's check of its own computation (calibration/). */
  'Calibration',
] as const;

export const SUBJECTS = [
  'Study',
  ...STUDY_SUBJECTS,
  'Outbox',
  'WorkerToken',
  /** What a worker process fetches to compute a job (the stored recording, its settings). */
  'JobInput',
  /** What a worker process posts back when a job is done. */
  'JobResult',
] as const;
export type SubjectName = (typeof SUBJECTS)[number];

/** A subject type, or a row tagged with its type by {@link subject} for a row-level check. */
export type AppSubject = SubjectName | 'all' | (ForcedSubject<SubjectName> & ScopedRow);

/** The columns the rules look at; scoped tables carry them (studyId/siteId denormalised). */
export interface ScopedRow {
  id?: string;
  studyId?: string | null;
  siteId?: string | null;
  state?: string;
}
/** Conditions are Mongo-style queries over a row's columns (`studyId`, `siteId`, `id`, `state`). */
export type RowConditions = MongoQuery<ScopedRow>;
export type AppAbility = MongoAbility<[Action, AppSubject], RowConditions>;
export type AppRule = RawRuleOf<AppAbility>;
export type PackedRules = PackRule<AppRule>[];

/** The facts about a signed-in user that the rules depend on. */
export interface AbilityUser {
  id: string;
  role: Role;
  /** `null` only for admins, who manage the whole installation. */
  studyId: string | null;
  /** Set for technicians and coordinators only. */
  siteId: string | null;
}

/** Report states a coordinator may see: only what an analyst has signed. */
export const REPORT_STATES_FOR_COORDINATOR = ['signed', 'sent'] as const;

/** Tags a plain row with its subject type so that conditions on studyId/siteId are checked. */
export function subject<T extends ScopedRow>(
  type: SubjectName,
  row: T,
): T & ForcedSubject<SubjectName> {
  return asSubject(type, row);
}

/**
 * The rules of the role table of docs/user-guide.md ("Who does what"). Scoped subjects carry `studyId` and, below the study,
 * `siteId` columns; `Study` rows are matched on `id`, `Site` rows on `id`/`studyId`.
 */
export function defineRulesFor(user: AbilityUser): AppRule[] {
  // CASL's raw-rule JSON, written directly: AbilityBuilder cannot type conditions on
  // string-named subjects, and these rules are also what the client receives.
  const rules: AppRule[] = [];
  const can = (
    action: Action | Action[],
    subject: SubjectName | SubjectName[],
    conditions?: RowConditions,
  ): void => {
    rules.push(conditions === undefined ? { action, subject } : { action, subject, conditions });
  };
  const cannot = (action: Action | Action[], subject: SubjectName | SubjectName[]): void => {
    rules.push({ action, subject, inverted: true });
  };
  const self = { id: user.id };
  /**
   * What both site roles (technician, coordinator) read: their study, their own site and
   * account, and the study's schedule and groups. Returns the scope of their site.
   */
  const siteRoleScope = (): { studyId: string; siteId: string } => {
    const studyId = required(user.studyId, 'studyId', user);
    const site = { studyId, siteId: required(user.siteId, 'siteId', user) };
    can('read', 'Study', { id: studyId });
    can('read', 'Site', { id: site.siteId, studyId });
    can('read', 'User', self);
    can('read', ['PlannedVisit', 'StudyGroup'], { studyId });
    return site;
  };
  switch (user.role) {
    case 'technician': {
      const site = siteRoleScope();
      can(['read', 'create', 'update'], ['Participant', 'Visit'], site);
      can(['read', 'create', 'upload', 'update', 'retry'], 'Recording', site);
      can('read', 'Worklist', site);
      can(['read', 'create'], 'Calibration', site);
      break;
    }
    case 'analyst': {
      const study = { studyId: required(user.studyId, 'studyId', user) };
      can('read', 'Study', { id: study.studyId });
      can('read', ['Site', 'Participant', 'Visit', 'Recording', 'Result'], study);
      can('read', ['PlannedVisit', 'StudyGroup'], study);
      can('read', 'User', self);
      can('retry', 'Recording', study);
      can(['read', 'create', 'update'], 'AnalysisSettings', study);
      can(['read', 'create', 'rerun'], 'AnalysisRun', study);
      can(['read', 'create', 'update'], 'Flag', study);
      can(['read', 'create', 'update', 'sign', 'export'], 'Report', study);
      can(['read', 'create'], 'VisitReview', study);
      can('read', 'Worklist', study);
      can('read', 'StudyOverview', study);
      can('read', 'Calibration', study);
      // Study results export for statisticians (study-exports/).
      can('export', 'Result', study);
      // Recordings are evidence: an analyst reviews them but never removes one.
      cannot('delete', 'Recording');
      break;
    }
    case 'monitor': {
      const study = { studyId: required(user.studyId, 'studyId', user) };
      can('read', 'Study', { id: study.studyId });
      can('read', [...STUDY_SUBJECTS], study);
      can('export', ['AuditEntry', 'Report'], study);
      can('export', 'Result', study);
      break;
    }
    case 'coordinator': {
      const site = siteRoleScope();
      can('read', ['Participant', 'Visit'], site);
      can(['read', 'export'], 'Report', {
        ...site,
        state: { $in: [...REPORT_STATES_FOR_COORDINATOR] },
      });
      break;
    }
    case 'admin': {
      can('manage', ['Study', 'Site', 'User']);
      // The study's schedule and groups are study set-up, like its sites.
      can('manage', ['PlannedVisit', 'StudyGroup']);
      can(['read', 'export'], 'AuditEntry');
      can('read', 'Outbox');
      // Study results exports (study-exports/): an admin may hand them to a statistician.
      can('export', 'Result');
      can('manage', 'WorkerToken');
      // The study overview's aggregate numbers, completion and site quality (study-overview/).
      can('read', 'StudyOverview');
      // A site's calibration run (calibration/): any site's, like its set-up.
      can(['read', 'create'], 'Calibration');
      // Separation of duties: whoever manages accounts never signs findings.
      cannot('sign', 'Report');
      cannot(['create', 'update'], 'Flag');
      break;
    }
    default:
      throw new Error(`Unknown role ${JSON.stringify(user.role satisfies never)}`);
  }
  return rules;
}

/**
 * A worker token's rules: it is no user and has no role, study or site. It may fetch what a
 * job needs and post what the job produced, nothing else; no user's rules name these subjects.
 */
export function defineWorkerRules(): AppRule[] {
  return [
    { action: 'read', subject: 'JobInput' },
    { action: 'create', subject: 'JobResult' },
  ];
}

export function defineWorkerAbility(): AppAbility {
  return createMongoAbility<AppAbility>(defineWorkerRules());
}

export function defineAbilityFor(user: AbilityUser): AppAbility {
  return createMongoAbility<AppAbility>(defineRulesFor(user));
}

/** The rules in CASL's packed form, for `GET /api/auth/me`. */
export function packRulesFor(user: AbilityUser): PackedRules {
  return packRules(defineRulesFor(user));
}

/** The client's side of {@link packRulesFor}. */
export function abilityFromPackedRules(packed: PackedRules): AppAbility {
  return createMongoAbility<AppAbility>(unpackRules<AppRule>(packed));
}

function required(value: string | null, field: 'studyId' | 'siteId', user: AbilityUser): string {
  if (value === null || value === '') {
    throw new Error(
      `User ${user.id} has role ${user.role} but ${field} is ${JSON.stringify(value)}; a ${user.role} must have a ${field}`,
    );
  }
  return value;
}
