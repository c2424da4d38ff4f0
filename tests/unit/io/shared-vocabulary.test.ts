/**
 * The API's schemas import only zod, and the pure code in workers/ imports nothing from the server, so
 * the few words both use are written twice; these checks keep the two copies the same.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { channelQuantities } from '../../../server/schemas/recordings';
import { TARGET_MAX_POINTS, canonicalTrackText, targetTrack } from '../../../server/schemas/targets';
import { axisKinds } from '../../../server/schemas/views';
import { quantities } from '../../../workers/io/channel-setup';
import { snapshotAxisKinds } from '../../../workers/io/snapshot-format';
import { MAX_TARGET_POINTS, parseTrackKey, trackKeyText } from '../../../workers/io/target-csv';

/** The pure code's verdict on a track: its one written form, or null. */
const pureTrack = (text: string) => {
  const key = parseTrackKey(text);
  return key ? trackKeyText(key) : null;
};

describe('the words the API and the pure code share', () => {
  it('names the same channel quantities', () => {
    expect([...channelQuantities]).toEqual([...quantities]);
  });
  it('names the same axis kinds in a view and in a snapshot file', () => {
    expect([...snapshotAxisKinds]).toEqual([...axisKinds]);
  });
  it('reads target tracks as the pure reader does (the same tracks accepted, written the same way)', () => {
    const samples = [
      'order:48', 'ORDER:48.50', ' order:0.5 ', 'order:1000', 'order:1000.01', 'order:0', 'order:0.0', 'order:-1', 'order:.5', 'order:5.',
      'order:1e2', 'order: 48', 'family:1:2', 'family:1:+2', 'family:01:-02', 'family:8:40', 'family:8:-40', 'family:9:0', 'family:0:1',
      'family:1:41', 'family:1:2.5', 'family:1', 'family:1:2:3', 'overall', 'OVERALL', ' overall', 'overall:A', 'band:1000', '', ' ',
    ];
    for (const text of samples) {
      expect(canonicalTrackText(text), text).toBe(pureTrack(text));
      const parsed = targetTrack.safeParse(text);
      expect(parsed.success ? parsed.data : null, text).toBe(pureTrack(text));
    }
    const piece = fc.constantFrom('order', 'family', 'overall', 'ORDER', ':', '+', '-', '.', ' ', '0', '1', '2', '4', '8', '9', '40', '41', '1000', '1001');
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 6 }), (pieces) => {
        const text = pieces.join('');
        expect(canonicalTrackText(text), text).toBe(pureTrack(text));
      }),
      { numRuns: 2000 },
    );
  });
  it('limits a target to the same number of points', () => {
    expect(TARGET_MAX_POINTS).toBe(MAX_TARGET_POINTS);
  });
});
