// A practice's first steps with a new patient, in a real browser: the dentist registers a patient
// with the keyboard (date of birth typed), meets the plain-language errors with nothing lost,
// sees the duplicate warning with the existing patient before saving and saves anyway, plans an
// implant site on the new patient's Arch, then edits the record and reads its History.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousA11yViolations } from './support/axe.js';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('dentist', () => {
  it('adds a patient (duplicate warning, Save anyway), plans a site on their Arch, edits and reads the History', async () => {
    await h.reset();
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    // Harold Whitcombe's date of birth: the new patient shares his family name and birth date.
    const existing = (await (await page.request.get('/api/patients?search=Whitcombe')).json()) as {
      items: { id: string; birthDate: string }[];
    };
    const harold = existing.items[0];

    await page.getByTestId('new-patient').click();
    await page.waitForURL(/\/patients\/new$/);
    // Keyboard only: type, Tab to the next field, Space ticks a box, Enter saves.
    await page.getByLabel('Given name').focus();
    await page.keyboard.type('Augustin');
    await page.keyboard.press('Tab');
    await page.keyboard.type('Whitcombe');
    await page.keyboard.press('Tab');
    await page.keyboard.type(harold.birthDate);
    await page.getByLabel('Consent to e-mail reminders').focus();
    await page.keyboard.press('Space');
    await page.keyboard.press('Enter');
    // Refused by the contract: the messages beside the fields, every value kept.
    await expect.poll(() => page.getByTestId('error-email').textContent()).toMatch(/need an e-mail address/);
    expect(await page.getByTestId('error-emailReminderConsentOn').textContent()).toBe(
      'Enter the date the patient gave consent',
    );
    expect(await page.getByLabel('Given name').inputValue()).toBe('Augustin');
    // The date of birth is the app's date field: typed as YYYY-MM-DD, it is written back in the
    // practice's format (day-month-year in the seed) and kept as typed (issue 15 §7).
    expect(await page.getByLabel('Date of birth').inputValue()).toBe(
      new Date(`${harold.birthDate}T00:00:00Z`).toLocaleDateString('en-GB', {
        day: 'numeric',
        month: 'short',
        year: 'numeric',
        timeZone: 'UTC',
      }),
    );
    await screenshot(page, 'new-patient-errors');

    await page.getByLabel('E-mail', { exact: true }).fill('augustin.w@mail.example');
    await page.getByLabel('Consent given on').fill('2026-01-12');
    await page.getByLabel('Phone').fill('+44 20 7946 0321');
    await page.getByLabel('Phone').press('Enter');
    // Before saving: the existing patient, linked, and the choice to save anyway.
    const warning = page.getByTestId('duplicate-warning');
    await warning.waitFor();
    expect(await warning.getByRole('link').first().getAttribute('href')).toBe(`/patients/${harold.id}`);
    expect(page.url()).toMatch(/\/patients\/new$/);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, 'new-patient-duplicate');
    await page.getByTestId('save-anyway').click();

    // The new patient's Arch: plan an implant site at 36.
    await page.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    await page.getByRole('heading', { name: /Augustin Whitcombe/ }).waitFor();
    await page.getByLabel('Add planned site').selectOption('36');
    await page.getByTestId('add-site').getByRole('button', { name: 'Add' }).click();
    await page.getByRole('status').filter({ hasText: 'Planned site 36 added' }).waitFor();
    await page.getByRole('link', { name: 'Site 36', exact: true }).waitFor();
    await screenshot(page, 'new-patient-arch');

    // Edit the record: the History shows the registration and the change.
    await page.getByTestId('edit-patient').click();
    await page.waitForURL(/\/edit$/);
    await page.getByLabel('Phone').fill('+44 20 7946 0999');
    await page.getByTestId('save-patient').click();
    await expect
      .poll(() => page.getByTestId('patient-history').textContent())
      .toMatch(/Edited.*Phone: \+44 20 7946 0321 → \+44 20 7946 0999/);
    expect(await page.getByTestId('patient-history').textContent()).toMatch(/Registered/);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, 'edit-patient-history');
    // The sign-in page asks who is signed in before anyone is (401); nothing else may fail.
    expect(h.problems.filter((p) => !/status of 401/.test(p))).toEqual([]);
  });
});
