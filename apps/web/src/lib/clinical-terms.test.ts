// One spelling for each clinical term in everything a user reads (the web's pages and labels, the
// API's messages, PDFs and e-mails): "peri-implantitis", "re-torque", and "site 15" (not "tooth 15")
// for an implant site. Reads the sources, so a new page or message is covered.
import { describe, expect, it } from 'vitest';

const sources = {
  ...import.meta.glob<string>(['../**/*.{ts,tsx}', '!../**/*.test.{ts,tsx}'], {
    query: '?raw',
    import: 'default',
    eager: true,
  }),
  ...import.meta.glob<string>(['../../../api/src/**/*.ts', '!../../../api/src/**/*.{test,spec}.ts'], {
    query: '?raw',
    import: 'default',
    eager: true,
  }),
  // The planner's Findings and the contracts' messages are written in the shared packages.
  ...import.meta.glob<string>(
    ['../../../../packages/{domain,contracts}/src/**/*.ts', '!../../../../packages/*/src/**/*.test.ts'],
    { query: '?raw', import: 'default', eager: true },
  ),
};

/**
 * Variant spellings as they would appear in text; identifiers, class names, test ids and file
 * names (`retorqueDueAt`, `stack-card__retorque`, `retorque.test.ts`) are not text and do not match.
 */
const word = (core: string) => new RegExp(`(?<![-_./\\w])${core}(?![-_.\\w])`, 'i');
const VARIANTS: [RegExp, string][] = [
  [word('peri ?implantitis'), 'peri-implantitis'],
  [word('peri ?implant mucositis'), 'peri-implant mucositis'],
  [word('re ?torque[ds]?'), 're-torque'],
  // "Tooth 36", "Tooth {fdi}", `Tooth ${site.fdi}`; the FHIR body site names the ISO 3950 tooth
  // position itself, in the standard's word, and is left alone.
  [/\b[Tt]ooth (\$?\{[\w.]*fdi\b|\d\d\b)(?!.*ISO 3950)/, 'site NN for an implant site'],
];

describe('one spelling for each clinical term', () => {
  it('reads the web and API sources', () => {
    expect(Object.keys(sources).length).toBeGreaterThan(100);
    expect(VARIANTS[0][0].test('periimplantitis')).toBe(true);
    expect(VARIANTS[2][0].test('retorque due')).toBe(true);
    expect(VARIANTS[2][0].test('part.retorqueDueAt')).toBe(false);
    expect(VARIANTS[2][0].test('className="stack-card__retorque"')).toBe(false);
    expect(VARIANTS[3][0].test('Tooth 15 is loose')).toBe(true);
    expect(VARIANTS[3][0].test('message: `Tooth ${site.fdi}: choose an abutment`')).toBe(true);
    expect(VARIANTS[3][0].test('<td>Tooth {fdi}</td>')).toBe(true);
    expect(VARIANTS[3][0].test('text: `Tooth ${fdi} (ISO 3950 / FDI)`')).toBe(false);
    expect(Object.keys(sources).some((file) => file.includes('packages/domain/src/restoration-plan.ts'))).toBe(true);
  });

  it('uses the one spelling everywhere', () => {
    const found: string[] = [];
    for (const [file, text] of Object.entries(sources)) {
      text.split('\n').forEach((line, i) => {
        for (const [re, want] of VARIANTS) if (re.test(line)) found.push(`${file}:${i + 1} → ${want}: ${line.trim()}`);
      });
    }
    expect(found).toEqual([]);
  });
});
