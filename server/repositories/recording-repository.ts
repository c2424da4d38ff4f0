import type { Knex } from 'knex';
import type { RegisterRecordingBody, RegisteredChannel, RegisteredRecording } from '../schemas/recordings';

interface RecordingRow {
  id: number;
  name: string;
  fingerprint: string;
  sample_rate_hz: number;
  duration_s: number;
  channels: string | { format: 'wav' | 'csv'; list: RegisteredChannel[] };
  registered_by_name: string | null;
  created_at: Date;
  updated_at: Date;
}

const parseJson = <T>(v: string | T): T => (typeof v === 'string' ? (JSON.parse(v) as T) : v);

const fromRow = (r: RecordingRow): RegisteredRecording => {
  const channels = parseJson(r.channels);
  return {
    id: r.id,
    name: r.name,
    fingerprint: r.fingerprint,
    format: channels.format,
    sampleRateHz: Number(r.sample_rate_hz),
    durationS: Number(r.duration_s),
    channels: channels.list,
    registeredBy: r.registered_by_name,
    registeredAt: new Date(r.created_at).toISOString(),
    updatedAt: new Date(r.updated_at).toISOString(),
  };
};

export class RecordingRepository {
  constructor(private readonly db: Knex) {}

  private select() {
    return this.db('recordings as r')
      .leftJoin('users as u', 'u.id', 'r.registered_by')
      .select('r.id', 'r.name', 'r.fingerprint', 'r.sample_rate_hz', 'r.duration_s', 'r.channels', 'u.name as registered_by_name', 'r.created_at', 'r.updated_at');
  }

  async list(projectId: number): Promise<RegisteredRecording[]> {
    return (await this.select().where('r.project_id', projectId).orderBy('r.created_at', 'desc')).map(fromRow);
  }

  async find(projectId: number, fingerprint: string): Promise<RegisteredRecording | null> {
    const row = await this.select().where({ 'r.project_id': projectId, 'r.fingerprint': fingerprint }).first();
    return row ? fromRow(row) : null;
  }

  /** Registers the metadata, or updates it when the same recording (fingerprint) is already there. */
  async upsert(projectId: number, userId: number, r: RegisterRecordingBody): Promise<'created' | 'updated'> {
    const row = {
      project_id: projectId,
      fingerprint: r.fingerprint,
      name: r.name,
      sample_rate_hz: r.sampleRateHz,
      duration_s: r.durationS,
      // the channel list and the format travel together in one JSON column
      channels: JSON.stringify({ format: r.format, list: r.channels }),
      registered_by: userId,
    };
    const existing = await this.db('recordings').where({ project_id: projectId, fingerprint: r.fingerprint }).first('id');
    if (existing) {
      const { registered_by: _by, ...changes } = row;
      await this.db('recordings')
        .where({ id: existing.id })
        .update({ ...changes, version: this.db.raw('version + 1'), updated_at: this.db.fn.now() });
      return 'updated';
    }
    await this.db('recordings').insert(row);
    return 'created';
  }
}
