/**
 * Reads a CSV/TSV export (comma, semicolon or tab; decimal point or comma; a header row whose cells may
 * carry units like "mic [Pa]" or "acc (m/s^2)"; a time column or a given sample rate) into one
 * Float32Array per channel. The file is read in slices and each batch of whole lines goes through
 * papaparse, so a big export never sits in memory as text.
 *
 * Limitation: a quoted cell that contains a line break is not supported (numeric exports have none).
 */
import Papa from 'papaparse';
import type { ByteSource } from './byte-source';
import type { ChannelInfo, CsvOptions, DecodedRecording, NonFiniteReport, ProgressCallback } from './recording';
import { RecordingError } from './recording-error';

const SLICE_BYTES = 4 * 1024 * 1024;
const TIME_NAMES = /^(time|t|zeit|sec|secs|seconds|s)$/i;
const NON_FINITE = /^[+-]?(nan|inf|infinity)$/i;
const DEFAULT_TOLERANCE = 1e-3;

interface Column {
  name: string;
  unit: string | null;
}

/** "acc (m/s^2)" → {name:"acc", unit:"m/s^2"}; "mic [Pa]" → {name:"mic", unit:"Pa"}. */
export function parseHeaderCell(cell: string, index: number): Column {
  const text = cell.trim().replace(/^"|"$/g, '');
  const m = /^(.*?)\s*[[(]\s*([^\])]*)\s*[\])]\s*$/.exec(text);
  if (m && m[1]) return { name: m[1].trim(), unit: m[2].trim() || null };
  return { name: text || `ch${index + 1}`, unit: null };
}

function detectDelimiter(lines: string[]): ',' | ';' | '\t' {
  const count = (c: string) => lines.reduce((n, l) => n + (l.split(c).length - 1), 0);
  if (count('\t') > 0) return '\t';
  if (count(';') > 0) return ';';
  return ',';
}

/** A decimal comma only where the separator is not a comma and numbers are written "1,25". */
function detectDecimal(lines: string[], delimiter: string): '.' | ',' {
  if (delimiter === ',') return '.';
  return lines.some((l) => l.split(delimiter).some((c) => /^\s*[+-]?\d*,\d+([eE][+-]?\d+)?\s*$/.test(c))) ? ',' : '.';
}

function looksNumeric(cell: string, decimal: string): boolean {
  const t = decimal === ',' ? cell.trim().replace(',', '.') : cell.trim();
  return t !== '' && (Number.isFinite(Number(t)) || NON_FINITE.test(t));
}

