import { z } from 'zod';
import { apiRoutes } from './routes.js';

/**
 * Walks every contract of every route (bodies and queries) through its JSON Schema, for tests that
 * must cover the next contract too: the error-wording test and the web's field-label test.
 * Test support: bundlers leave it out of the app (nothing there imports it).
 */
type Json = { [key: string]: unknown };

const asJson = (v: unknown): Json => (v !== null && typeof v === 'object' ? (v as Json) : {});
const list = (v: unknown): Json[] => (Array.isArray(v) ? v.map(asJson) : []);

/** Every request schema of the API, named by route. */
export function requestSchemas(): { name: string; schema: z.ZodType }[] {
  const out: { name: string; schema: z.ZodType }[] = [];
  for (const r of apiRoutes) {
    if (r.body) out.push({ name: `${r.method.toUpperCase()} ${r.path} body`, schema: r.body });
    if (r.query) out.push({ name: `${r.method.toUpperCase()} ${r.path} query`, schema: r.query });
  }
  return out;
}

function jsonSchema(schema: z.ZodType): Json {
  return asJson(z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any', reused: 'inline', cycles: 'ref' }));
}

/** The alternatives of a node (anyOf / oneOf / allOf), or the node itself. */
function alternatives(node: Json): Json[] {
  const alts = [...list(node.anyOf), ...list(node.oneOf), ...list(node.allOf)];
  return alts.length > 0 ? alts.flatMap(alternatives) : [node];
}

/** A value the node would probably accept (the walk changes one part of it at a time). */
function plausible(node: Json, depth = 0): unknown {
  const n = alternatives(node).find((a) => a.type !== 'null') ?? node;
  if (Array.isArray(n.enum)) return n.enum[0];
  if ('const' in n) return n.const;
  switch (n.type) {
    case 'object': {
      const props = asJson(n.properties);
      return Object.fromEntries(
        Object.entries(props).map(([k, v]) => [k, depth > 6 ? null : plausible(asJson(v), depth + 1)]),
      );
    }
    case 'array':
      return depth > 6
        ? []
        : Array.from({ length: Math.max(1, Number(n.minItems ?? 1)) }, () => plausible(asJson(n.items), depth + 1));
    case 'integer':
    case 'number':
      return typeof n.minimum === 'number' ? n.minimum : 1;
    case 'boolean':
      return true;
    case 'string':
      if (n.format === 'uuid') return '00000000-0000-4000-8000-000000000000';
      if (n.format === 'date') return '2020-01-01';
      if (n.format === 'date-time') return '2020-01-01T10:00:00Z';
      if (n.format === 'email') return 'someone@example.org';
      return 'a'.repeat(Math.max(1, Number(n.minLength ?? 1)));
    default:
      return null;
  }
}

/** Wrong values for one node: each should be refused with a plain message. */
function wrongLeaves(node: Json): unknown[] {
  const n = alternatives(node).find((a) => a.type !== 'null') ?? node;
  const wrong: unknown[] = [undefined, { unexpected: true }];
  if (Array.isArray(n.enum) || 'const' in n) wrong.push('no-such-value');
  switch (n.type) {
    case 'integer':
    case 'number':
      wrong.push('x', Number.NaN, 1.5, -1e12, 1e12, '');
      break;
    case 'string':
      wrong.push(42, '', 'x'.repeat(Number(n.maxLength ?? 100_000) + 1), 'not valid \u0001', '1900-13-45');
      break;
    case 'boolean':
      wrong.push('yes');
      break;
    case 'array':
      wrong.push(
        'x',
        [],
        Array.from({ length: Number(n.maxItems ?? 500) + 1 }, () => plausible(asJson(n.items))),
      );
      break;
    default:
      break;
  }
  return wrong;
}

/** Every (path, node) in the schema, leaves and containers alike. */
function walk(
  node: Json,
  path: (string | number)[],
  visit: (path: (string | number)[], node: Json) => void,
  depth = 0,
): void {
  if (depth > 8) return;
  visit(path, node);
  for (const alt of alternatives(node)) {
    for (const [k, v] of Object.entries(asJson(alt.properties))) walk(asJson(v), [...path, k], visit, depth + 1);
    if (alt.type === 'array' && alt.items) walk(asJson(alt.items), [...path, 0], visit, depth + 1);
  }
}

function setAt(value: unknown, path: (string | number)[], leaf: unknown): unknown {
  if (path.length === 0) return leaf;
  const [head, ...rest] = path;
  const container = Array.isArray(value) ? [...value] : { ...asJson(value) };
  const child = (container as Record<string | number, unknown>)[head];
  (container as Record<string | number, unknown>)[head] = setAt(child, rest, leaf);
  return container;
}

/** Inputs that break one part of the schema at a time, plus a few wrong wholes. */
export function badInputs(schema: z.ZodType): unknown[] {
  const root = jsonSchema(schema);
  const base = plausible(root);
  const inputs: unknown[] = [undefined, null, 'text', [], {}];
  walk(root, [], (path, node) => {
    for (const leaf of wrongLeaves(node)) inputs.push(setAt(base, path, leaf));
  });
  return inputs;
}

/** The names of every field a contract can report (the last named segment of each path). */
export function fieldNames(schema: z.ZodType): Set<string> {
  const names = new Set<string>();
  walk(jsonSchema(schema), [], (path) => {
    const last = [...path].reverse().find((p): p is string => typeof p === 'string');
    if (last) names.add(last);
  });
  return names;
}
