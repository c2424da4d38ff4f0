/**
 * The project stores a result's inverter object up to 256 kB of JSON. A long recording's tracks are
 * longer: its copy for the project keeps every k-th point of each track (k as small as fits; the first
 * and last points always), and says k as `thinnedBy`. Findings computed on the whole (carrier shifts,
 * spread, pole pairs, strongestFamilies with their peaks) are kept as they are; RESULTS.jsonl keeps all.
 */

/** The project's limit (server/schemas/campaigns.ts) less room for the rest of the post. */
export const PROJECT_INVERTER_MAX_BYTES = 250 * 1024;

const byteLength = (v: unknown) => Buffer.byteLength(JSON.stringify(v));

/**
 * A track: an object whose array fields (at least two) all have one length and hold numbers, booleans or
 * nulls, e.g. {rpm, hz, rms, crossing}; lists of objects (shifts, families) are not tracks themselves.
 */
function trackLength(o: Record<string, unknown>): number | null {
  const arrays = Object.values(o).filter(Array.isArray);
  const plain = arrays.every((a) => a.every((v) => v === null || typeof v !== 'object'));
  const lengths = arrays.map((a) => a.length);
  return plain && lengths.length >= 2 && lengths.every((n) => n === lengths[0]) ? lengths[0] : null;
}

/** Every k-th point of each track (and the last), the rest as it is. */
export function thinTracks(value: unknown, k: number): unknown {
  if (Array.isArray(value)) return value.map((v) => thinTracks(v, k));
  if (typeof value !== 'object' || value === null) return value;
  const o = value as Record<string, unknown>;
  const n = trackLength(o);
  const keep = (i: number) => i % k === 0 || i === (n ?? 0) - 1;
  return Object.fromEntries(
    Object.entries(o).map(([key, v]) => [key, n !== null && Array.isArray(v) ? v.filter((_, i) => keep(i)) : thinTracks(v, k)]),
  );
}

export function fitInverter(inverter: unknown, maxBytes = PROJECT_INVERTER_MAX_BYTES): unknown {
  if (byteLength(inverter) <= maxBytes) return inverter;
  for (let k = 2; k <= 1024; k++) {
    const thinned = { ...(thinTracks(inverter, k) as Record<string, unknown>), thinnedBy: k };
    if (byteLength(thinned) <= maxBytes) return thinned;
  }
  return null;
}
