// Issue 16 item 2 in a real browser: the hygienist logs a retentive-insert change for Beatrix
// Lindqvist (stud overdenture, yearly seeded changes) in the Site file and sees the interval and
// the count move; the Recall desk's insert review filter lists Otto Ravensworth, whose bar has had
// no change since 2021 (review every 12 months [common practice]; maintenance as events per
// patient-year: Cehreli MC et al. 2010 [memory]).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(async () => {
  await h.reset(); // the insert change logged below is this file's own
  await h.close();
});

describe('hygienist at recall', () => {
  it("logs an insert change in Beatrix's Site file, sees the interval; the desk lists the overdue bar", async () => {
    await h.reset();
    const page = await h.newPage();
    await signInAs(page, 'maren.holt@larkspur.example');
    const list = (await (await page.request.get('/api/patients?search=Lindqvist')).json()) as {
      items: { id: string }[];
    };
    const patientId = list.items[0].id;
    const patient = (await (await page.request.get(`/api/patients/${patientId}`)).json()) as {
      sites: { id: string; fdi: number }[];
    };
    const site43 = patient.sites.find((s) => s.fdi === 43)!;
    await page.goto(`/patients/${patientId}/sites/${site43.id}`);
    const interval = page.getByTestId('insert-interval');
    // Seeded: the last change five months ago (demo-overdentures.ts).
    await expect.poll(() => interval.textContent(), { timeout: 15_000 }).toMatch(/^5 months \(\d+ days\) since /);
    expect(await page.getByTestId('insert-last-12').textContent()).toBe('1');

    await page.getByTestId('log-insert-change').click();
    const form = page.getByRole('form', { name: 'Log insert change' });
    await form.getByLabel('Insert taken out').selectOption({ label: 'Retentive insert, strong (strong, 20 N)' });
    // Nothing chosen as the new insert: said beside the field, the other choices kept.
    await form.getByRole('button', { name: 'Save insert change' }).click();
    await expect.poll(() => page.getByTestId('error-newComponentId').count(), { timeout: 15_000 }).toBe(1);
    await form.getByLabel('New insert').selectOption({ label: 'Retentive insert, medium (medium, 13 N)' });
    await form.getByLabel('Reason').selectOption('retention-loss');
    await form.getByLabel('Note (optional)').fill('Denture lifts when eating');
    await form.getByRole('button', { name: 'Save insert change' }).click();

    await expect.poll(() => interval.textContent(), { timeout: 15_000 }).toMatch(/^0 months \(0 days\) since /);
    expect(await page.getByTestId('insert-last-12').textContent()).toBe('2');
    expect(await page.getByTestId('insert-change').first().textContent()).toMatch(
      /Retention lost.*strong \(strong, 20 N\) → Retentive insert, medium \(medium, 13 N\)\. Denture lifts when eating/,
    );
    await expect
      .poll(() => page.locator('[data-testid="timeline-event"][data-kind="insert-change"]').count(), {
        timeout: 15_000,
      })
      .toBeGreaterThan(1);
    await screenshot(page, 'site-file-insert-changes');

    await page.goto('/recalls');
    await page.getByTestId('desk-filter').selectOption('insert-review-overdue');
    const rows = page.getByTestId('recall-desk-table').locator('tbody tr');
    await expect.poll(() => rows.count(), { timeout: 15_000 }).toBe(1);
    expect(await rows.first().textContent()).toMatch(/Otto Ravensworth/);
    expect(await rows.first().getByTestId('desk-insert-review-overdue').textContent()).toMatch(
      /^Overdenture at 12, 14, 22, 24: insert review due .*\(no change since delivery\)$/,
    );
    await screenshot(page, 'recall-desk-insert-review-overdue');
  });
});
