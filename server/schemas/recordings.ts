// Imports zod only: the client imports these schemas too.
import { z } from 'zod';

/** What a channel measures, as the API takes it (the same words as workers/io/channel-setup.ts; a test holds them together). */
export const channelQuantities = ['acceleration', 'velocity', 'sound-pressure', 'voltage', 'speed', 'tacho', 'other'] as const;

const calibration = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('sensitivity'),
    sensitivityMvPerUnit: z.number().positive({ error: 'The sensitivity must be above 0.' }),
    inputRangeV: z.number().positive({ error: 'The input range must be above 0 V.' }),
  }),
  z.object({
    kind: z.literal('scale'),
    factor: z.number().refine((f) => f !== 0 && Number.isFinite(f), { error: 'The factor must be a number other than 0.' }),
  }),
]);

export const registeredChannel = z.object({
  index: z.number().int().min(0).max(63),
  name: z.string().trim().min(1).max(120),
  quantity: z.enum(channelQuantities),
  unit: z.string().trim().max(40),
  calibration,
});
export type RegisteredChannel = z.infer<typeof registeredChannel>;

export const registerRecordingBody = z.object({
  name: z.string({ error: 'Name the recording.' }).trim().min(1, { error: 'Name the recording.' }).max(191),
  fingerprint: z.string().regex(/^[0-9a-f]{64}$/, { error: 'A fingerprint is 64 hexadecimal digits.' }),
  format: z.enum(['wav', 'csv']),
  sampleRateHz: z.number().positive({ error: 'The sample rate must be above 0 Hz.' }).max(10_000_000),
  durationS: z.number().nonnegative(),
  channels: z.array(registeredChannel).min(1, { error: 'A recording has at least one channel.' }).max(64),
});
export type RegisterRecordingBody = z.infer<typeof registerRecordingBody>;

export interface RegisteredRecording {
  id: number;
  name: string;
  fingerprint: string;
  format: 'wav' | 'csv';
  sampleRateHz: number;
  durationS: number;
  channels: RegisteredChannel[];
  registeredBy: string | null;
  registeredAt: string;
  updatedAt: string;
}
