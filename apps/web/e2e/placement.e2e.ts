// Recording a placement in a real browser: the Northgate surgeon (Dr Imbert), through the share,
// records Lucía Ferraz's planned 24. The UDI is read live with the domain's parseUdi — the same
// function the server runs. Test data per GS1 General Specifications: GTIN-14 check digit mod 10
// with weights 3/1 from the right (computed with gtinCheckDigit), AIs (01) GTIN, (17) expiry
// YYMMDD, (10) lot in the human-readable form.
import { gtinCheckDigit } from '@torquetrail/domain';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousA11yViolations } from './support/axe.js';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

const GTIN_BASE = '0884521234567';
const GTIN = GTIN_BASE + gtinCheckDigit(GTIN_BASE);
const BAD_GTIN = GTIN_BASE + ((gtinCheckDigit(GTIN_BASE) + 1) % 10);

describe('referring surgeon', () => {
  it('records the placement of a shared planned site with a UDI read live, and sees it in the Site file', async () => {
    const page = await h.newPage();
    await signInAs(page, 'rafael.imbert@northgate.example');
    await page.getByTestId('patient-search').fill('Ferraz');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Ferraz/ })
      .click();
    await page.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    // Sites of a shared patient are planned by its practice: no control for the surgeon.
    await page.getByRole('link', { name: 'Site 24', exact: true }).waitFor();
    expect(await page.getByTestId('add-site').count()).toBe(0);
    await page.getByRole('link', { name: 'Site 24', exact: true }).click();
    await page.waitForURL(/\/sites\/[0-9a-f-]{36}$/);
    await page.getByTestId('record-placement').click();
    await page.waitForURL(/\/placement$/);

    const form = page.getByTestId('placement-form');
    expect(await form.textContent()).toContain('Torque values and compatibility are manufacturer-specific');
    await page.getByLabel('Platform').selectOption({ label: 'Solvra CN 3.5' });
    await page.getByLabel('Implant length (mm)').fill('11.5');

    // A valid UDI: GTIN, lot and expiry shown beside the field, the lot filled.
    const udi = page.getByLabel('UDI (scan or type)');
    await udi.fill(`(01)${GTIN}(17)281231(10)SCN3511-26X`);
    await expect.poll(() => page.getByTestId('udi-gtin').textContent()).toBe(GTIN);
    expect(await page.getByTestId('udi-lot').textContent()).toBe('SCN3511-26X');
    // In the practice's format (day-month-year in the seed), not as the UDI stores it (issue 15 §7).
    expect(await page.getByTestId('udi-expiry').textContent()).toBe('31 Dec 2028');
    expect(await page.getByLabel('Lot', { exact: true }).inputValue()).toBe('SCN3511-26X');
    // A typed lot that differs from the scanned one is flagged beside the lot (checkUdiForPlacement).
    await page.getByLabel('Lot', { exact: true }).fill('SCN3511-26Y');
    await expect.poll(() => page.getByTestId('error-lot').textContent()).toMatch(/differs from the lot in the UDI/);
    await page.getByLabel('Lot', { exact: true }).fill('SCN3511-26X');
    await expect.poll(() => page.getByTestId('error-lot').count()).toBe(0);

    // A mistyped check digit: the error beside the field, at once.
    await udi.fill(`(01)${BAD_GTIN}(17)281231(10)SCN3511-26X`);
    await expect.poll(() => page.getByTestId('error-udi').textContent()).toMatch(/check digit/);
    expect(await page.getByTestId('udi-gtin').count()).toBe(0);
    await screenshot(page, 'placement-udi-error');
    // No serious or critical WCAG 2.1 A/AA violation (axe-core) on the form, errors shown.
    expect(await seriousA11yViolations(page)).toEqual([]);

    // Fixed, with the healing abutment of that platform, then saved.
    await udi.fill(`(01)${GTIN}(17)281231(10)SCN3511-26X`);
    await expect.poll(() => page.getByTestId('error-udi').count()).toBe(0);
    await page.getByLabel('Insertion torque (N·cm)').fill('35');
    await page.getByLabel('Stability (ISQ)').fill('72');
    await page.getByLabel('Loading protocol').selectOption('conventional');
    const closure = page.getByLabel('Healing abutment or cover screw');
    const healing = await closure.locator('option', { hasText: 'Healing abutment' }).getAttribute('value');
    await closure.selectOption(healing);
    await page.getByLabel('Lot of that part').fill('HA4-2611-03');
    await screenshot(page, 'placement-form');
    // Keyboard: Enter in a field submits the form (implicit submission through the Save button).
    await page.getByLabel('Lot of that part').press('Enter');
    await page.waitForURL(/\/sites\/[0-9a-f-]{36}$/);

    const header = page.getByTestId('site-file-header');
    await expect.poll(() => header.textContent()).toContain('Solvra CN 3.5');
    expect(await header.textContent()).toContain('SCN3511-26X');
    expect(await header.textContent()).toContain('Placed');
    await expect.poll(() => page.getByTestId('stack-part').first().textContent()).toContain('Healing abutment 4 mm');
    expect(await page.getByTestId('record-placement').count()).toBe(0);
    await screenshot(page, 'placement-site-file');
    expect(h.problems.filter((p) => !/status of (401|404)/.test(p))).toEqual([]);
  });
});

describe('restorative dentist', () => {
  it('adds a planned site from the Arch, choosing the position in the Universal system', async () => {
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page.getByTestId('patient-search').fill('Ferraz');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Ferraz/ })
      .click();
    await page.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    await page.getByRole('radio', { name: 'Universal' }).click();
    // FDI 36 is Universal 19 (ISO 3950 ↔ ADA Universal, fdiToUniversal).
    const position = page.getByLabel('Add planned site');
    expect(await position.locator('option', { hasText: /^19$/ }).getAttribute('value')).toBe('36');
    await position.selectOption('36');
    expect(await seriousA11yViolations(page)).toEqual([]);
    await page.getByTestId('add-site').getByRole('button', { name: 'Add' }).click();
    await expect.poll(() => page.getByTestId('add-site').textContent()).toContain('Planned site 19 added');
    await expect.poll(() => page.getByRole('link', { name: 'Site 19', exact: true }).count()).toBe(1);
    // A position with a site is no longer offered.
    expect(await position.locator('option[value="36"]').count()).toBe(0);
  });
});
