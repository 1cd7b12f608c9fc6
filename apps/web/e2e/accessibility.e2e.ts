// Every main screen, for the role that works on it, has no serious or critical WCAG 2.1 A/AA
// violation found by axe-core (keyboard use and accessible names are also tested in each feature).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousA11yViolations } from './support/axe.js';
import { signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

const settle = async (page: import('playwright-core').Page, testId?: string) => {
  if (testId) await page.getByTestId(testId).first().waitFor();
  await page.waitForLoadState('networkidle');
};

describe('accessibility (axe-core, WCAG 2.1 A/AA)', () => {
  it('sign-in page', async () => {
    const page = await h.newPage();
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').waitFor();
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it('dentist: Patients, Arch, Site file with Stack and Timeline, restorations and the planner', async () => {
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await settle(page, 'patients-table');
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Whitcombe/ })
      .click();
    await settle(page, 'arch-svg');
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.getByTestId('arch-cell-35').click();
    await settle(page, 'stack-part');
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.goto(new URL(page.url()).pathname.replace(/\/sites\/.*/, '/restorations'));
    await settle(page);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.goto(new URL(page.url()).pathname + '/new');
    await settle(page);
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it('hygienist: Recall desk and the exam form', async () => {
    const page = await h.newPage();
    await signInAs(page, 'maren.holt@larkspur.example');
    await page.goto('/recalls');
    await settle(page);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page
      .getByRole('link', { name: /Record exam/ })
      .first()
      .click();
    await settle(page);
    expect(await seriousA11yViolations(page)).toEqual([]);
  });

  it('practice admin: catalogue, recall policy, reminder log, People, sign-in settings and the account', async () => {
    const page = await h.newPage();
    await signInAs(page, 'odile.park@larkspur.example');
    for (const path of [
      '/catalogue',
      '/recalls/policy',
      '/recalls/reminders',
      '/practice/people',
      '/practice/sign-in',
      '/account',
    ]) {
      await page.goto(path);
      await settle(page);
      expect({ path, violations: await seriousA11yViolations(page) }).toEqual({ path, violations: [] });
    }
  });
});
