// Records out in a real browser: the dentist sees the passport, the retrieval card and the FHIR
// export on the patient's page and downloads the passport (a PDF); e-mailing it is offered only
// with the patient's consent, and disabled with the reason without it. The hygienist sees none.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

const openPatient = async (page: Awaited<ReturnType<Harness['newPage']>>, name: RegExp) => {
  await page.getByRole('link', { name }).first().click();
  await page.waitForURL(/\/patients\/[0-9a-f-]+$/);
  await page.getByRole('heading', { name: 'Arch' }).waitFor();
};

describe('records out', () => {
  it('the dentist downloads the passport and e-mails it; the hygienist is offered nothing', async () => {
    await h.reset();
    const dentist = await h.newPage();
    await signInAs(dentist, 'ines.calloway@larkspur.example');
    await openPatient(dentist, /Whitcombe/);
    const panel = dentist.getByRole('region', { name: 'Records for the patient and other clinics' });
    await panel.waitFor();
    const href = await panel.getByTestId('download-passport').getAttribute('href');
    expect(href).toMatch(/\/api\/patients\/[0-9a-f-]+\/passport\.pdf$/);
    const pdf = await dentist.request.get(`${h.baseUrl}${href}`);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toBe('application/pdf');
    expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-');
    await expect.poll(() => panel.getByTestId('download-fhir').count()).toBe(1);
    await expect.poll(() => panel.getByTestId('download-retrieval-card').count()).toBe(1);

    const mail = panel.getByTestId('mail-passport');
    await expect.poll(() => mail.isEnabled()).toBe(true);
    await mail.click();
    await expect
      .poll(() => panel.getByTestId('passport-mail-status').textContent(), { timeout: 20_000 })
      .toMatch(/to harold\.whitcombe@mail\.example: sent/i);
    await screenshot(dentist, 'records-out-dentist');

    const hygienist = await h.newPage();
    await signInAs(hygienist, 'priya.sandhu@larkspur.example');
    await openPatient(hygienist, /Whitcombe/);
    expect(await hygienist.getByRole('region', { name: 'Records for the patient and other clinics' }).count()).toBe(0);
    expect(h.problems.filter((p) => !/status of (401|404)/.test(p))).toEqual([]);
  });

  it('without the patient e-mail consent the button is disabled with the reason', async () => {
    await h.reset();
    const dentist = await h.newPage();
    await signInAs(dentist, 'ines.calloway@larkspur.example');
    await openPatient(dentist, /Okafor/);
    const patientId = /\/patients\/([0-9a-f-]+)$/.exec(dentist.url())![1];
    const withdrawn = await dentist.request.patch(`${h.baseUrl}/api/patients/${patientId}`, {
      data: { emailReminderConsent: false, emailReminderConsentOn: null },
      headers: { Origin: h.baseUrl },
    });
    expect(withdrawn.status()).toBe(200);
    await dentist.reload();
    const panel = dentist.getByRole('region', { name: 'Records for the patient and other clinics' });
    await panel.getByTestId('mail-passport-reason').waitFor();
    expect(await panel.getByTestId('mail-passport').isDisabled()).toBe(true);
    expect(await panel.getByTestId('mail-passport-reason').textContent()).toMatch(
      /The patient has not consented to e-mail/,
    );
    await screenshot(dentist, 'records-out-no-consent');
  });
});
