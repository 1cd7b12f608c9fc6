// Accessibility check with axe-core (WCAG 2 A/AA rules) on the page as it stands.
import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

const axeSource = fs.readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  targets: string[];
}

/** Runs axe in the page; returns the serious and critical violations (id, help and the elements). */
export async function seriousA11yViolations(page: Page): Promise<AxeViolation[]> {
  // Injected as a script element's text would be blocked by our CSP; evaluate runs it directly.
  await page.evaluate(axeSource);
  const result = await page.evaluate(async () => {
    const axe = (
      window as unknown as {
        axe: {
          run: (
            ctx: Document,
            opts: object,
          ) => Promise<{
            violations: { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }[];
          }>;
        };
      }
    ).axe;
    return axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] } });
  });
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      targets: v.nodes.slice(0, 5).map((n) => n.target.join(' ')),
    }));
}
