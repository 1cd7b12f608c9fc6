import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { badInputs, requestSchemas } from './contract-walk.js';
import { plainWordingProblems as problems } from './plain-messages.js';
import './index.js';

/**
 * Every message a contract can give a user is a sentence in the product's words: no machine path
 * ("parts.0.lot"), no identifier ("probingDepthMm"), and none of the validation library's default
 * wording. The walk derives its bad inputs from each route's schema, so a new route is covered.
 */
describe('plain-language messages of every contract', () => {
  it('the check itself recognises the wording it forbids', () => {
    // Source of the forbidden wording: zod's own English locale, applied to real issues.
    const en = z.locales.en();
    const issues = z.object({ n: z.number().min(1), e: z.enum(['a', 'b']) }).safeParse({ n: 0, e: 'c' }).error!.issues;
    for (const issue of issues) expect(problems(en.localeError(issue as never) as string)).not.toEqual([]);
    expect(problems('parts.0.lot: Required')).not.toEqual([]);
    expect(problems('probingDepthMm must be positive')).not.toEqual([]);
    expect(problems('Enter 1 or more')).toEqual([]);
  });

  const schemas = requestSchemas();
  it('walks a schema for every route that takes input', () => {
    expect(schemas.length).toBeGreaterThan(30);
  });

  it.each(schemas.map((s) => [s.name, s.schema] as const))('%s', (_name, schema) => {
    const seen = new Map<string, string[]>();
    let refused = 0;
    for (const input of badInputs(schema)) {
      const result = schema.safeParse(input);
      if (result.success) continue;
      refused += 1;
      for (const issue of result.error.issues) {
        const p = problems(issue.message);
        if (p.length > 0) seen.set(`${issue.path.join('.') || '(body)'}: ${issue.message}`, p);
      }
    }
    expect(refused).toBeGreaterThan(0);
    expect(Object.fromEntries(seen)).toEqual({});
  });
});
