// The web's build resolves zod's JSON Schema writer to zod-json-schema-off.ts (vite.config.ts). It
// must name everything the two real modules export (a missing name fails the build, or worse, an
// import of it reads `undefined`), and nothing in the web may ask for a JSON Schema.
import { describe, expect, it } from 'vitest';
import * as processors from '../../../../../node_modules/zod/v4/core/json-schema-processors.js';
import * as toJsonSchema from '../../../../../node_modules/zod/v4/core/to-json-schema.js';
import * as off from './zod-json-schema-off';

// Vite reads the sources as text (the web's type-check has no Node types).
const sources: Record<string, string> = import.meta.glob(['../../**/*.{ts,tsx}', '!../../**/*.test.{ts,tsx}'], {
  query: '?raw',
  import: 'default',
  eager: true,
});

describe("the web build's stand-in for zod's JSON Schema writer", () => {
  it('exports every name of both modules it replaces', () => {
    const missing = [...Object.keys(processors), ...Object.keys(toJsonSchema)].filter((name) => !(name in off));
    expect(missing).toEqual([]);
  });

  it('throws rather than write a schema', () => {
    expect(() => off.toJSONSchema()).toThrow(/not built into the web/);
    expect(() => off.createStandardJSONSchemaMethod()()).toThrow(/not built into the web/);
  });

  it('is never needed: no web module asks for a JSON Schema', () => {
    const files = Object.keys(sources);
    expect(files).toContain('../api-client.ts');
    const asking = files.filter(
      (file) =>
        !file.startsWith('./') &&
        /toJSONSchema|jsonSchema\b|\b(fieldNames|badInputs|requestSchemas)\b/.test(sources[file] ?? ''),
    );
    expect(asking).toEqual([]);
  });
});
