/** Internal input guards shared by the rule modules (not exported from the package root). */
import { ValidationError } from './errors.js';

/** Tolerance for comparing computed millimetre / degree values at an inclusive limit. */
export const EPS = 1e-9;

/** Throws unless `value` is a finite number. */
export function requireFinite(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new ValidationError('not-a-number', 'Enter a number', field);
  }
  return value;
}

/** Throws unless `value` is a finite number ≥ 0. */
export function requireNonNegative(value: unknown, field: string): number {
  const n = requireFinite(value, field);
  if (n < 0) throw new ValidationError('out-of-range', 'Enter 0 or more', field);
  return n;
}

/** Throws unless `value` is a finite number > 0. */
export function requirePositive(value: unknown, field: string): number {
  const n = requireFinite(value, field);
  if (n <= 0) throw new ValidationError('out-of-range', 'Enter a number greater than 0', field);
  return n;
}

/** Throws unless `value` is a boolean. */
export function requireBoolean(value: unknown, field: string): boolean {
  if (typeof value !== 'boolean') {
    throw new ValidationError('bad-value', 'Choose yes or no', field);
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
    throw new ValidationError('bad-value', 'Choose one of the offered options', field);
  }
  return value as T;
}

/** Throws unless `value` is an array. */
export function requireArray(value: unknown, field: string): unknown[] {
  if (!Array.isArray(value)) throw new ValidationError('bad-value', 'Give a list', field);
  return value;
}

/** Formats a millimetre/degree value for a message: at most 2 decimals, no float noise. */
export function fmt(n: number): string {
  return String(Math.round(n * 100) / 100);
}
