// Issue 15 §2 in a real browser: the planner's Findings and its Save button always agree. A value
// the rules cannot evaluate (a non-number in a numeric field, a partly typed axis with nothing to
// complete it) is a Finding in words, never "No findings" beside a disabled Save; a partly typed
// axis is completed from the placement's axis its empty boxes show.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('restoration planner: Findings and Save agree', () => {
  it('a non-number and a zero axis are Findings while Save is disabled; a partial axis is completed', async () => {
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page.getByTestId('patient-search').fill('Achterberg');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Achterberg/ })
      .click();
    await page.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    await page.goto(`${new URL(page.url()).pathname}/restorations/new`);
    await page.getByTestId('planner-sites').getByLabel(/^15 /).check({ force: true }); // Blueprint draws its own indicator over the input
    await page.getByTestId('planner-sites').getByLabel(/^16 /).check({ force: true }); // Blueprint draws its own indicator over the input
    const site15 = page.getByTestId('planner-site-15');
    const site16 = page.getByTestId('planner-site-16');
    const findings = page.getByTestId('findings');
    const save = page.getByTestId('save-plan');

    const agree = async () => {
      const disabled = await save.isDisabled();
      const errors = await findings.getByTestId('finding-error').count();
      const none = await findings.getByTestId('no-findings').count();
      // Save disabled ⇔ an error Finding is listed; "No findings" never beside a disabled Save.
      expect(disabled).toBe(errors > 0);
      expect(disabled && none > 0).toBe(false);
    };

    await site15.getByLabel('Restorative space (mm)').fill('seven');
    const unreadable = findings.locator('[data-testid="finding-error"][data-code="input-not-a-number"]');
    await expect.poll(() => unreadable.count()).toBe(1);
    expect(await unreadable.textContent()).toMatch(/Site 15: the restorative space “seven” is not a number/);
    expect(await page.getByTestId('error-sites.0.restorativeSpaceMm').textContent()).toMatch(/millimetres/);
    await agree();
    await screenshot(page, 'planner-unreadable-input');

    await site15.getByLabel('Restorative space (mm)').fill('7,5');
    await expect.poll(() => unreadable.count()).toBe(0);
    await agree();

    // The placement axis of 16 is (−0.1, 0.02, 1); typing x alone keeps y and z from it.
    await site16.getByLabel('Axis x at 16').fill('0.05');
    await expect.poll(() => page.getByTestId('divergence').textContent()).toMatch(/15–16\s*1\.1°/);
    await agree();

    // A zero axis is refused by the rules: a Finding naming the site and the field.
    for (const axis of ['x', 'y', 'z']) await site16.getByLabel(`Axis ${axis} at 16`).fill('0');
    const refused = findings.locator('[data-testid="finding-error"][data-code="input-not-evaluated"]');
    await expect.poll(() => refused.count()).toBe(1);
    expect(await refused.textContent()).toMatch(/Site 16, implant axis: An axis of 0, 0, 0 has no direction/);
    await agree();
    // The sign-in page asks for a session first: its 401 is expected.
    expect(h.problems.filter((p) => !/status of 401/.test(p))).toEqual([]);
  });
});
