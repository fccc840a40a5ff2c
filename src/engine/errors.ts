/**
 * The one error type the engine throws. Its message names the argument, the
 * function and the bad value, and says what to change. The worksheet layer turns
 * `kind` into a spreadsheet error code (`value` -> #VALUE!, `num` -> #NUM!,
 * `na` -> #N/A) and keeps the message; the command line prints it on one line.
 */
export type RemapErrorKind = 'value' | 'num' | 'na' | 'cancelled';

export class RemapError extends Error {
  readonly kind: RemapErrorKind;

  constructor(message: string, kind: RemapErrorKind = 'value') {
    super(message);
    this.name = 'RemapError';
    this.kind = kind;
  }
}

/** Throws a `#VALUE!`-kind RemapError with `message` unless `condition` holds. */
export function require_(condition: unknown, message: string, kind: RemapErrorKind = 'value'): asserts condition {
  if (!condition) throw new RemapError(message, kind);
}

/** True for errors the engine raised on purpose (bad input, cancelled fit). */
export function isRemapError(e: unknown): e is RemapError {
  return e instanceof RemapError;
}
