// Torque entries that protect the patient, in a real browser: Escape closes the torque panel and
// the other inline panels; a settling re-torque one minute after the seating warns (about 10 min,
// Siamos et al. 2002) and is saved only once confirmed; a wrench whose calibration is overdue under
// the practice's interval (default 12 months [common practice]) warns and flags the verdict.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

async function haroldSite35(email: string) {
  const page = await h.newPage();
  await signInAs(page, email);
  await page
    .getByTestId('patients-table')
    .getByRole('link', { name: /Whitcombe/ })
    .click();
  await page.getByTestId('arch-cell-35').click();
  await page.waitForURL(/\/sites\//);
  return page;
}

describe('torque safety', () => {
  it('closes panels on Escape, and warns before an early settling re-torque, saved once confirmed', async () => {
    await h.reset();
    const page = await haroldSite35('ines.calloway@larkspur.example');
    const form = page.getByTestId('torque-form');

    // Escape closes the torque panel, the complication form and an amendment, as a dialog would.
    await page.getByTestId('log-torque-button').click();
    await expect.poll(() => form.count()).toBe(1);
    await screenshot(page, 'site-file-torque-panel-open');
    // The open panel uses the Stack's width (fields in columns), not a narrow column beside empty space.
    const widths = await page.evaluate(() => ({
      panel: document.querySelector('.log-torque__panel')!.getBoundingClientRect().width,
      heading: document.querySelector('.stack .section-heading')!.getBoundingClientRect().width,
      firstRowFields: [...document.querySelectorAll('.torque-form > .bp6-form-group')].filter(
        (el, _i, all) => el.getBoundingClientRect().top === all[0].getBoundingClientRect().top,
      ).length,
    }));
    expect(widths.panel / widths.heading).toBeGreaterThan(0.95);
    expect(widths.firstRowFields).toBeGreaterThan(1);
    await page.keyboard.press('Escape');
    await expect.poll(() => form.count()).toBe(0);
    await page.getByTestId('record-complication').click();
    await expect.poll(() => page.locator('.complication-form').count()).toBe(1);
    await page.keyboard.press('Escape');
    await expect.poll(() => page.locator('.complication-form').count()).toBe(0);
    const torqueEntry = page.locator('[data-testid="timeline-event"][data-kind="torque"]').first();
    await torqueEntry.getByRole('button', { name: 'Amend' }).click();
    await expect.poll(() => page.locator('.amend-form').count()).toBe(1);
    await page.keyboard.press('Escape');
    await expect.poll(() => page.locator('.amend-form').count()).toBe(0);

    // A new seating now, then a settling re-torque a minute later: warned, then confirmed.
    await page.getByTestId('log-torque-button').click();
    await form.getByLabel('Applied torque (N·cm)').fill('25');
    await form.getByLabel('Reason').selectOption('initial-seating');
    await form.getByRole('button', { name: 'Save torque' }).click();
    await expect.poll(() => form.count()).toBe(0);
    await page.getByTestId('log-torque-button').click();
    await form.getByLabel('Applied torque (N·cm)').fill('25');
    await form.getByLabel('Reason').selectOption('re-torque-after-settling');
    await form.getByRole('button', { name: 'Save torque' }).click();
    const warning = page.getByTestId('early-settling-warning');
    await expect.poll(() => warning.count()).toBe(1);
    expect(await warning.textContent()).toMatch(
      /comes less than a minute after the seating, earlier than the about 10 minutes settling takes \(Siamos et al\. 2002\)/,
    );
    await screenshot(page, 'early-settling-warning');
    await warning.getByLabel(/I confirm this early re-torque/).check({ force: true }); // Blueprint draws its own indicator over the input
    await form.getByRole('button', { name: 'Save torque' }).click();
    await expect.poll(() => form.count()).toBe(0);
    const latest = page.locator('[data-testid="timeline-event"][data-kind="torque"]').last();
    await expect.poll(() => latest.textContent()).toMatch(/early re-torque confirmed by the clinician/);
  });

  it('warns about an overdue wrench calibration under the practice interval and flags the verdict', async () => {
    await h.reset();
    const admin = await h.newPage();
    await signInAs(admin, 'odile.park@larkspur.example');
    await admin.getByRole('link', { name: 'Catalogue' }).click();
    await admin.waitForURL(/\/catalogue$/);
    // A calibration date in the future is refused, in plain words.
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    await admin.getByLabel('New calibration date of Spring wrench A (surgery 1)').fill(tomorrow);
    await admin
      .getByRole('row', { name: /Spring wrench A/ })
      .getByRole('button', { name: 'Record calibration' })
      .click();
    await expect.poll(() => admin.getByTestId('calibration-error').textContent()).toMatch(/cannot be in the future/);
    // One month: both demo wrenches (calibrated a month or more ago) are overdue.
    await admin.getByLabel('Calibration interval (months)').fill('1');
    await admin.getByRole('button', { name: 'Save interval' }).click();
    await expect
      .poll(() => admin.getByTestId('wrench-due').allTextContents())
      .toEqual([expect.stringMatching(/overdue/), expect.stringMatching(/overdue/)]);
    await screenshot(admin, 'catalogue-wrench-interval');

    const page = await haroldSite35('ines.calloway@larkspur.example');
    await page.getByTestId('log-torque-button').click();
    const form = page.getByTestId('torque-form');
    await form.getByLabel('Applied torque (N·cm)').fill('25');
    await form.getByLabel('Reason').selectOption('re-torque-at-recall');
    await form.getByLabel('Wrench').selectOption({ index: 1 });
    await expect.poll(() => form.getByTestId('wrench-calibration-overdue').count()).toBe(1);
    expect(await form.getByTestId('wrench-calibration-overdue').textContent()).toMatch(/every 1 month\)/);
    await form.getByRole('button', { name: 'Save torque' }).click();
    await expect.poll(() => form.count()).toBe(0);
    await expect
      .poll(() => page.getByTestId('stack-part').first().getByTestId('calibration-overdue-flag').count())
      .toBe(1);
    await screenshot(page, 'stack-calibration-overdue');
  });
});
