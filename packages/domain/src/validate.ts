/** Internal input guards shared by the rule modules (not exported from the package root). */
import { ValidationError } from './errors.js';

/** Tolerance for comparing computed millimetre / degree values at an inclusive limit. */
export const EPS = 1e-9;

/** Throws unless `value` is a finite number. */
export function requireFinite(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new ValidationError('not-a-number', `${field} must be a finite number (got ${String(value)})`, field);
  }
  return value;
}

/** Throws unless `value` is a finite number ≥ 0. */
export function requireNonNegative(value: unknown, field: string): number {
  const n = requireFinite(value, field);
  if (n < 0) throw new ValidationError('out-of-range', `${field} must not be negative (got ${n})`, field);
  return n;
}

/** Throws unless `value` is a finite number > 0. */
export function requirePositive(value: unknown, field: string): number {
  const n = requireFinite(value, field);
  if (n <= 0) throw new ValidationError('out-of-range', `${field} must be greater than 0 (got ${n})`, field);
  return n;
}

/** Throws unless `value` is a boolean. */
export function requireBoolean(value: unknown, field: string): boolean {
  if (typeof value !== 'boolean') {
    throw new ValidationError('bad-value', `${field} must be true or false (got ${String(value)})`, field);
  }
  return value;
}

/** Throws unless `value` is `undefined` or a boolean. */
export function optionalBoolean(value: unknown, field: string): boolean {
  if (value === undefined) return false;
  return requireBoolean(value, field);
}

/** Throws unless `value` is one of `allowed`. */
export function requireOneOf<T extends string | number>(value: unknown, allowed: readonly T[], field: string): T {
  if (!(allowed as readonly unknown[]).includes(value)) {
    throw new ValidationError(
      'bad-value',
      `${field} must be one of ${allowed.map((a) => JSON.stringify(a)).join(', ')} (got ${JSON.stringify(value)})`,
      field,
    );
  }
  return value as T;
}

/** Throws unless `value` is an array. */
export function requireArray(value: unknown, field: string): unknown[] {
  if (!Array.isArray(value)) throw new ValidationError('bad-value', `${field} must be a list`, field);
  return value;
}

/** Formats a millimetre/degree value for a message: at most 2 decimals, no float noise. */
export function fmt(n: number): string {
  return String(Math.round(n * 100) / 100);
}
