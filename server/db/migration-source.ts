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
import * as addViewsArchivedAt from '../../migrations/20261201001000_add_views_archived_at';
import * as createViewSnapshots from '../../migrations/20261201001100_create_view_snapshots';
import * as createMarks from '../../migrations/20261201001200_create_marks';
import * as createShareLinks from '../../migrations/20261201001300_create_share_links';
import * as createComments from '../../migrations/20261201001400_create_comments';
import * as createNotificationSettings from '../../migrations/20261201001500_create_notification_settings';
import * as createIdempotencyKeys from '../../migrations/20261205000100_create_idempotency_keys';
import * as createTargets from '../../migrations/20261205000200_create_targets';
import * as createApiTokens from '../../migrations/20261205000300_create_api_tokens';
import * as createCampaigns from '../../migrations/20261205000400_create_campaigns';

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
  { name: '20261201001000_add_views_archived_at', module: addViewsArchivedAt },
  { name: '20261201001100_create_view_snapshots', module: createViewSnapshots },
  { name: '20261201001200_create_marks', module: createMarks },
  { name: '20261201001300_create_share_links', module: createShareLinks },
  { name: '20261201001400_create_comments', module: createComments },
  { name: '20261201001500_create_notification_settings', module: createNotificationSettings },
  { name: '20261205000100_create_idempotency_keys', module: createIdempotencyKeys },
  { name: '20261205000200_create_targets', module: createTargets },
  { name: '20261205000300_create_api_tokens', module: createApiTokens },
  { name: '20261205000400_create_campaigns', module: createCampaigns },
];

export const migrationSource: Knex.MigrationSource<NamedMigration> = {
  getMigrations: async () => migrations,
  getMigrationName: (m) => m.name,
  getMigration: async (m) => m.module,
};
