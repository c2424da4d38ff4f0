import type { Knex } from 'knex';
import { ActivityRepository } from '../repositories/activity-repository';
import { RecordingRepository } from '../repositories/recording-repository';
import type { PublicUser } from '../schemas/auth';
import type { RegisterRecordingBody, RegisteredRecording } from '../schemas/recordings';
import { ProjectPolicy } from './project-policy';

/** Recording metadata registered with a project: engineers and leads register, every member reads. */
export class RecordingService {
  private readonly recordings: RecordingRepository;
  private readonly activity: ActivityRepository;
  private readonly policy: ProjectPolicy;

  constructor(db: Knex) {
    this.recordings = new RecordingRepository(db);
    this.activity = new ActivityRepository(db);
    this.policy = new ProjectPolicy(db);
  }

  async list(user: PublicUser, projectId: number): Promise<RegisteredRecording[]> {
    await this.policy.require(projectId, user.id, 'viewer');
    return this.recordings.list(projectId);
  }

  async register(
    user: PublicUser,
    projectId: number,
    body: RegisterRecordingBody,
  ): Promise<{ recording: RegisteredRecording; created: boolean }> {
    await this.policy.requireWritable(projectId, user.id, 'engineer');
    const outcome = await this.recordings.upsert(projectId, user.id, body);
    await this.activity.add({
      projectId,
      actorId: user.id,
      verb: outcome === 'created' ? 'registered' : 'updated',
      objectType: 'recording',
      objectId: body.fingerprint.slice(0, 16),
      summary: `${outcome === 'created' ? 'registered' : 'updated'} the recording ${body.name}`,
    });
    return { recording: (await this.recordings.find(projectId, body.fingerprint))!, created: outcome === 'created' };
  }
}
