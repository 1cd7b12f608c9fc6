// How an amendment's body is made from the fields of the entry it amends. A clinical entry is
// amended by a new version, and the new version must not lose what the clinician did not touch:
// a field the entry's own body defaults (to null, false, []) would be cleared by a client that
// leaves it out. Every amendment body is built with `keepingOmitted`, and amendment.test.ts walks
// every amendment route to hold that line.
import { z } from 'zod';

/** A field schema without a default at its top: `.default()` directly, or before a transform. */
type WithoutDefault<T> =
  T extends z.ZodDefault<infer I extends z.ZodType>
    ? I
    : T extends z.ZodPipe<z.ZodDefault<infer I extends z.ZodType>, infer O extends z.ZodType>
      ? z.ZodPipe<I, O>
      : T;

/** A field that the recording body defaults becomes optional with no default; others are kept. */
type KeptWhenOmitted<T> =
  WithoutDefault<T> extends T ? T : WithoutDefault<T> extends z.ZodType ? z.ZodOptional<WithoutDefault<T>> : T;

function keptWhenOmitted(field: z.ZodType): z.ZodType {
  if (field instanceof z.ZodDefault) return (field.unwrap() as z.ZodType).optional();
  if (field instanceof z.ZodPipe && field.in instanceof z.ZodDefault)
    return (field.in.unwrap() as z.ZodType).pipe(field.out as z.ZodType).optional();
  return field;
}

/**
 * The fields of an amendment made from the fields of the recording body: what the recording body
 * requires, the amendment requires; what it defaults, the amendment may leave out, and a field
 * left out keeps the amended entry's value (`null` still clears it). The service merges with
 * `keepAbsent` (apps/api/src/common/keep-absent.ts).
 */
export function keepingOmitted<S extends z.ZodRawShape>(shape: S): { [K in keyof S]: KeptWhenOmitted<S[K]> } {
  return Object.fromEntries(Object.entries(shape).map(([k, f]) => [k, keptWhenOmitted(f as z.ZodType)])) as {
    [K in keyof S]: KeptWhenOmitted<S[K]>;
  };
}
