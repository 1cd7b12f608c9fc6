// An archived patient leaves the Recall desk (their reminders stop, issue 11) and comes back in
// view with "Show archived", as on the Patients page.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(async () => {
  await h.reset(); // the archive below is this file's own: later files start from the seed
  await h.close();
});

describe('restorative dentist', () => {
  it('archives a patient: gone from the Recall desk, shown again with "Show archived"', async () => {
    await h.reset();
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page.goto('/recalls');
    const table = page.getByTestId('recall-desk-table');
    const farrow = table.locator('tbody tr', { hasText: 'Imogen Farrow' });
    await expect.poll(() => farrow.count()).toBe(1);
    const before = await table.locator('tbody tr').count();

    const list = (await (await page.request.get('/api/patients?search=Farrow')).json()) as { items: { id: string }[] };
    const archived = await page.request.post(`/api/patients/${list.items[0].id}/archive`, {
      data: { reason: 'Moved abroad; records kept' },
    });
    expect(archived.status()).toBe(200);

    await page.reload();
    await expect.poll(() => table.locator('tbody tr').count()).toBe(before - 1);
    expect(await farrow.count()).toBe(0);

    // A click, not check(): the switch follows the URL, which changes a moment after the click.
    await page.getByTestId('desk-show-archived').click({ force: true }); // Blueprint draws its own indicator over the input
    await expect.poll(() => new URL(page.url()).searchParams.get('archived')).toBe('all');
    await expect.poll(() => farrow.count()).toBe(1);
    await expect.poll(() => table.locator('tbody tr').count()).toBe(before);

    // The desk's search filters as the user types, like the Patients search (issue 15 §7): no
    // Enter, no button; the search is kept in the URL.
    await page.locator('#desk-search').pressSequentially('Farrow', { delay: 40 });
    await expect.poll(() => new URL(page.url()).searchParams.get('search')).toBe('Farrow');
    await expect.poll(() => table.locator('tbody tr').count()).toBe(1);
    expect(await farrow.count()).toBe(1);
  });

  it('a page past the end says how many there are and leads back to the last page', async () => {
    await h.reset();
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page.goto('/recalls?page=7');
    const count = page.getByTestId('recall-desk-count');
    await expect.poll(() => count.textContent()).toMatch(/^No patients on this page; \d+ in all\.$/);
    const pager = page.getByRole('navigation', { name: 'Pages of the Recall desk' });
    expect(await pager.getByTestId('page-switcher-position').textContent()).toBe('Page 7 is past the last page, 1');
    expect(await pager.getByRole('button', { name: 'Next' }).isDisabled()).toBe(true);
    await pager.getByRole('button', { name: 'Previous' }).click();
    await expect.poll(() => new URL(page.url()).searchParams.get('page')).toBe('1');
    await expect.poll(() => page.getByTestId('recall-desk-table').locator('tbody tr').count()).toBeGreaterThan(0);
    expect(await pager.getByTestId('page-switcher-position').textContent()).toBe('Page 1 of 1');
  });
});
