// An overdenture on stud attachments in a real browser (issue 16, item 1): Agnes Thornbury's two
// Miravik HX 4.1 implants at 33 and 43 (the two-implant mandibular overdenture of the McGill
// consensus, Feine JS et al. 2002, and the York consensus, Thomason JM et al. 2009 [memory]).
// Plan it, see the attachment's catalogue values with the manufacturer caution, deliver with lot
// numbers and find both attachment abutments in the seat-restoration torque form.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('restorative dentist', () => {
  it('plans and delivers a two-implant overdenture on stud attachments for Agnes Thornbury', async () => {
    await h.reset(); // this test writes: a retry starts from the seed
    const problemsBefore = h.problems.length;
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page.getByTestId('patient-search').fill('Thornbury');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Thornbury/ })
      .click();
    await page.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    await page.goto(`${new URL(page.url()).pathname}/restorations`);
    await page.getByTestId('new-plan').click();
    await page.waitForURL(/\/restorations\/new$/);

    await page.getByTestId('planner-sites').getByLabel(/^33 /).check({ force: true }); // Blueprint draws its own indicator over the input
    await page.getByTestId('planner-sites').getByLabel(/^43 /).check({ force: true });
    await page.getByLabel('Restoration', { exact: true }).selectOption('overdenture-studs');
    await page.getByLabel('Retention').selectOption('screw-to-implant');

    // No attachment chosen yet: an error Finding beside each site's attachment field.
    const missing = page.locator('[data-testid="finding-error"][data-code="attachment-missing"]');
    await expect.poll(() => missing.count()).toBe(2);
    expect(await page.getByTestId('save-plan').isDisabled()).toBe(true);

    for (const fdi of [33, 43]) {
      const site = page.getByTestId(`planner-site-${fdi}`);
      // The demo catalogue's invented stud: 30° between implants, 3 mm collar, shown with the caution.
      await site.getByLabel('Attachment abutment').selectOption({
        label: 'Stud attachment, 3 mm collar [MHX-41-ST3], up to 30° between implants, collar 3 mm, 30 N·cm ±10 %',
      });
      expect(await site.textContent()).toMatch(/manufacturer's instructions/);
      await site.getByLabel(/Retentive insert, medium/).check({ force: true });
    }
    await expect.poll(() => page.getByTestId('no-findings').count()).toBe(1);
    await screenshot(page, 'planner-overdenture-studs');
    await page.getByTestId('save-plan').click();
    await page.waitForURL(/\/restorations$/);

    const card = page.getByTestId('restoration-card').first();
    expect(await card.textContent()).toMatch(/Overdenture on stud attachments/);
    await card.getByTestId('deliver-button').click();
    for (const fdi of [33, 43]) {
      await card.getByLabel(`Lot of Stud attachment, 3 mm collar at ${fdi}`).fill(`ST3-2612-${fdi}`);
      await card.getByLabel(`Lot of Retentive insert, medium at ${fdi}`).fill('RIM-2612');
    }
    await card.getByTestId('record-delivery').click();
    await expect.poll(() => card.getAttribute('data-status')).toBe('delivered');

    // The torque ledger covers the attachment abutments (they carry a torque spec; inserts do not).
    const seat = card.getByTestId('seat-form');
    await expect.poll(() => seat.getByTestId('seat-screw').count(), { timeout: 15_000 }).toBe(2);
    expect(await seat.getByTestId('seat-spec').allTextContents()).toEqual(['30 N·cm ± 10 %', '30 N·cm ± 10 %']);
    await screenshot(page, 'overdenture-seat-form');
    expect(
      h.problems
        .slice(problemsBefore)
        .filter((p) => !/Failed to load resource: the server responded with a status of (401|404)/.test(p)),
    ).toEqual([]);
  });
});
