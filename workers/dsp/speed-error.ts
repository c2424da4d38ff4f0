/** The speed module's one error: a whole sentence for the engineer, and a code for callers. */
export type SpeedErrorCode =
  | 'TOO_FEW_PULSES'
  | 'NO_VALID_INTERVALS'
  | 'BAD_PPR'
  | 'BAD_SAMPLE_RATE'
  | 'BAD_OPTION'
  | 'EMPTY_CHANNEL'
  | 'EMPTY_RAMP';

/** `message` is a whole sentence saying what is wrong and what to check; `code` is for callers. */
export class SpeedError extends Error {
  constructor(
    readonly code: SpeedErrorCode,
    message: string,
  ) {
    super(message);
    this.name = 'SpeedError';
  }
}
