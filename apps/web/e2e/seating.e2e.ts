// Seating confirmation in the browser (issue 10): the dentist opens Harold Whitcombe's 35, confirms
// the seating of the bridge delivery from its Timeline entry on one of the seeded radiographs, and
// sees the answer in the Stack, linking to that radiograph.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seriousA11yViolations } from './support/axe.js';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('seating confirmation', () => {
  it('dentist confirms the seating of a delivery from its Timeline entry and sees it in the Stack', async () => {
    await h.reset();
    const seen = h.problems.length;
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Whitcombe/ })
      .click();
    await page.getByTestId('arch-cell-35').click();
    await page.waitForURL(/\/sites\//);
    const seating = page.getByTestId('stack-seating');
    await expect.poll(() => seating.textContent()).toBe('Not checked radiographically');

    // Seeded recall radiographs of 35 are in the Timeline with their thumbnails.
    const radiographEntry = page.locator('[data-testid="timeline-event"][data-kind="radiograph"]').first();
    await radiographEntry.waitFor();
    await expect
      .poll(() => radiographEntry.locator('img').evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth))
      .toBeGreaterThan(0);

    const delivery = page.locator('[data-testid="timeline-event"][data-kind="delivery"]');
    await delivery.getByTestId('confirm-seating').click();
    const form = page.getByRole('form', { name: 'Confirm seating at the delivery' });
    await form.waitFor();
    // Nothing chosen: the contract's words, beside the fields, and nothing is sent.
    await form.getByRole('button', { name: 'Save seating check' }).click();
    await form.getByText('Choose the radiograph that shows the seating').waitFor();
    await form.getByText('Say whether the parts are seated: yes, no or unsure').waitFor();

    const choice = form.getByTestId('seating-radiograph').first();
    const chosenText = (await choice.textContent()) ?? '';
    await choice.click();
    await form.getByLabel('Seated', { exact: true }).check();
    await form.getByLabel('Note (optional)').fill('Both copings flush with the platforms');
    await screenshot(page, 'seating-confirm-form');
    expect(await seriousA11yViolations(page)).toEqual([]);
    await form.getByRole('button', { name: 'Save seating check' }).click();
    await form.waitFor({ state: 'detached' });

    await expect.poll(() => seating.textContent()).toMatch(/^Seated radiograph of /);
    // The choice reads "<kind>, <date taken>"; the Stack names the same date.
    const taken = chosenText.split(', ').pop()!;
    expect(taken.length).toBeGreaterThan(5);
    expect(await seating.textContent()).toContain(taken);
    const check = page.locator('[data-testid="timeline-event"][data-kind="seating-check"]');
    await expect.poll(() => check.count()).toBe(1);
    expect(await check.textContent()).toMatch(/Seating at the delivery checked on a radiograph of .*: seated/);
    expect(await delivery.getByTestId('confirm-seating').textContent()).toBe('Amend seating check');
    await screenshot(page, 'seating-confirmed-stack');

    // The Stack links to the radiograph in the viewer.
    await seating.getByRole('link').click();
    await page.getByTestId('viewer-image').waitFor();
    // The sign-in page's session probe answers 401 before signing in; nothing else may fail.
    const unexpected = h.problems.slice(seen).filter((p) => !/responded with a status of 401/.test(p));
    expect(unexpected).toEqual([]);
  });
});
