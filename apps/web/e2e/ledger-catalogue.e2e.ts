// The component catalogue in a real browser: the practice admin corrects a torque specification
// and adds a wrench; the caution that the manufacturer's instructions rule is always shown.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('practice administrator', () => {
  it('edits a torque specification and adds a wrench; a torque out of 1–100 N·cm is refused beside the field', async () => {
    const page = await h.newPage();
    await signInAs(page, 'odile.park@larkspur.example');
    await page.getByRole('link', { name: 'Catalogue' }).click();
    await page.waitForURL(/\/catalogue$/);
    expect(await page.getByTestId('catalogue-caution').textContent()).toMatch(
      /manufacturer's instructions, the clinician's judgement and local regulations rule/,
    );

    const row = page.getByTestId('catalogue-part').filter({ hasText: 'TEX-41-PSI' });
    await row.getByRole('button', { name: 'Edit' }).click();
    await row.getByLabel(/Torque of TEX-41-PSI/).fill('150');
    await row.getByRole('button', { name: 'Save' }).click();
    await expect.poll(() => row.textContent()).toMatch(/At most 100 N·cm/);
    await row.getByLabel(/Torque of TEX-41-PSI/).fill('30');
    await row.getByRole('button', { name: 'Save' }).click();
    await expect.poll(() => row.textContent()).toMatch(/30 N·cm/);

    await page.getByRole('button', { name: 'Add wrench' }).click();
    const form = page.getByRole('form', { name: 'Add wrench' });
    await form.getByLabel('Label').fill('Spring wrench C (hygiene room)');
    await form.getByLabel('Last calibration').fill('2026-11-15');
    await form.getByRole('button', { name: 'Add wrench' }).click();
    await expect.poll(() => page.getByRole('cell', { name: 'Spring wrench C (hygiene room)' }).count()).toBe(1);
    await screenshot(page, 'catalogue-admin');
    expect(h.problems.filter((p) => !/status of (400|401|404)/.test(p))).toEqual([]);
  });
});

describe('catalogue search (issue 15 §7)', () => {
  it('the dentist narrows the catalogue as he types; results stay grouped by system and platform', async () => {
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page.getByRole('link', { name: 'Catalogue' }).click();
    await page.waitForURL(/\/catalogue$/);
    const systems = page.getByTestId('catalogue-system');
    await expect.poll(() => systems.count()).toBe(3);
    // Every word must match: the system, the platform diameter and the kind of part.
    await page.getByTestId('catalogue-search').fill('miravik 4.8 abutment screw');
    await expect.poll(() => systems.count()).toBe(1);
    expect(await systems.first().getByRole('heading', { level: 2 }).textContent()).toMatch(
      /^Miravik HX \(Miravik Implant Systems\) 1 platform, 1 part$/,
    );
    expect(await systems.first().getByTestId('catalogue-platform').count()).toBe(1);
    expect(await page.getByTestId('catalogue-part').count()).toBe(1);
    expect(await page.getByTestId('catalogue-part').textContent()).toMatch(/MHX-48-/);
    expect(await page.getByTestId('catalogue-count').textContent()).toMatch(/^1 part in 1 system match/);
    await page.getByTestId('catalogue-search').fill('zygomatic');
    await expect.poll(() => page.getByTestId('catalogue-no-match').count()).toBe(1);
    expect(await systems.count()).toBe(0);
    await page.getByTestId('catalogue-search').fill('');
    await expect.poll(() => systems.count()).toBe(3);
    await screenshot(page, 'catalogue-search');
    expect(h.problems.filter((p) => !/status of 401/.test(p))).toEqual([]);
  });
});
