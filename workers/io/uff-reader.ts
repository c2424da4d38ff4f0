/**
 * Reads Universal File Format files (.uff, .unv): the datasets 58 (ASCII) and 58b (binary data after
 * ASCII records) that hold time responses (function type 1) become channels; other datasets are
 * skipped. Follows the public description of UFF dataset 58: the "    -1" delimiter lines, records 1-5
 * (ID lines), record 6 (function type, response node and direction), record 7 (ordinate data type,
 * value count, even spacing, abscissa minimum and increment), records 8-11 (data characteristics: the
 * ordinate's unit label in record 9, columns 48-67) and record 12 (the values: 6E13.5 for single,
 * 4E20.12 for double precision; in 58b raw IEEE 754 values in the byte order the header line gives).
 *
 * Why our own reader: no maintained npm package reads UFF in the browser and in Node; the layout is
 * a few fixed records of text.
 *
 * The abscissa increment is printed with about six digits (E13.5), so 1/dx is not the rate exactly:
 * rateFromIncrement takes the "round" rate the printed digits stand for (see there).
 */
import { assembleRecording, type NamedArray } from './acquisition';
import type { ByteSource } from './byte-source';
import type { DecodedRecording } from './recording';
import { RecordingError } from './recording-error';

/** A UFF file starts with a delimiter line "    -1" (blank lines and spaces aside). */
export function looksLikeUff(head: Uint8Array): boolean {
  const text = String.fromCharCode(...head.subarray(0, 64));
  return /^\s*-1[ \t]*\r?\n\s*\d+/.test(text);
}

/**
 * The sample rate a printed abscissa increment stands for. Every rate whose increment prints as
 * `text` (within one unit of its last digit) is a candidate; the roundest wins, in this order:
 * 100·2^n Hz (51200, 25600 …), 2^n Hz (8192 …), k·1000, k·100, k·10, k Hz. With no candidate, 1/dx.
 */
export function rateFromIncrement(text: string): number {
  const t = text.trim().replace(/[dD]/, 'E');
  const dx = Number(t);
  const m = /^[+-]?\d*\.?(\d*)(?:[eE]([+-]?\d+))?$/.exec(t);
  if (!m || !(dx > 0)) return NaN;
  const unit = 10 ** ((m[2] ? Number(m[2]) : 0) - m[1].length);
  const raw = 1 / dx;
  const lo = 1 / (dx + unit);
  const hi = dx - unit > 0 ? 1 / (dx - unit) : Infinity;
  const nearest = (list: number[]) => list.filter((r) => r >= lo && r <= hi).sort((a, b) => Math.abs(a - raw) - Math.abs(b - raw))[0];
  const powers = Array.from({ length: 40 }, (_, i) => 2 ** (i - 8));
  const found = nearest(powers.map((p) => 100 * p)) ?? nearest(powers.filter((p) => p >= 1));
  if (found !== undefined) return found;
  for (const step of [1000, 100, 10, 1]) {
    if (!Number.isFinite(hi) || hi - lo > 1e9 * step) break;
    const list: number[] = [];
    for (let k = Math.ceil(lo / step); k * step <= hi; k++) list.push(k * step);
    const r = nearest(list);
    if (r !== undefined) return r;
  }
  return raw;
}

class Lines {
  pos = 0;
  line = 0;
  constructor(readonly bytes: Uint8Array) {}
  get done() {
    return this.pos >= this.bytes.byteLength;
  }
  next(): string | null {
    if (this.done) return null;
    let end = this.bytes.indexOf(0x0a, this.pos);
    if (end < 0) end = this.bytes.byteLength;
    let s = '';
    for (let i = this.pos; i < end; i += 8192) s += String.fromCharCode(...this.bytes.subarray(i, Math.min(end, i + 8192)));
    this.pos = end + 1;
    this.line++;
    return s.replace(/\r$/, '');
  }
}

