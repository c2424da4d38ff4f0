/**
 * People for API tests, made straight in the test database: a project with a lead, an engineer and a
 * viewer, plus outsiders (a guest, a staff non-member, an admin). All share one bcrypt hash, made once.
 */
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import supertest from 'supertest';
import type { Express } from 'express';
import { hashPassword } from '../../server/services/passwords';
import type { SiteRole } from '../../server/schemas/auth';
import type { ProjectRole } from '../../server/schemas/projects';

export const ACTOR_PASSWORD = 'matrix-password-1';
let sharedHash: Promise<string> | null = null;

export const uniqueEmail = (label: string) => `${label}-${randomUUID().slice(0, 8)}@fanlight.test`;

export async function makeUser(db: Knex, label: string, siteRole: SiteRole): Promise<{ id: number; email: string }> {
  sharedHash ??= hashPassword(ACTOR_PASSWORD);
  const email = uniqueEmail(label);
  const [id] = await db('users').insert({ email, name: `Test ${label}`, password_hash: await sharedHash, site_role: siteRole });
  return { id, email };
}

export async function makeProject(db: Knex, members: { id: number; role: ProjectRole }[]): Promise<number> {
  const [id] = await db('projects').insert({ name: `Matrix ${randomUUID().slice(0, 6)}`, description: '' });
  if (members.length) await db('project_members').insert(members.map((m) => ({ project_id: id, user_id: m.id, role: m.role })));
  return id;
}

export type Agent = ReturnType<typeof supertest.agent>;

/** A signed-in agent and its CSRF token; `send` adds the token header to state-changing requests. */
export interface Session {
  agent: Agent;
  csrf: string;
  request(method: string, path: string, body?: unknown): Promise<supertest.Response>;
}

export async function sessionFor(app: Express, email: string | null, password = ACTOR_PASSWORD): Promise<Session> {
  const agent = supertest.agent(app);
  if (email) await agent.post('/api/auth/signin').send({ email, password }).expect(200);
  const csrf = (await agent.get('/api/auth/csrf').expect(200)).body.token as string;
  return {
    agent,
    csrf,
    request(method, path, body) {
      const m = method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete';
      let req = agent[m](path);
      if (m !== 'get') req = req.set('X-CSRF-Token', csrf);
      return body === undefined ? req : req.send(body as object);
    },
  };
}

/** A project team for a feature's API tests: a lead, an engineer and a viewer of two projects, and an outsider. */
export interface ProjectTeam {
  projectId: number;
  /** A second project of the same members (a test may archive it) */
  archivedId: number;
  engineerId: number;
  lead: Session;
  engineer: Session;
  viewer: Session;
  outsider: Session;
}

export async function makeProjectTeam(db: Knex, app: Express, prefix: string): Promise<ProjectTeam> {
  const l = await makeUser(db, `${prefix}-lead`, 'staff');
  const e = await makeUser(db, `${prefix}-engineer`, 'staff');
  const v = await makeUser(db, `${prefix}-viewer`, 'guest');
  const o = await makeUser(db, `${prefix}-outsider`, 'staff');
  const members = [
    { id: l.id, role: 'lead' as const },
    { id: e.id, role: 'engineer' as const },
    { id: v.id, role: 'viewer' as const },
  ];
  const projectId = await makeProject(db, members);
  const archivedId = await makeProject(db, members);
  const [lead, engineer, viewer, outsider] = await Promise.all([l, e, v, o].map((u) => sessionFor(app, u.email)));
  return { projectId, archivedId, engineerId: e.id, lead, engineer, viewer, outsider };
}
