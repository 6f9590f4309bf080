import {
  abilityFromPackedRules,
  AbilityUser,
  Action,
  defineAbilityFor,
  packRulesFor,
  subject,
  SubjectName,
} from './permissions';
import { PARTICIPANT_CODE_PATTERN } from './study-model';

// Expected answers come from the role table of docs/user-guide.md ("Who does what") ("what they do" / "what they may not do").
const STUDY = 'study-1';
const OTHER_STUDY = 'study-2';
const SITE = 'site-a';
const OTHER_SITE = 'site-b';

const users: Record<AbilityUser['role'], AbilityUser> = {
  technician: { id: 'u-tech', role: 'technician', studyId: STUDY, siteId: SITE },
  analyst: { id: 'u-analyst', role: 'analyst', studyId: STUDY, siteId: null },
  monitor: { id: 'u-monitor', role: 'monitor', studyId: STUDY, siteId: null },
  coordinator: { id: 'u-coord', role: 'coordinator', studyId: STUDY, siteId: SITE },
  admin: { id: 'u-admin', role: 'admin', studyId: null, siteId: null },
};

const row = (type: SubjectName, fields: Record<string, string | null> = {}) =>
  subject(type, { studyId: STUDY, siteId: SITE, ...fields });

describe('type-level rules (may this role ever do this?)', () => {
  const cases: [AbilityUser['role'], Action, SubjectName, boolean][] = [
    ['technician', 'create', 'Visit', true],
    ['technician', 'upload', 'Recording', true],
    ['technician', 'read', 'Result', false],
    ['technician', 'read', 'Flag', false],
    ['technician', 'read', 'Report', false],
    ['technician', 'read', 'AuditEntry', false],
    ['analyst', 'update', 'AnalysisSettings', true],
    ['analyst', 'rerun', 'AnalysisRun', true],
    ['analyst', 'create', 'Flag', true],
    ['analyst', 'sign', 'Report', true],
    ['analyst', 'delete', 'Recording', false],
    ['analyst', 'update', 'AuditEntry', false],
    ['analyst', 'delete', 'AuditEntry', false],
    ['monitor', 'read', 'Result', true],
    ['monitor', 'read', 'AuditEntry', true],
    ['monitor', 'export', 'AuditEntry', true],
    ['monitor', 'update', 'Flag', false],
    ['monitor', 'create', 'Participant', false],
    ['monitor', 'sign', 'Report', false],
    ['coordinator', 'read', 'Report', true],
    ['coordinator', 'read', 'Result', false],
    ['coordinator', 'read', 'Flag', false],
    ['admin', 'create', 'Study', true],
    ['admin', 'invite', 'User', true],
    ['admin', 'update', 'User', true],
    ['admin', 'read', 'Outbox', true],
    ['admin', 'sign', 'Report', false],
    ['admin', 'create', 'Flag', false],
    ['admin', 'update', 'Flag', false],
  ];
  it.each(cases)('%s may %s %s: %s', (role, action, subjectName, expected) => {
    expect(defineAbilityFor(users[role]).can(action, subjectName)).toBe(expected);
  });

  it('no role but admin reads the mail outbox', () => {
    for (const role of ['technician', 'analyst', 'monitor', 'coordinator'] as const) {
      expect(defineAbilityFor(users[role]).can('read', 'Outbox')).toBe(false);
    }
  });

  it('nobody may change or remove audit entries', () => {
    for (const user of Object.values(users)) {
      const ability = defineAbilityFor(user);
      expect(ability.can('update', 'AuditEntry')).toBe(false);
      expect(ability.can('delete', 'AuditEntry')).toBe(false);
    }
  });
});

