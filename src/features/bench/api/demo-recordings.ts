import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ChannelSetup, Quantity } from '../../../../workers/io/channel-setup';
import { api, ApiError } from '../../../lib/api-client';

export interface DemoRecording {
  file: string;
  title: string;
  description: string;
  sizeBytes: number;
  /** How each channel was recorded, so the Bench can set the channels up on opening */
  channels: { name: string; quantity: Quantity; unit: string; factor: number }[];
  /** The demo recording this one is the changed run of */
  comparesWith?: string;
}

/** The channel setup the demo file was made with (names, quantities, units, full-scale factors). */
export const demoSetup = (r: DemoRecording): ChannelSetup[] =>
  r.channels.map((c, index) => ({ index, name: c.name, quantity: c.quantity, unit: c.unit, calibration: { kind: 'scale', factor: c.factor } }));

/** The demo recordings the server offers; null where it offers none (the route answers 404). */
export const demoRecordingsQuery = queryOptions({
  queryKey: ['demo-recordings'],
  queryFn: async (): Promise<DemoRecording[] | null> => {
    try {
      return (await api.get<{ recordings: DemoRecording[] }>('/demo-recordings')).recordings;
    } catch (e) {
      if (e instanceof ApiError && e.status === 404) return null;
      throw e;
    }
  },
  staleTime: 5 * 60_000,
  retry: false,
});

export const useDemoRecordings = () => useQuery(demoRecordingsQuery);

/** The file of a demo recording, as a Blob to read like a dropped file. */
export async function fetchDemoRecording(file: string): Promise<Blob> {
  let response: Response;
  try {
    response = await fetch(`/demo-recordings/${encodeURIComponent(file)}`, { credentials: 'same-origin' });
  } catch {
    throw new Error('The server cannot be reached. Check that Fanlight is running.');
  }
  if (!response.ok) throw new Error(`The demo recording could not be fetched (the server answered ${response.status}).`);
  return response.blob();
}
