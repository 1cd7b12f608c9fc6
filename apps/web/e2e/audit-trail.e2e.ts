// The audit trail in a real browser (issue 11): the hygienist opens a patient; the practice
// admin then filters Practice → Audit by that patient and sees the opening, with who and when;
// the dentist sees "Who accessed this record" on the patient's own page.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('audit trail', () => {
  it('the admin filters the trail by patient and finds a read made earlier', async () => {
    await h.reset();
    const hygienist = await h.newPage();
    await signInAs(hygienist, 'priya.sandhu@larkspur.example');
    await hygienist
      .getByRole('link', { name: /Ferraz/ })
      .first()
      .click();
    await hygienist.waitForURL(/\/patients\/[0-9a-f-]+$/);
    await hygienist.getByRole('heading', { name: 'Arch' }).waitFor();

    const admin = await h.newPage();
    await signInAs(admin, 'odile.park@larkspur.example');
    await admin.goto(`${h.baseUrl}/practice/audit`);
    await admin.getByRole('heading', { name: 'Audit trail' }).waitFor();
    const patient = admin.getByLabel('Patient');
    await expect.poll(() => patient.locator('option', { hasText: 'LL-1004' }).count()).toBe(1);
    const value = await patient.locator('option', { hasText: 'LL-1004' }).getAttribute('value');
    await patient.selectOption(value ?? '');
    await admin.getByLabel('User').selectOption({ label: 'Priya Sandhu (Dental hygienist)' });
    await admin.waitForURL(/patientId=.*userId=/);
    const rows = admin.getByTestId('audit-row');
    await expect.poll(() => rows.count()).toBeGreaterThan(0);
    const first = await rows.first().textContent();
    expect(first).toMatch(/Priya Sandhu/);
    expect(first).toMatch(/Opened/);
    expect(first).toMatch(/Lucía Ferraz \(LL-1004\)/);
    expect(first).toMatch(/GET \/patients\/:id/);
    await screenshot(admin, 'audit-trail-filtered');

    const dentist = await h.newPage();
    await signInAs(dentist, 'ines.calloway@larkspur.example');
    await dentist.goto(`${h.baseUrl}/patients/${(/patientId=([0-9a-f-]+)/.exec(admin.url()) ?? [])[1]}`);
    await dentist.getByTestId('show-access-log').click();
    const log = dentist.getByRole('region', { name: 'Who accessed this record' });
    await expect
      .poll(() => log.getByTestId('audit-row').filter({ hasText: 'Priya Sandhu' }).count())
      .toBeGreaterThan(0);
    await screenshot(dentist, 'audit-patient-access-log');
    expect(h.problems.filter((p) => !/status of (401|404)/.test(p))).toEqual([]);
  });
});
