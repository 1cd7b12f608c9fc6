// How the implants do, the lot look-up and the referral summary in a real browser: the dentist
// opens the outcomes page (curve, number at risk, the audit caution), finds Harold's implants by
// pasting the UDI of their label, and e-mails Harold's referral summary to the shared surgeon.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('outcomes, lot look-up and referral summary', () => {
  it('the dentist reads the curve, traces a lot from a UDI and sends a referral summary', async () => {
    await h.reset();
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page.getByRole('link', { name: 'Outcomes' }).click();
    await page.getByRole('heading', { name: 'How the implants do' }).waitFor();
    expect(await page.getByTestId('audit-note').textContent()).toMatch(/practice audit/);
    await page.getByTestId('survival-chart').waitFor();
    const atRisk = page.getByTestId('number-at-risk');
    expect(await atRisk.locator('tbody tr', { hasText: 'Solvra CN' }).count()).toBe(1);
    expect(await page.locator('.survival-chart path.recharts-line-curve').count()).toBeGreaterThan(0);
    expect(await page.getByTestId('outcomes-table').textContent()).toMatch(/Failed/);
    await screenshot(page, 'outcomes-survival-curve');

    // The list comes a page at a time; a page past the end says so and leads back.
    const count = page.getByTestId('outcomes-count');
    const listed = await page.getByTestId('outcomes-table').locator('tbody tr').count();
    expect(await count.textContent()).toBe(`Implants 1–${listed} of ${listed}, oldest placement first.`);
    await page.goto(`${new URL(page.url()).origin}/outcomes?page=2`);
    await expect.poll(() => count.textContent()).toBe(`No implants on this page; ${listed} in all.`);
    await page.getByTestId('survival-chart').waitFor();
    const pager = page.getByRole('navigation', { name: 'Pages of implants' });
    expect(await pager.getByTestId('page-switcher-position').textContent()).toBe('Page 2 is past the last page, 1');
    await pager.getByRole('button', { name: 'Previous' }).click();
    await expect.poll(() => count.textContent()).toBe(`Implants 1–${listed} of ${listed}, oldest placement first.`);
    expect(new URL(page.url()).searchParams.get('page')).toBe('1');
    // Regrouped, the curves are named by retention, never the systems' curves under the new names.
    await page.getByLabel('Curves by').selectOption('retention');
    await expect.poll(() => atRisk.locator('tbody tr', { hasText: 'Solvra CN' }).count()).toBe(0);
    expect(await atRisk.textContent()).toMatch(/Screw/i);

    await page.getByRole('link', { name: 'Lot look-up' }).click();
    await page.getByLabel('Look up by').selectOption('udi');
    await page.getByLabel('Pasted UDI').fill('(01)09506012345012(17)170228(10)SCN4310-12A07');
    await page.getByRole('button', { name: 'Look up' }).click();
    const table = page.getByTestId('lot-lookup-table');
    await table.waitFor();
    await expect.poll(() => table.locator('tbody tr').count()).toBe(3);
    expect(await table.textContent()).toMatch(/Removed/);
    await screenshot(page, 'lot-lookup-udi');

    await table.getByRole('link', { name: 'Harold Whitcombe' }).first().click();
    const panel = page.getByTestId('referral-summary');
    await panel.getByRole('button', { name: /E-mail it to Dr Rafael Imbert/ }).dblclick();
    const mails = page.getByTestId('referral-mails');
    await expect.poll(() => mails.locator('li').count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(async () => mails.textContent(), { timeout: 20_000 }).toMatch(/Sent/);
  });
});
