/**
 * Knex migrations listed by import rather than found on disk: knex's directory loader cannot load .ts
 * files under vitest, so every migration in migrations/ is named here (a unit test checks none is missing).
 */
import type { Knex } from 'knex';
import * as createUsers from '../../migrations/20261201000100_create_users';
import * as createSessions from '../../migrations/20261201000200_create_sessions';
import * as createProjects from '../../migrations/20261201000300_create_projects';
import * as createProjectMembers from '../../migrations/20261201000400_create_project_members';
import * as createInvitations from '../../migrations/20261201000500_create_invitations';
import * as createPasswordResets from '../../migrations/20261201000600_create_password_resets';
import * as createActivity from '../../migrations/20261201000700_create_activity';
import * as createRecordings from '../../migrations/20261201000800_create_recordings';
import * as createViews from '../../migrations/20261201000900_create_views';

interface NamedMigration {
  name: string;
  module: Knex.Migration;
}

export const migrations: NamedMigration[] = [
  { name: '20261201000100_create_users', module: createUsers },
  { name: '20261201000200_create_sessions', module: createSessions },
  { name: '20261201000300_create_projects', module: createProjects },
  { name: '20261201000400_create_project_members', module: createProjectMembers },
  { name: '20261201000500_create_invitations', module: createInvitations },
  { name: '20261201000600_create_password_resets', module: createPasswordResets },
  { name: '20261201000700_create_activity', module: createActivity },
  { name: '20261201000800_create_recordings', module: createRecordings },
  { name: '20261201000900_create_views', module: createViews },
];

export const migrationSource: Knex.MigrationSource<NamedMigration> = {
  getMigrations: async () => migrations,
  getMigrationName: (m) => m.name,
  getMigration: async (m) => m.module,
};
