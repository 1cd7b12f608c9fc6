// Sharing with a surgeon new to Torquetrail, in a real browser (issue 12, item 1): the dentist
// shares two of Imogen Farrow's sites with an address that has no account; the share shows as
// invited; the invitation goes through the job queue to the SMTP catcher; the surgeon opens the
// link in a browser of their own, names their practice, signs in and sees Imogen's two sites.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freshEmail, linkMailedTo } from '../../api/test/support/people.js';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  process.env.REMINDER_RETRY_DELAY_S = '1';
  h = await startHarness();
});
afterAll(() => h.close());

const PASSWORD = 'Estuary beacon 2291';

describe('sharing with a surgeon new to Torquetrail', () => {
  it('the dentist shares with a new address; the surgeon signs up from the mail and sees the patient', async () => {
    await h.reset();
    const email = freshEmail('noor.halvorsen', 'saltmarsh.example');
    const dentist = await h.newPage();
    await signInAs(dentist, 'ines.calloway@larkspur.example');
    await dentist.getByRole('link', { name: 'Farrow, Imogen' }).click();
    await dentist.waitForURL('**/patients/*');
    const shares = dentist.getByRole('region', { name: 'Shares' });

    await dentist.getByLabel("Surgeon's e-mail").fill(email);
    await dentist.getByTestId('share-scope-outcomes').check({ force: true });
    await dentist.getByLabel('Chosen sites').check({ force: true });
    await dentist.getByTestId('share-site-35').check({ force: true });
    await dentist.getByTestId('share-site-45').check({ force: true });
    await dentist.getByLabel('Reason').fill('Referred for the distal implants');
    await dentist.getByRole('button', { name: 'Share', exact: true }).click();
    await expect.poll(() => dentist.getByRole('status').textContent()).toMatch(/invited by e-mail/);
    await expect
      .poll(() => shares.getByTestId('shares-table').textContent())
      .toMatch(new RegExp(`${email.replace(/\./g, '\\.')}.*Invited to Torquetrail.*35, 45.*Invited`));
    await screenshot(dentist, 'patient-shares-invited');

    const { origin, page, token } = await linkMailedTo(email);
    expect(origin).toBe(h.baseUrl);
    const surgeon = await h.newPage();
    await surgeon.goto(`/${page}#token=${token}`);
    await expect
      .poll(() => surgeon.getByRole('heading', { level: 1 }).textContent())
      .toBe('Larkspur Lane Dental shared a patient with you');
    await surgeon.getByLabel('Your name, as colleagues see it').fill('Dr Noor Halvorsen');
    await surgeon.getByLabel('Password').fill(PASSWORD);
    await surgeon.getByRole('button', { name: 'Create my account' }).click();
    // The practice's name is asked for beside its field before anything is sent.
    await expect.poll(() => surgeon.getByTestId('error-practiceName').textContent()).toMatch(/name of your practice/);
    await surgeon.getByLabel("Your practice's name").fill('Saltmarsh Oral Surgery');
    await surgeon.getByRole('button', { name: 'Create my account' }).click();
    await expect.poll(() => surgeon.getByRole('status').textContent()).toMatch(/Your account is ready/);

    await surgeon.getByRole('link', { name: 'Sign in' }).click();
    await surgeon.getByLabel('E-mail').fill(email);
    await surgeon.getByLabel('Password').fill(PASSWORD);
    await surgeon.getByRole('button', { name: 'Sign in' }).click();
    await surgeon.waitForURL('**/patients**');
    const row = surgeon.getByRole('row', { name: /Farrow, Imogen/ });
    await expect.poll(() => row.textContent()).toMatch(/Larkspur Lane Dental\s*Outcomes$/);
    await row.getByRole('link', { name: 'Farrow, Imogen' }).click();
    await surgeon.waitForURL('**/patients/*');
    const sites = surgeon.getByRole('table', { name: 'Implant sites' });
    await expect
      .poll(async () => (await sites.getByRole('rowheader').allTextContents()).map((t) => t.trim()).sort())
      .toEqual(['Site 35', 'Site 45']);
    await screenshot(surgeon, 'invited-surgeon-patient');

    await dentist.reload();
    await expect
      .poll(() => dentist.getByRole('region', { name: 'Shares' }).getByTestId('shares-table').textContent())
      .toMatch(/Dr Noor Halvorsen.*Saltmarsh Oral Surgery.*Active/);
  });
});
