import type { z } from 'zod';

type Kept<C, O> = { [K in keyof C]-?: K extends keyof O ? Exclude<C[K], undefined> | O[K] : C[K] };

/**
 * The values of an amendment (contracts' `keepingOmitted`): each field of the amendment's schema
 * that the body left out takes the amended entry's value; `null` clears it. Walks the schema's
 * keys, since a field left out is absent from the parsed body.
 */
export function keepAbsent<C extends object, O extends object>(schema: z.ZodObject, changes: C, old: O): Kept<C, O> {
  const next: Record<string, unknown> = { ...(changes as Record<string, unknown>) };
  for (const key of Object.keys(schema.shape))
    if (next[key] === undefined && key in old) next[key] = (old as Record<string, unknown>)[key];
  return next as Kept<C, O>;
}
