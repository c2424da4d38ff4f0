import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SnapshotHeader } from '../../../../workers/io/snapshot-format';
import { decodeSnapshot } from '../../../../workers/io/snapshot-codec';
import { api, ApiError } from '../../../lib/api-client';
import { viewKeys } from './keys';

export interface DecodedSnapshot {
  header: SnapshotHeader;
  /** width × height bytes, row 0 at the y axis's `from` end. */
  map: Uint8Array;
}

async function readSnapshot(path: string): Promise<DecodedSnapshot> {
  const decoded = decodeSnapshot(await api.getBytes(path));
  if (!decoded.ok) throw new ApiError(0, 'BAD_SNAPSHOT', `The snapshot cannot be read: ${decoded.message}`);
  return { header: decoded.header, map: decoded.map };
}

// A snapshot is replaced only from the Bench: no need to ask again while the page is open.
export const snapshotQuery = (viewId: number, enabled: boolean) =>
  queryOptions({
    queryKey: viewKeys.snapshot(viewId),
    queryFn: () => readSnapshot(`/views/${viewId}/snapshot`),
    enabled,
    staleTime: Infinity,
  });

export const useSnapshot = (viewId: number, enabled: boolean) => useQuery(snapshotQuery(viewId, enabled));

export const sharedSnapshotQuery = (token: string, enabled: boolean) =>
  queryOptions({
    queryKey: viewKeys.sharedSnapshot(token),
    queryFn: () => readSnapshot(`/shared/${token}/snapshot`),
    enabled,
    staleTime: Infinity,
  });

export const useSharedSnapshot = (token: string, enabled: boolean) => useQuery(sharedSnapshotQuery(token, enabled));
