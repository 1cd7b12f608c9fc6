// fast-check arbitraries derived from a contract's JSON Schema (`z.toJSONSchema`, draft 2020-12),
// plus hostile values to inject into any field. zod-fast-check does not support zod 4, and the
// JSON Schema is what the OpenAPI document publishes, so the fuzzer reads what a client reads.
import fc from 'fast-check';

export interface JsonSchema {
  type?: string | string[];
  properties?: Record<string, JsonSchema>;
  required?: string[];
  items?: JsonSchema;
  prefixItems?: JsonSchema[];
  minItems?: number;
  maxItems?: number;
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  allOf?: JsonSchema[];
  enum?: unknown[];
  const?: unknown;
  format?: string;
  minLength?: number;
  maxLength?: number;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
}

/** Marks a leaf that is replaced by raw JSON text (numbers JSON.stringify cannot write). */
const RAW = '\u0000__raw__';
/** JSON number texts that parse to ±Infinity, or are not JSON at all (the parser must refuse them). */
const RAW_NUMBERS = ['1e999', '-1e999', 'NaN', 'Infinity', '-Infinity', '1e308', '-0', '0.1e-400'] as const;

const HOSTILE_STRINGS: readonly string[] = [
  '\u0000',
  'Whit\u0000combe',
  'x'.repeat(10_000),
  '\u202Eevil.exe\u202C',
  "' OR '1'='1'; DROP TABLE patients; --",
  '<script>alert(1)</script><img src=x onerror=alert(1)>',
  '\ud800',
  '%00',
  '../../../../etc/passwd',
  '0000-01-01',
  '275760-09-13',
  '2024-02-30',
  '1e999',
  'NaN',
  'Infinity',
  '-0',
  '\u001d\u001e\u001f',
  '😀'.repeat(100),
  ' ',
  '',
];
const HOSTILE_NUMBERS: readonly number[] = [
  -0,
  1e308,
  -1e308,
  Number.MAX_SAFE_INTEGER + 2,
  Number.MIN_VALUE,
  -1,
  2 ** 31,
  0.1 + 0.2,
];
const HOSTILE_SHAPES: readonly unknown[] = [null, true, [], {}, [null], { $ne: null }, { __proto__: { admin: true } }];

/** Hostile values for any field: strings, numbers, raw number texts and wrong shapes. */
export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(...HOSTILE_STRINGS),
  fc.constantFrom(...HOSTILE_NUMBERS),
  fc.constantFrom(...RAW_NUMBERS).map((n) => `${RAW}${n}`),
  fc.constantFrom(...HOSTILE_SHAPES),
);

const dateIn = (minYear: number, maxYear: number) =>
  fc
    .date({ min: new Date(Date.UTC(minYear, 0, 1)), max: new Date(Date.UTC(maxYear, 11, 31)), noInvalidDate: true })
    .map((d) => d.toISOString());

/** Values that mostly fit the schema; `uuids` are real ids to pick from (so requests get past lookups). */
export function arbitraryFor(schema: JsonSchema, uuids: readonly string[]): fc.Arbitrary<unknown> {
  const variants = schema.anyOf ?? schema.oneOf;
  if (variants) return fc.oneof(...variants.map((s) => arbitraryFor(s, uuids)));
  if (schema.allOf?.length) return arbitraryFor(schema.allOf[0], uuids);
  if (schema.const !== undefined) return fc.constant(schema.const);
  if (schema.enum) return fc.constantFrom(...schema.enum);
  const type = Array.isArray(schema.type) ? schema.type[0] : schema.type;
  switch (type) {
    case 'null':
      return fc.constant(null);
    case 'boolean':
      return fc.boolean();
    case 'integer': {
      const min = schema.minimum ?? (schema.exclusiveMinimum ?? -1e6) + 1;
      const max = schema.maximum ?? (schema.exclusiveMaximum ?? 1e6) - 1;
      return fc.integer({ min: Math.max(min, -1e9), max: Math.min(max, 1e9) });
    }
    case 'number': {
      const min = schema.minimum ?? schema.exclusiveMinimum ?? -1e6;
      const max = schema.maximum ?? schema.exclusiveMaximum ?? 1e6;
      return fc.oneof(
        fc.double({ min, max, noNaN: true, noDefaultInfinity: true }),
        fc.integer({ min: Math.ceil(min), max: Math.floor(max) }),
      );
    }
    case 'string':
      switch (schema.format) {
        case 'uuid':
          return uuids.length ? fc.oneof(fc.constantFrom(...uuids), fc.uuid()) : fc.uuid();
        case 'date':
          return fc.oneof(
            dateIn(1990, 2030).map((d) => d.slice(0, 10)),
            dateIn(1, 9999).map((d) => d.slice(0, 10)),
          );
        case 'date-time':
          return fc.oneof(dateIn(1990, 2030), dateIn(1, 9999));
        case 'email':
          return fc.oneof(fc.emailAddress(), fc.constant('tomasz.brill@larkspur.example'));
        default:
          return fc.oneof(
            ...(['grapheme', 'binary'] as const).map((unit) =>
              fc.string({ minLength: schema.minLength ?? 0, maxLength: Math.min(schema.maxLength ?? 60, 60), unit }),
            ),
          );
      }
    case 'array': {
      if (schema.prefixItems) return fc.tuple(...schema.prefixItems.map((s) => arbitraryFor(s, uuids)));
      const minLength = schema.minItems ?? 0;
      return fc.array(schema.items ? arbitraryFor(schema.items, uuids) : fc.anything(), {
        minLength,
        maxLength: Math.min(schema.maxItems ?? 4, Math.max(minLength, 4)),
      });
    }
    case 'object': {
      const props = schema.properties ?? {};
      const required = new Set(schema.required ?? []);
      const record: Record<string, fc.Arbitrary<unknown>> = {};
      for (const [k, s] of Object.entries(props)) record[k] = arbitraryFor(s, uuids);
      return fc.record(record, { requiredKeys: Object.keys(props).filter((k) => required.has(k)) });
    }
    default:
      return fc.jsonValue();
  }
}

/** Paths of every field and array element in a JSON value (the root is the empty path). */
export function leafPaths(value: unknown, at: (string | number)[] = []): (string | number)[][] {
  if (Array.isArray(value)) return [at, ...value.flatMap((v, i) => leafPaths(v, [...at, i]))];
  if (value && typeof value === 'object')
    return [at, ...Object.entries(value).flatMap(([k, v]) => leafPaths(v, [...at, k]))];
  return [at];
}

/** A copy of `value` with the field at `path` replaced. */
export function replaceAt(value: unknown, path: (string | number)[], by: unknown): unknown {
  if (path.length === 0) return by;
  const copy = (Array.isArray(value) ? [...value] : { ...(value as object) }) as Record<string | number, unknown>;
  copy[path[0]] = replaceAt(copy[path[0]], path.slice(1), by);
  return copy;
}

/** JSON text of a body, with RAW-marked strings written as raw number texts. */
export function toJsonText(body: unknown): string {
  return JSON.stringify(body).replace(/"\\u0000__raw__([^"]*)"/g, '$1');
}
