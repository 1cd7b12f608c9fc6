// The contract side of "an amendment changes what it names and nothing else": walked over every
// amendment route in the route list, so a new amendment route is held to it with no new test.
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { keepingOmitted } from './amendment.js';
import { apiRoutes } from './routes.js';

const amendmentRoutes = apiRoutes.filter((r) => /\/amend(ments)?$/.test(r.path));

describe('every amendment body', () => {
  it('is found in the route list (the walk below is not empty)', () => {
    // torque entries, complications, placements, plans, exams and radiograph measurements, at least.
    expect(amendmentRoutes.map((r) => r.path).length).toBeGreaterThanOrEqual(6);
  });

  it.each(amendmentRoutes.map((r) => [`${r.method.toUpperCase()} ${r.path}`, r] as const))(
    '%s: a field left out is kept or refused, never defaulted',
    (_name, route) => {
      expect(route.body).toBeInstanceOf(z.ZodObject);
      const shape = (route.body as z.ZodObject).shape;
      const defaulted = Object.entries(shape)
        .filter(([, field]) => {
          const absent = (field as z.ZodType).safeParse(undefined);
          return absent.success && absent.data !== undefined;
        })
        .map(([key]) => key);
      expect(defaulted).toEqual([]);
    },
  );
});

describe('keepingOmitted', () => {
  const body = z.object(
    keepingOmitted({
      reading: z.number(),
      note: z.string().nullable().default(null),
      lot: z
        .string()
        .nullable()
        .default(null)
        .transform((s) => (s ? s.toUpperCase() : null)),
    }),
  );

  it('lets a defaulted field be left out (undefined: the service keeps it) and null still clears it', () => {
    expect(body.parse({ reading: 1 })).toEqual({ reading: 1 });
    expect(body.parse({ reading: 1, note: null })).toEqual({ reading: 1, note: null });
  });

  it('still requires what the recording body requires, and still checks and transforms values', () => {
    expect(body.safeParse({}).error?.issues.map((i) => i.path[0])).toEqual(['reading']);
    expect(body.safeParse({ reading: 'x' }).success).toBe(false);
    expect(body.parse({ reading: 1, lot: 'ab1' })).toEqual({ reading: 1, lot: 'AB1' });
  });
});
