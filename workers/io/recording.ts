/** What a decoded recording is, in the units the rest of the engine uses. */

export type RecordingFormat = 'wav' | 'csv' | 'mat' | 'hdf5' | 'uff';

export interface ChannelInfo {
  index: number;
  /** From the file where it has one (CSV header, WAV list chunk, MAT/HDF5 variable, UFF ID line), else ch1, ch2, … */
  name: string;
  /** From the file where it carries one (CSV header cell "mic [Pa]"), else null. */
  unit: string | null;
}

export interface WavLayout {
  formatTag: number;
  /** For WAVE_FORMAT_EXTENSIBLE, the sub-format's tag (1 PCM, 3 IEEE float). */
  subFormatTag: number | null;
  bitsPerSample: number;
  blockAlign: number;
  dataOffset: number;
  dataBytes: number;
  rf64: boolean;
}

export interface RecordingHeader {
  format: RecordingFormat;
  fileName: string;
  sizeBytes: number;
  sampleRateHz: number;
  frames: number;
  durationS: number;
  channels: ChannelInfo[];
  /** Things that were read anyway but deserve a word (a truncated data chunk, a time column used). */
  warnings: string[];
  wav?: WavLayout;
}

export interface NonFiniteReport {
  channel: number;
  count: number;
  firstFrame: number;
}

export interface DecodedRecording {
  header: RecordingHeader;
  /** The channels asked for, in the order asked, ±1 full scale for PCM WAV, file units for CSV. */
  channelIndices: number[];
  samples: Float32Array[];
  /** NaN or ±Inf samples found (kept as 0 in `samples`, and reported here). */
  nonFinite: NonFiniteReport[];
}

/** Progress of a long read: 0…1 of the bytes to read. */
export type ProgressCallback = (fraction: number) => void;

export interface CsvOptions {
  /** Cell separator; detected from the first lines when absent. */
  delimiter?: ',' | ';' | '\t';
  /** Decimal mark; detected (a comma when the separator is ';' or tab and numbers carry commas). */
  decimal?: '.' | ',';
  /** Column index of time in seconds; 'auto' finds a column named time/t/zeit/s; 'none' uses sampleRateHz. */
  timeColumn?: number | 'auto' | 'none';
  /** Needed when there is no time column. */
  sampleRateHz?: number;
  /** Relative deviation of a time step from the mean step that still counts as regular. Default 1e-3. */
  timeTolerance?: number;
}

export interface DecodeOptions {
  /** Channel indices to decode; all when absent. */
  channels?: number[];
  /**
   * With no `channels`: a WAV (which can give any one channel without the others) is opened with none
   * decoded, for the Bench to read the ones it uses on demand; the formats read whole (CSV, MAT, HDF5,
   * UFF) still give all.
   */
  lazy?: boolean;
  csv?: CsvOptions;
  onProgress?: ProgressCallback;
  /** Checked between blocks; when it returns true the read stops with CANCELLED. */
  isCancelled?: () => boolean;
  /**
   * Samples in SharedArrayBuffers, for worker threads to read without a copy (the batch CLI). WAV samples
   * are decoded straight into them; CSV columns are copied once at the end.
   */
  shared?: boolean;
  /**
   * WAV only: arrays (of the header's frame count, usually in SharedArrayBuffers) to decode the channels
   * asked into, one per channel, so a reader on another thread sees the samples as they arrive; each
   * progress call comes after the samples it counts are written.
   */
  into?: Float32Array[];
}
