/**
 * Seeds the demo (idempotent: accounts and the project are looked up by their natural keys first, so a
 * second run changes nothing, and a demo user's changed password is left alone).
 */
import type { Knex } from 'knex';
import { hashPassword } from '../server/services/passwords';
import { seedDemoCampaign } from './demo-campaign';
import { seedDemoContent } from './demo-content';
import { DEMO_PASSWORD, demoAccounts, demoProject } from './demo-scenario';

export interface SeedReport {
  usersCreated: number;
  projectCreated: boolean;
  recordingsRegistered: number;
  viewCreated: boolean;
  comparisonCreated: boolean;
  campaignCreated: boolean;
}

/** `demoDir`: where the demo recordings are (written there if missing); with it the project gets its content. */
export async function seedDemo(db: Knex, { demoDir }: { demoDir?: string } = {}): Promise<SeedReport> {
  let usersCreated = 0;
  const ids = new Map<string, number>();
  for (const account of demoAccounts) {
    const existing = await db('users').where({ email: account.email }).first('id');
    if (existing) {
      ids.set(account.email, existing.id);
      continue;
    }
    const [id] = await db('users').insert({
      email: account.email,
      name: account.name,
      password_hash: await hashPassword(DEMO_PASSWORD),
      site_role: account.siteRole,
    });
    ids.set(account.email, id);
    usersCreated++;
  }

  const lead = demoAccounts.find((a) => a.projectRole === 'lead')!;
  let project = await db('projects').where({ name: demoProject.name }).first('id');
  const projectCreated = !project;
  if (!project) {
    await db.transaction(async (trx) => {
      const [id] = await trx('projects').insert({ ...demoProject, created_by: ids.get(lead.email) });
      project = { id };
      await trx('project_members').insert(
        demoAccounts
          .filter((a) => a.projectRole)
          .map((a) => ({ project_id: id, user_id: ids.get(a.email), role: a.projectRole })),
      );
      await trx('activity').insert({
        project_id: id,
        actor_id: ids.get(lead.email),
        verb: 'created',
        object_type: 'project',
        object_id: String(id),
        summary: `created the project ${demoProject.name}`,
      });
    });
  }
  const content = demoDir ? await seedDemoContent(db, demoDir) : { recordingsRegistered: 0, viewCreated: false, comparisonCreated: false };
  const engineer = demoAccounts.find((a) => a.projectRole === 'engineer')!;
  const campaignCreated = await seedDemoCampaign(db, project!.id, ids.get(engineer.email)!);
  return { usersCreated, projectCreated, ...content, campaignCreated };
}