describe('row-level rules (this row, in or out of scope)', () => {
  it('a technician sees participants of their own site only', () => {
    const ability = defineAbilityFor(users.technician);
    expect(ability.can('read', row('Participant'))).toBe(true);
    expect(ability.can('read', row('Participant', { siteId: OTHER_SITE }))).toBe(false);
    expect(ability.can('read', row('Participant', { studyId: OTHER_STUDY }))).toBe(false);
  });

  it('an analyst sees every site of their study and no other study', () => {
    const ability = defineAbilityFor(users.analyst);
    expect(ability.can('read', row('Result', { siteId: OTHER_SITE }))).toBe(true);
    expect(ability.can('read', row('Result', { studyId: OTHER_STUDY }))).toBe(false);
  });

  it('a monitor reads audit entries of their study only', () => {
    const ability = defineAbilityFor(users.monitor);
    expect(ability.can('read', row('AuditEntry', { siteId: null }))).toBe(true);
    expect(ability.can('read', row('AuditEntry', { studyId: OTHER_STUDY }))).toBe(false);
  });

  it('a coordinator sees signed or sent reports of their own site, never drafts', () => {
    const ability = defineAbilityFor(users.coordinator);
    expect(ability.can('read', row('Report', { state: 'signed' }))).toBe(true);
    expect(ability.can('read', row('Report', { state: 'sent' }))).toBe(true);
    expect(ability.can('read', row('Report', { state: 'draft' }))).toBe(false);
    expect(ability.can('read', row('Report', { state: 'signed', siteId: OTHER_SITE }))).toBe(false);
  });

  it('study rows are matched on their own id', () => {
    const ability = defineAbilityFor(users.technician);
    expect(ability.can('read', subject('Study', { id: STUDY }))).toBe(true);
    expect(ability.can('read', subject('Study', { id: OTHER_STUDY }))).toBe(false);
  });

  it('an admin manages users of every study', () => {
    const ability = defineAbilityFor(users.admin);
    expect(ability.can('update', row('User', { studyId: OTHER_STUDY }))).toBe(true);
  });
});

