/**
 * The API's schemas import only zod, and the pure code in workers/ imports nothing from the server, so
 * the few words both use are written twice; these checks keep the two copies the same.
 */
import { describe, expect, it } from 'vitest';
import { channelQuantities } from '../../../server/schemas/recordings';
import { axisKinds } from '../../../server/schemas/views';
import { quantities } from '../../../workers/io/channel-setup';
import { snapshotAxisKinds } from '../../../workers/io/snapshot-format';

describe('the words the API and the pure code share', () => {
  it('names the same channel quantities', () => {
    expect([...channelQuantities]).toEqual([...quantities]);
  });
  it('names the same axis kinds in a view and in a snapshot file', () => {
    expect([...snapshotAxisKinds]).toEqual([...axisKinds]);
  });
});