const DIRECTIONS: Record<number, string> = { 1: '+X', 2: '+Y', 3: '+Z', [-1]: '-X', [-2]: '-Y', [-3]: '-Z' };

interface Series {
  id: string[];
  node: number;
  direction: number;
  unit: string | null;
  dxText: string;
  values: Float64Array;
}

export interface UffOptions {
  channels?: number[];
  onProgress?: (fraction: number) => void;
  isCancelled?: () => boolean;
}

export async function readUff(source: ByteSource, options: UffOptions = {}): Promise<DecodedRecording> {
  const file = source.name;
  if (source.size === 0) throw new RecordingError('EMPTY_FILE', `${file} is empty (0 bytes).`);
  const lines = new Lines(await source.read(0, source.size));
  const series: Series[] = [];
  const skipped = new Map<string, number>();
  const cut = (what: string) => new RecordingError('TRUNCATED_FILE', `${file} is cut short: ${what}.`);

  while (!lines.done) {
    if (options.isCancelled?.()) throw new RecordingError('CANCELLED', `Reading ${file} was stopped.`);
    const delimiter = lines.next()!;
    if (delimiter.trim() === '') continue;
    if (delimiter.trim() !== '-1') {
      throw new RecordingError('BAD_STRUCTURE', `${file}, line ${lines.line}: a dataset must start with a "-1" line, not "${delimiter.trim().slice(0, 40)}".`);
    }
    const typeLine = lines.next();
    if (typeLine === null) break;
    const startLine = lines.line;
    const kind = typeLine.slice(0, 7).trim();
    if (kind !== '58' && kind !== '58b') {
      // another dataset (units, header …): skip to its closing delimiter
      let l: string | null;
      do l = lines.next();
      while (l !== null && l.trim() !== '-1');
      if (l === null) throw cut(`dataset ${kind} at line ${startLine} has no closing "-1" line`);
      skipped.set(kind, (skipped.get(kind) ?? 0) + 1);
      continue;
    }
    const where = `dataset 58 at line ${startLine}`;
    const records: string[] = [];
    for (let i = 0; i < 11; i++) {
      const l = lines.next();
      if (l === null) throw cut(`${where} ends after record ${i}`);
      records.push(l.padEnd(80));
    }
    const functionType = Number(records[5].slice(0, 5));
    const node = Number(records[5].slice(31, 41)) || 0;
    const direction = Number(records[5].slice(41, 45)) || 0;
    const ordinateType = Number(records[6].slice(0, 10));
    const count = Number(records[6].slice(10, 20));
    const even = Number(records[6].slice(20, 30));
    const dxText = records[6].slice(43, 56);
    if (!Number.isInteger(count) || count < 0 || ![2, 4, 5, 6].includes(ordinateType)) {
      throw new RecordingError('BAD_STRUCTURE', `${file}, line ${startLine + 7}: record 7 of ${where} is not "type, count, spacing, min, increment" ("${records[6].trim().slice(0, 60)}").`);
    }
    const complex = ordinateType === 5 || ordinateType === 6;
    const perValue = complex ? 2 : 1;
    const values = new Float64Array(count * perValue);
    if (kind === '58b') {
      const byteOrder = Number(typeLine.slice(7, 13));
      const floatFormat = Number(typeLine.slice(13, 19));
      const binaryBytes = Number(typeLine.slice(31, 43));
      if (floatFormat !== 2) throw new RecordingError('BAD_STRUCTURE', `${file}, line ${startLine}: ${where} has floating-point format ${floatFormat}; only IEEE 754 (2) is read.`);
      const size = ordinateType === 2 || ordinateType === 5 ? 4 : 8;
      const need = count * perValue * size;
      if (lines.pos + need > lines.bytes.byteLength) throw cut(`${where} needs ${need} bytes of binary data but ${lines.bytes.byteLength - lines.pos} follow`);
      const view = new DataView(lines.bytes.buffer, lines.bytes.byteOffset + lines.pos, need);
      const le = byteOrder !== 2;
      for (let i = 0; i < values.length; i++) values[i] = size === 4 ? view.getFloat32(i * 4, le) : view.getFloat64(i * 8, le);
      lines.pos += Math.max(need, binaryBytes || 0);
      let l: string | null;
      do l = lines.next();
      while (l !== null && l.trim() === '');
      if (l === null || l.trim() !== '-1') throw cut(`${where} has no closing "-1" line after its binary data`);
    } else {
      let n = 0;
      for (;;) {
        const l = lines.next();
        if (l === null) throw cut(`${where} ends after ${Math.floor(n / perValue)} of its ${count} values`);
        if (l.trim() === '-1') break;
        for (const token of l.trim().split(/\s+/)) {
          if (token === '') continue;
          const v = Number(token.replace(/[dD]/, 'E'));
          if (!Number.isFinite(v) && !/^[+-]?(nan|inf)/i.test(token)) {
            throw new RecordingError('NOT_NUMERIC', `${file}, line ${lines.line}: "${token.slice(0, 20)}" in the data of ${where} is not a number.`);
          }
          if (n < values.length) values[n] = v;
          n++;
        }
      }
      if (n < values.length) throw cut(`${where} holds ${Math.floor(n / perValue)} of its ${count} values`);
    }
    options.onProgress?.(lines.pos / lines.bytes.byteLength);
    if (functionType !== 1 || complex || even !== 1) {
      const why = functionType !== 1 ? `function type ${functionType}` : complex ? 'complex' : 'uneven abscissa';
      skipped.set(`58 (${why})`, (skipped.get(`58 (${why})`) ?? 0) + 1);
      continue;
    }
    const label = records[8].slice(47, 67).trim();
    series.push({
      id: records.slice(0, 5).map((r) => r.trim()),
      node,
      direction,
      unit: label && label.toUpperCase() !== 'NONE' ? label : null,
      dxText,
      values,
    });
  }

  if (!series.length) throw new RecordingError('NOT_NUMERIC', `${file} has no time response (UFF dataset 58 of function type 1) to read as channels.`);
  const rates = series.map((s) => rateFromIncrement(s.dxText));
  const bad = rates.findIndex((r) => !(r > 0));
  if (bad >= 0) throw new RecordingError('NO_SAMPLE_RATE', `${file}: channel ${bad + 1} has no usable abscissa increment ("${series[bad].dxText.trim()}").`);
  const other = rates.findIndex((r) => Math.abs(r - rates[0]) > 1e-6 * rates[0]);
  if (other >= 0) {
    throw new RecordingError('UNEQUAL_LENGTHS', `${file}: the channels have different sample rates (${rates[0]} Hz and ${rates[other]} Hz for channel ${other + 1}); all must have the same.`);
  }
  const names = series.map((s, i) => s.id.find((l) => l && l.toUpperCase() !== 'NONE') ?? `ch${i + 1}`);
  const arrays: NamedArray[] = series.map((s, i) => {
    const repeated = names.filter((n) => n === names[i]).length > 1;
    const name = repeated ? `${names[i]} ${s.node}${DIRECTIONS[s.direction] ?? ''}` : names[i];
    return { name, rows: s.values.length, cols: 1, data: s.values, unit: s.unit };
  });
  const warnings = skipped.size ? [`Not read as channels: ${[...skipped].map(([k, n]) => `${n} dataset${n > 1 ? 's' : ''} ${k}`).join(', ')}.`] : [];
  return assembleRecording(
    {
      format: 'uff',
      fileName: file,
      sizeBytes: source.size,
      // a lone value per channel is a channel here, never a rate
      arrays: arrays.map((a) => (a.rows === 1 ? { ...a, rows: 1, cols: 1 } : a)),
      sampleRateHz: rates[0],
      warnings,
      noRateHint: 'its records 7 carry no abscissa increment.',
    },
    options.channels,
  );
}
