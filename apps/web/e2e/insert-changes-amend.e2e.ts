// Issue 16 item 2 in a real browser: a change logged with the wrong strength is amended on the
// insert changes card (the reason is required, said beside the field; Enter saves), and the card,
// the Stack and the Timeline follow: the Stack holds the right insert, the Timeline keeps the first
// version marked amended with the wrongly fitted insert entered in error, and charts the changes
// per year. Strengths come from the practice's catalogue (manufacturer-specific values).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(async () => {
  await h.reset(); // the amendment below is this file's own
  await h.close();
});

describe('dentist corrects an insert change', () => {
  it("amends the strength of Beatrix's last change at 33 and sees the card, the Stack and the Timeline follow", async () => {
    await h.reset();
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    const list = (await (await page.request.get('/api/patients?search=Lindqvist')).json()) as {
      items: { id: string }[];
    };
    const patientId = list.items[0].id;
    const patient = (await (await page.request.get(`/api/patients/${patientId}`)).json()) as {
      sites: { id: string; fdi: number }[];
    };
    const site33 = patient.sites.find((s) => s.fdi === 33)!;
    await page.goto(`/patients/${patientId}/sites/${site33.id}`);

    // Seeded: strong inserts since the last change five months ago; no torque applies to an insert.
    const insertCard = page.getByTestId('stack-part').filter({ hasText: 'Retentive insert' });
    await expect.poll(() => insertCard.locator('h3').textContent(), { timeout: 15_000 }).toMatch(/strong$/);
    expect(await insertCard.getByTestId('torque-not-applicable').textContent()).toMatch(
      /^Torque does not apply to a retentive insert/,
    );
    expect(await insertCard.textContent()).not.toMatch(/hand-tight|None recorded/);

    const latest = page.getByTestId('insert-change').first();
    await latest.getByRole('button', { name: /^Amend the insert change of / }).click();
    const form = latest.getByRole('form', { name: 'Amend this entry' });
    await form.getByLabel('New insert').selectOption({ label: 'Retentive insert, medium (medium, 13 N)' });
    // No reason given: said beside the field, the choice kept.
    await form.getByRole('button', { name: 'Save amendment' }).click();
    await expect
      .poll(() => form.getByTestId('error-amendmentReason').textContent(), { timeout: 15_000 })
      .toBe('Say why the entry is amended');
    expect(await form.getByLabel('New insert').inputValue()).not.toBe('');
    // From the keyboard: type the reason and press Enter.
    await form.getByLabel('Reason for the amendment').fill('Medium inserts were fitted; strong was a slip');
    await form.getByLabel('Reason for the amendment').press('Enter');

    await expect
      .poll(() => page.getByTestId('insert-change').first().textContent(), { timeout: 15_000 })
      .toMatch(
        /→ Retentive insert, medium \(medium, 13 N\) \(amended record: Medium inserts were fitted; strong was a slip\)/,
      );
    await expect.poll(() => insertCard.locator('h3').textContent(), { timeout: 15_000 }).toMatch(/medium$/);
    expect(await page.getByTestId('stack-part').filter({ hasText: 'Retentive insert' }).count()).toBe(1);

    // The Timeline: one entry per change (no separate part entries), the first version marked amended
    // with the wrongly fitted insert entered in error; the chart counts the changes per year.
    const changes = page.locator('[data-testid="timeline-event"][data-kind="insert-change"]');
    const corrected = changes.filter({ hasText: 'entered in error in the Stack, corrected by the amendment' });
    await expect.poll(() => corrected.count(), { timeout: 15_000 }).toBe(1);
    expect(await corrected.textContent()).toMatch(/amended \(superseded by a later version\)/);
    expect(
      await page
        .locator('[data-testid="timeline-event"][data-kind="part"]')
        .filter({ hasText: /Removed: Retentive insert|Replacement installed: Retentive insert/ })
        .count(),
    ).toBe(0);
    const years = page.getByTestId('insert-change-year');
    await expect.poll(() => years.count(), { timeout: 15_000 }).toBeGreaterThan(5);
    await expect.poll(() => page.getByTestId('insert-change-chart').locator('svg').count()).toBeGreaterThan(0);
    await screenshot(page, 'insert-change-amended');

    // The Timeline's current entry links to its amend form on the card.
    await changes
      .filter({ hasText: 'Insert change (amended record)' })
      .getByTestId('timeline-amend-insert-change')
      .click();
    await expect
      .poll(() => page.getByTestId('insert-change').first().getByRole('form', { name: 'Amend this entry' }).count(), {
        timeout: 15_000,
      })
      .toBe(1);
    await page.keyboard.press('Escape');
    await expect.poll(() => page.getByRole('form', { name: 'Amend this entry' }).count()).toBe(0);
  });
});