class Growable {
  data: Float32Array;
  length = 0;
  constructor(capacity = 65536) {
    this.data = new Float32Array(capacity);
  }
  push(x: number) {
    if (this.length === this.data.length) {
      const next = new Float32Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = x;
  }
  done(): Float32Array {
    return this.data.slice(0, this.length);
  }
}

class GrowableF64 {
  data = new Float64Array(65536);
  length = 0;
  push(x: number) {
    if (this.length === this.data.length) {
      const next = new Float64Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = x;
  }
}

/** Yields the file's text in whole lines, slice by slice. */
async function* lineBatches(source: ByteSource, onProgress?: ProgressCallback, isCancelled?: () => boolean) {
  const decoder = new TextDecoder('utf-8');
  let carry = '';
  for (let offset = 0; offset < source.size; offset += SLICE_BYTES) {
    if (isCancelled?.()) throw new RecordingError('CANCELLED', `Reading ${source.name} was stopped.`);
    const bytes = await source.read(offset, SLICE_BYTES);
    const last = offset + SLICE_BYTES >= source.size;
    const text = carry + decoder.decode(bytes, { stream: !last });
    const cut = last ? text.length : text.lastIndexOf('\n') + 1;
    carry = text.slice(cut);
    onProgress?.(Math.min(1, (offset + bytes.byteLength) / source.size));
    if (cut > 0) yield text.slice(0, cut);
  }
  if (carry) yield carry;
}

export async function readCsv(
  source: ByteSource,
  options: CsvOptions & { channels?: number[]; onProgress?: ProgressCallback; isCancelled?: () => boolean } = {},
): Promise<DecodedRecording> {
  const name = source.name;
  if (source.size === 0) throw new RecordingError('EMPTY_FILE', `${name} is empty (0 bytes).`);
  const tolerance = options.timeTolerance ?? DEFAULT_TOLERANCE;

  let delimiter = options.delimiter;
  let decimal = options.decimal;
  let columns: Column[] | null = null;
  let timeIndex = -1;
  let timeScale = 1;
  let wanted: number[] = [];
  let stores: Growable[] = [];
  let bad: NonFiniteReport[] = [];
  const times = new GrowableF64();
  let timeDecimals = 0;
  let row = 0; // 1-based line number in the file
  let dataRows = 0;
  let firstDataRow = 0;

  const setup = (first: string[], sample: string[]) => {
    const d = delimiter ?? detectDelimiter(sample);
    delimiter = d;
    decimal ??= detectDecimal(sample, d);
    const hasHeader = !first.every((c) => looksNumeric(c, decimal!));
    columns = hasHeader ? first.map(parseHeaderCell) : first.map((_, i) => ({ name: `ch${i + 1}`, unit: null }));
    if (options.timeColumn === 'none') timeIndex = -1;
    else if (typeof options.timeColumn === 'number') {
      if (options.timeColumn < 0 || options.timeColumn >= columns.length) {
        throw new RecordingError('CSV_BAD_OPTION', `${name} has ${columns.length} columns; there is no column ${options.timeColumn + 1} to use as time.`);
      }
      timeIndex = options.timeColumn;
    } else timeIndex = columns.findIndex((c) => TIME_NAMES.test(c.name));
    if (timeIndex >= 0) {
      const unit = columns[timeIndex].unit?.toLowerCase();
      timeScale = unit === 'ms' ? 1e-3 : unit === 'us' || unit === 'µs' ? 1e-6 : 1;
    } else if (!(options.sampleRateHz && options.sampleRateHz > 0)) {
      throw new RecordingError(
        'CSV_NEEDS_SAMPLE_RATE',
        `${name} has no time column (none is named time, t or s); give its sample rate in Hz.`,
      );
    }
    const channelCount = columns.length - (timeIndex >= 0 ? 1 : 0);
    if (channelCount === 0) throw new RecordingError('NO_SAMPLES', `${name} has only a time column and no channels.`);
    wanted = options.channels ?? Array.from({ length: channelCount }, (_, i) => i);
    for (const c of wanted) {
      if (!(c >= 0 && c < channelCount)) throw new RecordingError('BAD_CHANNEL', `${name} has ${channelCount} channels; there is no channel ${c + 1}.`);
    }
    stores = wanted.map(() => new Growable());
    bad = wanted.map((channel) => ({ channel, count: 0, firstFrame: -1 }));
    return hasHeader;
  };

  const toNumber = (cell: string, col: number): number => {
    const t = decimal === ',' ? cell.trim().replace(',', '.') : cell.trim();
    const x = t === '' ? NaN : Number(t);
    if (Number.isNaN(x) && !NON_FINITE.test(t)) {
      const label = columns![col]?.name ?? `column ${col + 1}`;
      throw new RecordingError(
        'CSV_NOT_NUMERIC',
        t === ''
          ? `${name}, row ${row}, column ${col + 1} ("${label}"): the cell is empty.`
          : `${name}, row ${row}, column ${col + 1} ("${label}"): "${cell.trim().slice(0, 40)}" is not a number.`,
      );
    }
    return x;
  };

  for await (const text of lineBatches(source, options.onProgress, options.isCancelled)) {
    const lines = text.split(/\r?\n/);
    if (lines[lines.length - 1] === '') lines.pop();
    if (!columns) {
      const nonEmpty = lines.filter((l) => l.trim() !== '').slice(0, 20);
      if (!nonEmpty.length) continue;
      const d = delimiter ?? detectDelimiter(nonEmpty);
      const first = Papa.parse<string[]>(nonEmpty[0], { delimiter: d }).data[0] ?? [];
      delimiter = d;
      const hasHeader = setup(first, nonEmpty);
      // skip leading blank lines and the header line
      while (lines.length && lines[0].trim() === '') {
        lines.shift();
        row++;
      }
      if (hasHeader) {
        lines.shift();
        row++;
      }
    }
    const parsed = Papa.parse<string[]>(lines.join('\n'), { delimiter }).data;
    const width = columns!.length;
    for (const cells of parsed) {
      row++;
      if (cells.length === 1 && cells[0].trim() === '') continue;
      if (cells.length !== width) {
        throw new RecordingError('CSV_RAGGED_ROW', `${name}, row ${row}: ${cells.length} cells where the header has ${width}.`);
      }
      if (dataRows === 0) firstDataRow = row;
      if (timeIndex >= 0) {
        const cell = cells[timeIndex].trim();
        const t = toNumber(cell, timeIndex) * timeScale;
        const prev = times.length ? times.data[times.length - 1] : -Infinity;
        if (!(t > prev)) {
          throw new RecordingError(
            'CSV_TIME_BACKWARDS',
            `${name}, row ${row}: time ${t > prev ? 'is not a number' : t === prev ? 'does not advance' : 'goes backwards'} (${t} s after ${prev} s).`,
          );
        }
        times.push(t);
        const dot = cell.search(/[.,]/);
        if (dot >= 0) timeDecimals = Math.max(timeDecimals, cell.replace(/[eE].*$/, '').length - dot - 1);
      }
      let channel = 0;
      for (let col = 0; col < width; col++) {
        if (col === timeIndex) continue;
        const k = wanted.indexOf(channel);
        if (k >= 0) {
          const x = toNumber(cells[col], col);
          if (Number.isFinite(x)) stores[k].push(x);
          else {
            stores[k].push(0);
            if (bad[k].count++ === 0) bad[k].firstFrame = dataRows;
          }
        } else toNumber(cells[col], col); // every cell must be a number, read or not
        channel++;
      }
      dataRows++;
    }
  }

  if (!columns || dataRows === 0) throw new RecordingError('NO_SAMPLES', `${name} has no rows of numbers.`);
  const cols: Column[] = columns;
  const warnings: string[] = [];
  let sampleRateHz = options.sampleRateHz ?? 0;
  if (timeIndex >= 0) {
    if (dataRows < 2) throw new RecordingError('NO_SAMPLES', `${name} has one row only: a time column needs two rows to give a sample rate.`);
    const t = times.data;
    const meanStep = (t[times.length - 1] - t[0]) / (times.length - 1);
    // The usual step is the median one, so the error points at the row where the spacing breaks.
    const steps = new Float64Array(times.length - 1);
    for (let i = 1; i < times.length; i++) steps[i - 1] = t[i] - t[i - 1];
    const usualStep = steps.slice().sort()[steps.length >> 1];
    // Printed times are rounded: allow the rounding step as well as the relative tolerance.
    const quantum = timeDecimals > 0 ? 10 ** -timeDecimals * timeScale : 0;
    const allowed = Math.max(tolerance * usualStep, 1.01 * quantum);
    for (let i = 0; i < steps.length; i++) {
      if (Math.abs(steps[i] - usualStep) > allowed) {
        throw new RecordingError(
          'CSV_TIME_IRREGULAR',
          `${name}, row ${firstDataRow + i + 1}: the time step is ${steps[i].toPrecision(4)} s where the usual step is ${usualStep.toPrecision(4)} s; the samples must be evenly spaced (within ${(tolerance * 100).toPrecision(2)} %).`,
        );
      }
    }
    sampleRateHz = 1 / meanStep;
    warnings.push(`The sample rate, ${sampleRateHz.toPrecision(6)} Hz, comes from the column "${cols[timeIndex].name}".`);
  }
  const channelColumns = cols.filter((_, i) => i !== timeIndex);
  const channels: ChannelInfo[] = channelColumns.map((c, i) => ({ index: i, name: c.name, unit: c.unit }));
  return {
    header: {
      format: 'csv',
      fileName: name,
      sizeBytes: source.size,
      sampleRateHz,
      frames: dataRows,
      durationS: dataRows / sampleRateHz,
      channels,
      warnings,
    },
    channelIndices: wanted,
    samples: stores.map((s) => s.done()),
    nonFinite: bad.filter((b) => b.count > 0),
  };
}
