/**
 * Typed errors for the clinical computation core.
 *
 * Every error thrown by this package on bad input is either a {@link DomainError}
 * (with a stable machine-readable `code`) or, where the public contract says so,
 * a `RangeError` subclass that also carries a `code` ({@link ToothPositionError}).
 * Callers should branch on `code`, never on `message` (messages may be reworded).
 */

/** Base class of every domain error. `code` is stable and machine-readable. */
export class DomainError extends Error {
  /** Stable, machine-readable error code (kebab-case). */
  readonly code: string;

  constructor(code: string, message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = new.target.name;
    this.code = code;
  }
}

/** Codes of {@link ValidationError}. */
export type ValidationErrorCode =
  /** A number is NaN or ±Infinity, or a value of the wrong type was given. */
  | 'not-a-number'
  /** A number is outside its allowed range (e.g. a negative probing depth). */
  | 'out-of-range'
  /** A list that must not be empty is empty. */
  | 'empty'
  /** A calendar date is malformed or does not exist (e.g. 2026-02-30). */
  | 'bad-date'
  /** A direction vector has zero length. */
  | 'zero-vector'
  /** A value is not one of the allowed choices. */
  | 'bad-value'
  /** Baseline and current exam do not describe the same probing sites. */
  | 'site-mismatch';

/** Invalid input to a computation (NaN, negative depth, empty list, impossible date, …). */
export class ValidationError extends DomainError {
  declare readonly code: ValidationErrorCode;
  /** Path of the offending input field, e.g. `sites[2].probingDepthMm`. */
  readonly field?: string;

  constructor(code: ValidationErrorCode, message: string, field?: string) {
    super(code, message);
    if (field !== undefined) this.field = field;
  }
}

/** Codes of {@link UdiError}. */
export type UdiErrorCode =
  /** Nothing to parse (empty string, or only a symbology identifier). */
  | 'empty'
  /** The GTIN's last digit does not match the GS1 check digit. */
  | 'bad-check-digit'
  /** A YYMMDD date is malformed or does not exist (e.g. 270230). */
  | 'bad-date'
  /** An application identifier this parser does not know (only 01, 10, 11, 17, 21 are supported). */
  | 'unknown-ai'
  /** The data ends inside an element, or an element has no value. */
  | 'truncated'
  /** No (01) GTIN element. */
  | 'missing-gtin'
  /** A variable-length element exceeds its maximum (20 characters for lot and serial), or a fixed-length one is too long. */
  | 'too-long'
  /** Malformed data: not digits where digits are required, unknown symbology identifier, wrong GTIN length. */
  | 'bad-format'
  /** A character outside the GS1 AI encodable character set 82 appears in a lot or serial. */
  | 'bad-character'
  /** The same application identifier appears twice. */
  | 'duplicate-ai';

/** A GS1 UDI element string (or a GTIN) that cannot be read. */
export class UdiError extends DomainError {
  declare readonly code: UdiErrorCode;
  /** Application identifier concerned, when there is one (e.g. `17`). */
  readonly ai?: string;

  constructor(code: UdiErrorCode, message: string, ai?: string) {
    super(code, message);
    if (ai !== undefined) this.ai = ai;
  }
}

/**
 * A tooth position that does not exist (FDI or Universal).
 * Extends `RangeError` as the public contract of the tooth-numbering functions requires,
 * and carries a stable `code` like a {@link DomainError}.
 */
export class ToothPositionError extends RangeError {
  readonly code = 'invalid-position' as const;

  constructor(message: string) {
    super(message);
    this.name = 'ToothPositionError';
  }
}
