import { afterAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../../seeds/index';
import { openTestDb } from '../support/test-db';

describe('demo seed', () => {
  const db = openTestDb();
  afterAll(() => db.destroy());

  it('changes nothing when it runs a second time', async () => {
    const count = async () => ({
      users: (await db('users').count({ n: '*' }))[0].n,
      projects: (await db('projects').count({ n: '*' }))[0].n,
      members: (await db('project_members').count({ n: '*' }))[0].n,
      hashes: (await db('users').orderBy('id').pluck('password_hash')).join(','),
    });
    const before = await count();
    expect(await seedDemo(db)).toEqual({ usersCreated: 0, projectCreated: false });
    expect(await count()).toEqual(before);
  });
});
