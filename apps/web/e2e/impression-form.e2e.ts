// Recording an impression from the restoration card in a real browser: on Lucía Ferraz's crown at
// 14 (no impression yet) choose a digital impression, pick a scan body of another platform and
// leave the lot empty: both are named beside their fields and nothing typed is lost; then the
// scan body of the site's platform with its lot saves, and the card shows it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('impression form', () => {
  it('records a digital impression with a scan body of the site platform and its lot', async () => {
    await h.reset();
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page.getByTestId('patient-search').fill('Ferraz');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Ferraz/ })
      .click();
    await page.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    await page.goto(`${new URL(page.url()).pathname}/restorations`);
    const panel = page.getByTestId('impression-panel');
    await panel.getByTestId('open-impression-form').click();
    const form = page.getByTestId('impression-form');
    await form.waitFor();

    const site = form.getByTestId('scan-body-site-14');
    const select = site.getByRole('combobox');
    // A scan body under "Other platforms": the planner's rule names the site and both platforms.
    const other = await select.locator('optgroup[label="Other platforms"] option').first().getAttribute('value');
    await select.selectOption(other);
    await site.getByRole('textbox').fill('');
    await form.getByTestId('record-impression').click();
    await expect.poll(() => site.textContent(), { timeout: 10_000 }).toMatch(/platform; the implant at site 14 is/);
    expect(await select.getAttribute('aria-invalid')).toBe('true');
    await screenshot(page, 'impression-form-platform-error');

    const fits = await select.locator('optgroup').first().locator('option').first().getAttribute('value');
    await select.selectOption(fits);
    await form.getByTestId('record-impression').click();
    await expect
      .poll(() => site.textContent(), { timeout: 10_000 })
      .toMatch(/Record the lot of the scan body at site 14/);
    await site.getByRole('textbox').fill('SB-LOT-7731');
    await form.getByTestId('record-impression').click();

    // Saved: the form closes and the panel shows the recorded impression (not the form's radio label).
    await expect.poll(() => page.getByTestId('impression-form').count(), { timeout: 30_000 }).toBe(0);
    await expect
      .poll(() => panel.textContent(), { timeout: 15_000 })
      .toMatch(/Impression · Digital \(intraoral scan\)/);
    expect(await panel.textContent()).toMatch(/SB-LOT-7731/);
    await screenshot(page, 'impression-form-recorded');
  }, 150_000);
});