describe('study-level work: reviews, worklist, schedule, groups, results export', () => {
  // From docs/user-guide.md: "Who does what", "Results exports" (analysts, monitors and admins),
  // "The worklist" and "Marking a visit reviewed" (analysts act, monitors follow read-only),
  // "Study set-up" (admins set up the schedule and groups; others read them).
  type Case = [AbilityUser['role'], Action, SubjectName, boolean];
  const roles = ['technician', 'analyst', 'monitor', 'coordinator', 'admin'] as const;
  const table = (
    action: Action,
    subjectName: SubjectName,
    allowed: readonly AbilityUser['role'][],
  ): Case[] => roles.map((role) => [role, action, subjectName, allowed.includes(role)]);
  const cases: Case[] = [
    ...table('create', 'VisitReview', ['analyst']),
    ...table('read', 'VisitReview', ['analyst', 'monitor']),
    ...table('update', 'VisitReview', []),
    ...table('delete', 'VisitReview', []),
    // The technician's worklist is their site's uploads; coordinators and admins have none.
    ...table('read', 'Worklist', ['technician', 'analyst', 'monitor']),
    ...table('read', 'PlannedVisit', roles),
    ...table('create', 'PlannedVisit', ['admin']),
    ...table('update', 'PlannedVisit', ['admin']),
    ...table('delete', 'PlannedVisit', ['admin']),
    ...table('read', 'StudyGroup', roles),
    ...table('create', 'StudyGroup', ['admin']),
    ...table('update', 'StudyGroup', ['admin']),
    ...table('delete', 'StudyGroup', ['admin']),
    ...table('export', 'Result', ['analyst', 'monitor', 'admin']),
  ];
  it.each(cases)('%s may %s %s: %s', (role, action, subjectName, expected) => {
    expect(defineAbilityFor(users[role]).can(action, subjectName)).toBe(expected);
  });

  it('an analyst marks reviewed, and a monitor reads, visits of their own study only', () => {
    const analyst = defineAbilityFor(users.analyst);
    expect(analyst.can('create', row('VisitReview', { siteId: OTHER_SITE }))).toBe(true);
    expect(analyst.can('create', row('VisitReview', { studyId: OTHER_STUDY }))).toBe(false);
    const monitor = defineAbilityFor(users.monitor);
    expect(monitor.can('read', row('VisitReview'))).toBe(true);
    expect(monitor.can('read', row('VisitReview', { studyId: OTHER_STUDY }))).toBe(false);
    expect(monitor.can('create', row('VisitReview'))).toBe(false);
  });

  it("a technician's worklist is their own site's; an analyst's is the whole study", () => {
    const technician = defineAbilityFor(users.technician);
    expect(technician.can('read', row('Worklist'))).toBe(true);
    expect(technician.can('read', row('Worklist', { siteId: OTHER_SITE }))).toBe(false);
    const analyst = defineAbilityFor(users.analyst);
    expect(analyst.can('read', row('Worklist', { siteId: OTHER_SITE }))).toBe(true);
    expect(analyst.can('read', row('Worklist', { studyId: OTHER_STUDY }))).toBe(false);
  });

  it("site roles read their study's schedule and groups, not another study's", () => {
    for (const role of ['technician', 'coordinator', 'analyst', 'monitor'] as const) {
      const ability = defineAbilityFor(users[role]);
      for (const name of ['PlannedVisit', 'StudyGroup'] as const) {
        // Schedule rows belong to the study, not a site.
        expect({ role, name, own: ability.can('read', row(name, { siteId: null })) }).toEqual({
          role,
          name,
          own: true,
        });
        expect({
          role,
          name,
          other: ability.can('read', row(name, { studyId: OTHER_STUDY, siteId: null })),
        }).toEqual({ role, name, other: false });
      }
    }
    const admin = defineAbilityFor(users.admin);
    expect(admin.can('update', row('PlannedVisit', { studyId: OTHER_STUDY }))).toBe(true);
  });

  it("exports the results of the caller's own study only (admins: any study)", () => {
    for (const role of ['analyst', 'monitor'] as const) {
      const ability = defineAbilityFor(users[role]);
      expect(ability.can('export', row('Result'))).toBe(true);
      expect(ability.can('export', row('Result', { studyId: OTHER_STUDY }))).toBe(false);
    }
    expect(
      defineAbilityFor(users.admin).can('export', row('Result', { studyId: OTHER_STUDY })),
    ).toBe(true);
  });
});

describe('rules for the client', () => {
  it('packed rules unpack to an ability that answers the same', () => {
    for (const user of Object.values(users)) {
      const server = defineAbilityFor(user);
      const client = abilityFromPackedRules(JSON.parse(JSON.stringify(packRulesFor(user))));
      for (const [action, subjectName] of [
        ['read', 'Result'],
        ['sign', 'Report'],
        ['create', 'Visit'],
        ['invite', 'User'],
      ] as const) {
        expect(client.can(action, subjectName)).toBe(server.can(action, subjectName));
      }
      expect(client.can('read', row('Participant', { siteId: OTHER_SITE }))).toBe(
        server.can('read', row('Participant', { siteId: OTHER_SITE })),
      );
    }
  });

  it('a site role without a site is refused with the field named', () => {
    expect(() => defineAbilityFor({ ...users.technician, siteId: null })).toThrow(/siteId/);
  });
});

describe('participant codes (PARTICIPANT_CODE_PATTERN: pseudonymous codes only, never a name)', () => {
  it.each(['AC-0042', 'A1-0001', 'X9Y', '123'])('accepts %s', (code) => {
    expect(PARTICIPANT_CODE_PATTERN.test(code)).toBe(true);
  });
  it.each([
    'JOHN-SMITH',
    'Maria',
    'ac-0042',
    'A--1',
    '-A1',
    'A1-',
    'A 1',
    'P1',
    'A'.repeat(23) + '12',
  ])('refuses %s', (code) => {
    expect(PARTICIPANT_CODE_PATTERN.test(code)).toBe(false);
  });
});
