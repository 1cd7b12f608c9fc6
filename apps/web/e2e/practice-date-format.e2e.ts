// The practice's date format in a real browser (issue 15 §7): the administrator switches it to
// month-day-year; a dentist then sees dates in that order, types 01/02/2026 as 2 January, is told
// in plain words why 02/30/2026 is no date, and picks a day from the calendar with the keyboard
// (the week starting on Sunday where the month comes first [common practice]).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('the practice date format', () => {
  it('the admin switches to month-day-year; a dentist sees, types and picks dates in it', async () => {
    await h.reset();
    const admin = await h.newPage();
    await signInAs(admin, 'odile.park@larkspur.example');
    await admin.goto('/practice/sign-in');
    // Blueprint draws the radio's indicator over the input: a person clicks the label.
    await admin.locator('label', { hasText: 'Month, day, year' }).click();
    expect(await admin.getByLabel(/^Month, day, year/).isChecked()).toBe(true);
    await admin.getByRole('button', { name: 'Save' }).click();
    await expect.poll(() => admin.getByRole('status').textContent()).toMatch(/Saved/);
    await screenshot(admin, 'practice-date-format-setting');

    const page = await h.newPage();
    const warnings: string[] = [];
    page.on('console', (msg) => {
      if (msg.type() === 'warning' || msg.type() === 'error') warnings.push(`${msg.type()}: ${msg.text()}`);
    });
    await signInAs(page, 'ines.calloway@larkspur.example');
    // Shown: the date of birth in the patients list, month first (Harold Whitcombe was born on 17 April).
    await page.getByTestId('patient-search').fill('Whitcombe');
    const row = page.getByTestId('patients-table').locator('tr', { hasText: 'Whitcombe' });
    await expect.poll(() => row.textContent()).toMatch(/Apr 17, \d{4}/);
    expect(await row.textContent()).not.toMatch(/17 Apr \d{4}/);

    await row.getByRole('link', { name: /Whitcombe/ }).click();
    await page.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    const patientUrl = page.url();
    // The patient form's date of birth is the app's date field: shown and typed month first.
    await page.goto(`${patientUrl}/edit`);
    const birth = page.getByLabel('Date of birth');
    await expect.poll(() => birth.inputValue()).toMatch(/^Apr 17, \d{4}$/);
    await birth.fill('04/18/1961');
    await birth.press('Tab');
    expect(await birth.inputValue()).toBe('Apr 18, 1961');
    await birth.fill('13/18/1961');
    await page.getByTestId('save-patient').click();
    await expect
      .poll(() => page.getByTestId('error-birthDate').textContent())
      .toBe('There is no month 13: months go from 1 to 12');
    expect(await birth.inputValue()).toBe('13/18/1961');
    await page.goto(patientUrl);
    await page.getByTestId('arch-cell-35').click();
    await page.waitForURL(/\/sites\//);
    await page.getByTestId('record-complication').click();
    const date = page.getByLabel('Date', { exact: true });
    expect(await date.getAttribute('placeholder')).toContain('03/12/2026');

    // Typed: 01/02/2026 is 2 January here; on leaving the field it is written month first.
    await date.fill('01/02/2026');
    await date.press('Tab');
    expect(await date.inputValue()).toBe('Jan 2, 2026');

    // Refused in plain words beside the field, what was typed kept.
    await date.fill('02/30/2026');
    await page.getByRole('button', { name: 'Save complication' }).click();
    const error = page.getByTestId('error-occurredOn');
    await expect.poll(() => error.textContent()).toBe('There is no such day: February 2026 has 28 days');
    expect(await date.inputValue()).toBe('02/30/2026');

    // Picked: the calendar opens from the keyboard on the typed day's month, the week from Sunday.
    await date.fill('01/02/2026');
    await date.press('Tab');
    const button = page.getByRole('button', { name: 'Choose the date on a calendar' });
    expect(await page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe(
      'Choose the date on a calendar',
    );
    await page.keyboard.press('Enter');
    const calendar = page.locator('.bp6-datepicker');
    await expect.poll(() => calendar.count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => calendar.locator('.rdp-head_cell').first().textContent()).toMatch(/^Su/);
    await screenshot(page, 'practice-date-format-calendar');
    // Focus is on the chosen day (2 January); a week down is 9 January, taken with Enter.
    await expect
      .poll(() => page.evaluate(() => document.activeElement?.classList.contains('rdp-day_selected')), {
        timeout: 5_000,
      })
      .toBe(true);
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('Enter');
    await expect.poll(() => calendar.count()).toBe(0);
    expect(await date.inputValue()).toBe('Jan 9, 2026');

    // Escape closes the calendar only; the complication form stays open.
    await button.click();
    await expect.poll(() => calendar.count(), { timeout: 15_000 }).toBe(1);
    await page.keyboard.press('Escape');
    await expect.poll(() => calendar.count()).toBe(0);
    expect(await page.locator('.complication-form').count()).toBe(1);

    // Saved and shown on the Timeline month first.
    await page.getByRole('button', { name: 'Save complication' }).click();
    await expect.poll(() => page.locator('.complication-form').count(), { timeout: 15_000 }).toBe(0);
    const events = page.locator('[data-testid="timeline-event"][data-kind="complication"]');
    await expect
      .poll(() => events.allTextContents(), { timeout: 10_000 })
      .toContainEqual(expect.stringContaining('Jan 9, 2026'));
    // Every date the Timeline shows is month first, the words the API writes too (the torque
    // charts' captions "installed …", a placement's UDI expiry, a radiograph's day): none is
    // left as the stored YYYY-MM-DD.
    const timeline = page.getByTestId('timeline');
    await expect.poll(() => timeline.getByTestId('torque-chart').count(), { timeout: 10_000 }).toBeGreaterThan(0);
    const captions = await timeline.locator('[data-testid="torque-chart"] figcaption').allTextContents();
    expect(captions.join(' ')).toMatch(/installed [A-Z][a-z]{2} \d{1,2}, \d{4}/);
    expect((await timeline.textContent())?.match(/\b\d{4}-\d{2}-\d{2}\b/g) ?? []).toEqual([]);
    expect(warnings.filter((m) => !/status of (400|401)/.test(m))).toEqual([]);
  }, 180_000);
});
