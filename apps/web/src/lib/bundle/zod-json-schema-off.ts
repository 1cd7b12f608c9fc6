// The web never writes JSON Schema: the API builds the OpenAPI document (and the contract checks
// that walk a schema run in tests) with the real zod. zod's classic schemas import its JSON Schema
// writer all the same, so it sat in the first load of every page (two modules, ~35 kB before
// minifying). The web's build resolves both modules to this one (vite.config.ts,
// `zod-without-json-schema`): the same names, and whatever would write a schema throws.
// zod is pinned (package.json); zod-json-schema-off.test.ts fails when an upgrade adds a name here missing.

const off = (): never => {
  throw new Error('JSON Schema is not built into the web (lib/bundle/zod-json-schema-off.ts)');
};

/** Called as a schema is made (its `~standard.jsonSchema`): returns a writer that throws. */
export const createStandardJSONSchemaMethod = (): typeof off => off;
/** Called by `schema.toJSONSchema()`: returns a writer that throws. */
export const createToJSONSchemaMethod = (): typeof off => off;
/** No processors: nothing here writes a schema. */
export const allProcessors: Readonly<Record<string, typeof off>> = {};
export const aggregateChecks = off;
export const anyProcessor = off;
export const arrayProcessor = off;
export const bigintProcessor = off;
export const booleanProcessor = off;
export const catchProcessor = off;
export const customProcessor = off;
export const dateProcessor = off;
export const defaultProcessor = off;
export const enumProcessor = off;
export const extractDefs = off;
export const fileProcessor = off;
export const finalize = off;
export const functionProcessor = off;
export const handleUnrepresentable = off;
export const initializeContext = off;
export const intersectionProcessor = off;
export const lazyProcessor = off;
export const literalProcessor = off;
export const mapProcessor = off;
export const nanProcessor = off;
export const neverProcessor = off;
export const nonoptionalProcessor = off;
export const nullProcessor = off;
export const nullableProcessor = off;
export const numberProcessor = off;
export const objectProcessor = off;
export const optionalProcessor = off;
export const pipeProcessor = off;
export const prefaultProcessor = off;
export const process = off;
export const processSchema = off;
export const promiseProcessor = off;
export const readonlyProcessor = off;
export const recordProcessor = off;
export const setProcessor = off;
export const stringProcessor = off;
export const successProcessor = off;
export const symbolProcessor = off;
export const templateLiteralProcessor = off;
export const toJSONSchema = off;
export const transformProcessor = off;
export const tupleProcessor = off;
export const undefinedProcessor = off;
export const unionProcessor = off;
export const unknownProcessor = off;
export const voidProcessor = off;
