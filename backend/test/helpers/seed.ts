import { randomUUID } from 'node:crypto';
import { hash } from 'bcryptjs';
import { DataSource } from 'typeorm';
import type { Role } from '@gyre/shared';
import { Participant } from '../../src/participants/participant.entity';
import { Site } from '../../src/sites/site.entity';
import { Study } from '../../src/studies/study.entity';
import { User } from '../../src/accounts/user.entity';
import { Visit } from '../../src/visits/visit.entity';
import { newUserRow } from '../../src/users/new-user-row';
import { seededParticipantVisit } from '../../src/robustness/seeded-visit';

/** The password of every seeded account (generated test data; passes the password policy). */
export const SEED_PASSWORD = 'amber-slate-42-rhythm';

/** Seeded accounts, by key. Study A has sites A1 and A2; study B has site B1. */
export const SEED_USERS = {
  admin: { role: 'admin', study: null, site: null },
  technician: { role: 'technician', study: 'A', site: 'A1' },
  technicianA2: { role: 'technician', study: 'A', site: 'A2' },
  analyst: { role: 'analyst', study: 'A', site: null },
  monitor: { role: 'monitor', study: 'A', site: null },
  coordinator: { role: 'coordinator', study: 'A', site: 'A1' },
  coordinatorA2: { role: 'coordinator', study: 'A', site: 'A2' },
  technicianB: { role: 'technician', study: 'B', site: 'B1' },
  analystB: { role: 'analyst', study: 'B', site: null },
  monitorB: { role: 'monitor', study: 'B', site: null },
  coordinatorB: { role: 'coordinator', study: 'B', site: 'B1' },
} as const satisfies Record<string, { role: Role; study: 'A' | 'B' | null; site: SiteKey | null }>;

export type UserKey = keyof typeof SEED_USERS;
export type SiteKey = 'A1' | 'A2' | 'B1';

export interface SeededUser {
  id: string;
  email: string;
  role: Role;
  studyId: string | null;
  siteId: string | null;
}

export interface Seed {
  studies: Record<'A' | 'B', Study>;
  sites: Record<SiteKey, Site>;
  users: Record<UserKey, SeededUser>;
  /** One participant per site, code `<site>-0001`, each with one visit `V1`. */
  participants: Record<SiteKey, Participant>;
  visits: Record<SiteKey, Visit>;
}

/**
 * Writes the seed straight into the database (not through the API, so that it leaves no
 * audit entries and the tests start from an empty trail). Generated test data.
 */
export async function seedDatabase(dataSource: DataSource): Promise<Seed> {
  const at = new Date().toISOString();
  const stamp = { createdAt: at, updatedAt: at };
  // The trend settings' defaults (columns added by VisitScheduleAndGroups1764700300000).
  const trend = { trendMinVisits: 3, trendMinSpanDays: 90, blindedReview: false };
  const studies = {
    A: {
      id: randomUUID(),
      code: 'ALPHA',
      name: 'Study A (ageing cohort)',
      description: '',
      ...trend,
      ...stamp,
    },
    B: {
      id: randomUUID(),
      code: 'BETA',
      name: 'Study B (drug trial)',
      description: '',
      ...trend,
      ...stamp,
    },
  };
  const sites: Record<SiteKey, Site> = {
    A1: { id: randomUUID(), studyId: studies.A.id, code: 'NORTH', name: 'Site A1', ...stamp },
    A2: { id: randomUUID(), studyId: studies.A.id, code: 'SOUTH', name: 'Site A2', ...stamp },
    B1: { id: randomUUID(), studyId: studies.B.id, code: 'EAST', name: 'Site B1', ...stamp },
  };
  const passwordHash = await hash(SEED_PASSWORD, 10);
  const users = {} as Record<UserKey, SeededUser>;
  const rows: User[] = [];
  for (const [key, spec] of Object.entries(SEED_USERS) as [
    UserKey,
    (typeof SEED_USERS)[UserKey],
  ][]) {
    const user = newUserRow(
      {
        email: `${key.toLowerCase()}@gyre.test`,
        name: `Seeded ${key}`,
        role: spec.role,
        studyId: spec.study === null ? null : studies[spec.study].id,
        siteId: spec.site === null ? null : sites[spec.site].id,
      },
      passwordHash,
      at,
    );
    rows.push(user);
    users[key] = {
      id: user.id,
      email: user.email,
      role: user.role,
      studyId: user.studyId,
      siteId: user.siteId,
    };
  }
  const participants = {} as Record<SiteKey, Participant>;
  const visits = {} as Record<SiteKey, Visit>;
  for (const key of Object.keys(sites) as SiteKey[]) {
    const { participant, visit } = seededParticipantVisit(sites[key], `${key}-0001`, stamp);
    participants[key] = participant;
    visits[key] = visit;
  }
  await dataSource.transaction(async (manager) => {
    // Only the columns every schema version has, so that migration tests can seed a
    // database written by an older version; later columns keep their defaults.
    // updateEntity(false): TypeORM would read defaulted columns back and merge them into
    // `values` by position, which SQLite does not keep (study A came back as study B).
    const insert = <T extends object>(entity: new () => T, columns: string[], values: T[]) =>
      manager
        .createQueryBuilder()
        .insert()
        .into(entity, columns)
        .values(values)
        .updateEntity(false)
        .execute();
    const base = ['id', 'createdAt', 'updatedAt'];
    await insert(Study, [...base, 'code', 'name', 'description'], Object.values(studies));
    await manager.insert(Site, Object.values(sites));
    await manager.insert(User, rows);
    await insert(Participant, [...base, 'studyId', 'siteId', 'code'], Object.values(participants));
    await insert(
      Visit,
      [...base, 'participantId', 'studyId', 'siteId', 'label', 'visitDate'],
      Object.values(visits),
    );
  });
  return { studies, sites, users, participants, visits };
}
