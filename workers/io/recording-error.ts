/**
 * The one error the readers throw. `message` is a whole sentence that says what is wrong and where
 * (file, chunk, byte offset, row, column); `code` lets callers react without parsing the sentence.
 */
export type RecordingErrorCode =
  | 'EMPTY_FILE'
  | 'NOT_RIFF_WAVE'
  | 'BAD_CHUNK'
  | 'NO_FMT_CHUNK'
  | 'NO_DATA_CHUNK'
  | 'BAD_FMT_CHUNK'
  | 'ZERO_CHANNELS'
  | 'TOO_MANY_CHANNELS'
  | 'ZERO_SAMPLE_RATE'
  | 'UNSUPPORTED_FORMAT'
  | 'UNSUPPORTED_BIT_DEPTH'
  | 'NO_SAMPLES'
  | 'CSV_NO_HEADER'
  | 'CSV_RAGGED_ROW'
  | 'CSV_NOT_NUMERIC'
  | 'CSV_TIME_BACKWARDS'
  | 'CSV_TIME_IRREGULAR'
  | 'CSV_NEEDS_SAMPLE_RATE'
  | 'CSV_BAD_OPTION'
  | 'UNKNOWN_FORMAT'
  | 'NO_SAMPLE_RATE'
  | 'UNEQUAL_LENGTHS'
  | 'NOT_NUMERIC'
  | 'TRUNCATED_FILE'
  | 'BAD_STRUCTURE'
  | 'BAD_CHANNEL'
  | 'READ_FAILED'
  | 'CANCELLED';

export class RecordingError extends Error {
  constructor(
    readonly code: RecordingErrorCode,
    message: string,
  ) {
    super(message);
    this.name = 'RecordingError';
  }
}

/** What crosses a worker boundary: comlink keeps only name and message of an Error, so send the code too. */
export type Outcome<T> = { ok: true; value: T } | { ok: false; code: RecordingErrorCode | 'INTERNAL'; message: string };

export function toOutcomeError(e: unknown): { ok: false; code: RecordingErrorCode | 'INTERNAL'; message: string } {
  if (e instanceof RecordingError) return { ok: false, code: e.code, message: e.message };
  return { ok: false, code: 'INTERNAL', message: `The reader failed unexpectedly: ${e instanceof Error ? e.message : String(e)}` };
}
