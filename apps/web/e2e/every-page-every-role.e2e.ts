// Every page of the app, opened by hand (typed URL) by every role, generated from the page table
// the router uses (lib/page-access.ts) and the same CASL ability as the API. For each page:
// - a page the role's ability does not allow says plainly "Not available to your role";
// - a page it allows makes no request the API refuses (403: a dead control or a red error),
//   shows no error callout, has no form the role cannot submit (editable fields and no submit
//   button), links only to pages the role may open, and never lets a chart number wrap.
// A new page or a changed permission is covered without touching this test.
import { defineAbilityFor, type AbilityUser } from '@torquetrail/authz';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PAGE_ACCESS, type PagePath } from '../src/lib/page-access.js';
import { signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

const ROLES = {
  'practice administrator': 'odile.park@larkspur.example',
  'restorative dentist': 'ines.calloway@larkspur.example',
  hygienist: 'maren.holt@larkspur.example',
  'referring surgeon (another practice)': 'rafael.imbert@northgate.example',
} as const;

const json = async <T>(page: Page, url: string): Promise<T> => (await (await page.request.get(url)).json()) as T;

/** Real ids for the paths' parameters: the first patient, site and radiograph the role can see. */
async function paramsFor(page: Page): Promise<Record<string, string>> {
  const patients = await json<{ items: { id: string }[] }>(page, '/api/patients');
  const patientId = patients.items[0]?.id ?? '00000000-0000-4000-8000-000000000000';
  const arch = await json<{ sites?: { id: string }[] }>(page, `/api/patients/${patientId}`).catch(() => ({
    sites: [],
  }));
  const radiographs = await json<{ items?: { id: string }[] }>(page, `/api/patients/${patientId}/radiographs`).catch(
    () => ({ items: [] }),
  );
  return {
    patientId,
    siteId: arch.sites?.[0]?.id ?? '00000000-0000-4000-8000-000000000000',
    radiographId: radiographs.items?.[0]?.id ?? '00000000-0000-4000-8000-000000000000',
  };
}

const fill = (path: string, params: Record<string, string>) =>
  `/${path.replace(/:(\w+)/g, (_, name: string) => params[name] ?? name)}`;

/** The page of the table an in-app link opens (longest pattern first), or undefined. */
const PATTERNS = (Object.keys(PAGE_ACCESS) as PagePath[])
  .map((p) => ({ path: p, re: new RegExp(`^/${p.replace(/:\w+/g, '[^/]+')}/?$`) }))
  .sort((a, b) => b.path.length - a.path.length);
const pageOf = (href: string) => PATTERNS.find((p) => p.re.test(href.split(/[?#]/)[0] ?? ''))?.path;

/** Forms with fields the user can change and no way to submit them (search boxes excepted). */
const deadForms = (page: Page) =>
  page.$$eval('main form:not([role="search"])', (forms) =>
    forms
      .filter((form) => {
        const editable = form.querySelectorAll(
          'input:not([disabled]):not([readonly]):not([type="hidden"]), select:not([disabled]), textarea:not([disabled]):not([readonly])',
        );
        const submit = form.querySelector('button[type="submit"], input[type="submit"], button:not([type])');
        return editable.length > 0 && submit === null;
      })
      .map((form) => form.getAttribute('aria-label') ?? form.id ?? form.className),
  );

/** Chart numbers (the demo's are like LL-1001) shown where a line may break inside them. */
const breakableChartNumbers = (page: Page) =>
  page.$$eval('main *', (elements) =>
    elements
      .filter((el) =>
        [...el.childNodes].some((n) => n.nodeType === 3 && /\b[A-Z]{1,4}-\d{3,}\b/.test(n.textContent ?? '')),
      )
      .filter((el) => getComputedStyle(el).whiteSpace !== 'nowrap' && el.closest('input, textarea, select') === null)
      .map((el) => (el.textContent ?? '').trim().slice(0, 60)),
  );

describe('every page, every role, as a URL typed by hand', () => {
  for (const [role, email] of Object.entries(ROLES)) {
    it(`${role}: allowed pages work, the others say so plainly`, { timeout: 300_000 }, async () => {
      const page = await h.newPage();
      await signInAs(page, email);
      const me = await json<AbilityUser>(page, '/api/auth/me');
      const ability = defineAbilityFor(me);
      const may = (path: PagePath) => {
        const need = PAGE_ACCESS[path];
        // A page inside another (practice/…) needs what its parent needs too.
        const parent = path.includes('/') ? (path.split('/')[0] as PagePath) : undefined;
        const parentNeed = parent && parent in PAGE_ACCESS && parent !== path ? PAGE_ACCESS[parent] : null;
        return [need, parentNeed].every((n) => n === null || ability.can(n.action, n.subject));
      };
      const params = await paramsFor(page);
      const refused: string[] = [];
      page.on('response', (res) => {
        if (res.status() === 403 && res.url().includes('/api/')) refused.push(`${res.request().method()} ${res.url()}`);
      });

      const findings: Record<string, string[]> = {};
      for (const path of Object.keys(PAGE_ACCESS) as PagePath[]) {
        refused.length = 0;
        const seen = h.problems.length;
        const url = fill(path, params);
        await page.goto(url);
        await page.waitForLoadState('networkidle');
        const problems: string[] = [];
        const notAvailable = await page.getByText('Not available to your role').count();
        if (!may(path)) {
          if (notAvailable === 0) problems.push('opened although the role may not use it');
        } else {
          if (notAvailable > 0) problems.push('refused although the role may use it');
          if ((await page.getByText('No such page').count()) > 0) problems.push('the router has no such page');
          problems.push(...refused.map((r) => `the API refused ${r}`));
          const errors = await page.locator('main .bp6-callout.bp6-intent-danger').allTextContents();
          problems.push(...errors.map((e) => `red error: ${e.slice(0, 120)}`));
          problems.push(...(await deadForms(page)).map((f) => `a form it cannot submit: ${f}`));
          problems.push(...(await breakableChartNumbers(page)).map((t) => `a chart number that can wrap: ${t}`));
          const links = await page.$$eval('main a[href^="/"]', (as) => as.map((a) => a.getAttribute('href') ?? ''));
          for (const href of new Set(links)) {
            const target = pageOf(href);
            if (target && !may(target)) problems.push(`links to ${href}, which it may not open`);
          }
        }
        if ((await page.getByText('This page could not be shown').count()) > 0) problems.push('the page crashed');
        problems.push(...h.problems.slice(seen).filter((p) => p.startsWith('page error')));
        if (problems.length > 0) findings[path] = problems;
      }
      expect(findings).toEqual({});
    });
  }
});
