// Shares in a real browser (issue 12): the dentist revokes Dr Imbert's open share of Imogen Farrow
// and shares two of her four sites with him, outcomes only; he signs in and sees her under
// Patients with that scope, and on her page only those two sites, without her risk factors.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  process.env.REMINDER_RETRY_DELAY_S = '1';
  h = await startHarness();
});
afterAll(() => h.close());

const SURGEON = 'rafael.imbert@northgate.example';

describe('sharing a patient with a surgeon of another practice', () => {
  it('the dentist shares two sites for outcomes; the surgeon sees only those, without risk factors', async () => {
    await h.reset();
    const dentist = await h.newPage();
    await signInAs(dentist, 'ines.calloway@larkspur.example');
    await dentist.getByRole('link', { name: 'Farrow, Imogen' }).click();
    await dentist.waitForURL('**/patients/*');
    const shares = dentist.getByRole('region', { name: 'Shares' });
    await expect.poll(() => shares.getByTestId('shares-table').textContent()).toMatch(/Rafael Imbert.*Active/);

    // The seeded share opens every site: it ends first.
    await shares.getByRole('button', { name: 'Revoke' }).click();
    await shares.getByLabel('Why the share ends').fill('Replaced by a share of the two distal implants');
    await shares.getByRole('button', { name: 'Revoke now' }).click();
    await expect.poll(() => shares.getByTestId('shares-table').textContent()).toMatch(/Revoked/);

    // The form answers beside its fields before anything is sent.
    await dentist.getByRole('button', { name: 'Share', exact: true }).click();
    await expect.poll(() => dentist.getByTestId('error-surgeonEmail').textContent()).toMatch(/valid e-mail/);
    await expect.poll(() => dentist.getByTestId('error-scopes').textContent()).toMatch(/placement, outcomes or both/);

    await dentist.getByLabel("Surgeon's e-mail").fill(SURGEON);
    // Blueprint draws its own indicator over each input.
    await dentist.getByTestId('share-scope-outcomes').check({ force: true });
    await dentist.getByLabel('Chosen sites').check({ force: true });
    await dentist.getByTestId('share-site-35').check({ force: true });
    await dentist.getByTestId('share-site-45').check({ force: true });
    await dentist.getByLabel('Reason').fill('Follows the tilted distal implants');
    await dentist.getByRole('button', { name: 'Share', exact: true }).click();
    await expect.poll(() => dentist.getByRole('status').textContent()).toMatch(/Shared with .*Northgate/);
    await expect
      .poll(() => shares.getByTestId('shares-table').textContent())
      .toMatch(/Outcomes\s*35, 45.*Follows the tilted distal implants\s*Active/);
    await screenshot(dentist, 'patient-shares');

    const surgeon = await h.newPage();
    await signInAs(surgeon, SURGEON);
    const row = surgeon.getByRole('row', { name: /Farrow, Imogen/ });
    await expect.poll(() => row.textContent()).toMatch(/Larkspur Lane Dental\s*Outcomes$/);
    await row.getByRole('link', { name: 'Farrow, Imogen' }).click();
    await surgeon.waitForURL('**/patients/*');
    const sites = surgeon.getByRole('table', { name: 'Implant sites' });
    await expect
      .poll(async () => (await sites.getByRole('rowheader').allTextContents()).map((t) => t.trim()).sort())
      .toEqual(['Site 35', 'Site 45']);
    // Imogen smokes: a share does not tell the surgeon so.
    expect(await surgeon.getByTestId('patient-risk-factors').count()).toBe(0);
    expect(await surgeon.getByText('Risk factors').count()).toBe(0);
    expect(await surgeon.getByText(/smok/i).count()).toBe(0);
    // Nor does it show him the sharing side.
    expect(await surgeon.getByRole('region', { name: 'Shares' }).count()).toBe(0);
    await screenshot(surgeon, 'surgeon-shared-patient');

    // The Site file of a shared site works with the fields the share leaves out: the Stack and the
    // Timeline show, with no staff name but the placement's signing clinician and no notes.
    const seen = h.problems.length;
    await surgeon.getByTestId('arch-cell-35').click();
    await surgeon.waitForURL(/\/sites\//);
    const events = surgeon.locator('[data-testid="timeline-event"]');
    await expect.poll(() => events.count(), { timeout: 20_000 }).toBeGreaterThan(0);
    const signed = await surgeon
      .locator('[data-testid="timeline-event"]:not([data-kind="placement"]) .timeline__by')
      .count();
    expect(signed).toBe(0);
    expect(await surgeon.getByText(/Amendment:/).count()).toBe(0);
    expect(await surgeon.getByText(/Maren Holt|Priya Sandhu|Odile Park/).count()).toBe(0);
    await screenshot(surgeon, 'surgeon-shared-site-file');
    expect(h.problems.slice(seen).filter((p) => !/\b(401|403|404)\b/.test(p))).toEqual([]);
  });
});
