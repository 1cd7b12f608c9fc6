// Paper that identifies its patient: each page with patient data, printed by the browser (here
// page.pdf(), Chromium's own print to PDF), carries the patient's name, chart number and date of
// birth, the practice, the printing user and the print date on every printed page; buttons and
// forms are not printed. The PDF is read back page by page with pdf-parse.
import { PDFParse } from 'pdf-parse';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

async function printedPages(page: Page): Promise<string[]> {
  await page.emulateMedia({ media: 'print' });
  const pdf = await page.pdf({ format: 'A4', printBackground: true });
  await page.emulateMedia({ media: 'screen' });
  const parser = new PDFParse({ data: pdf });
  try {
    return (await parser.getText()).pages.map((p) => p.text.replace(/\s+/g, ' '));
  } finally {
    await parser.destroy();
  }
}

/** What every printed page of Harold Whitcombe's record must say of itself. */
async function expectFramed(page: Page, what: string, pages: string[], minimumPages = 1) {
  expect(pages.length, what).toBeGreaterThanOrEqual(minimumPages);
  const today = new Date();
  const year = String(today.getFullYear());
  pages.forEach((text, n) => {
    const where = `${what}, printed page ${n + 1} of ${pages.length}`;
    expect(text, where).toMatch(/Harold Whitcombe · chart LL-1001 · born \d{1,2} \w{3} 19\d\d/);
    expect(text, where).toContain('Larkspur Lane Dental');
    expect(text, where).toMatch(new RegExp(`Printed by Dr Ines Calloway on .*${year}`));
    // No navigation and no controls on paper.
    expect(text, where).not.toContain('Sign out');
  });
  // Nothing a person clicks is visible in print.
  await page.emulateMedia({ media: 'print' });
  const visibleControls = await page
    .locator('button, form, .bp6-button, input, select, textarea')
    .evaluateAll((els) => els.filter((e) => e.checkVisibility()).map((e) => e.outerHTML.slice(0, 120)));
  expect(visibleControls, what).toEqual([]);
  await page.emulateMedia({ media: 'screen' });
}

describe('printed pages', () => {
  it('the Arch, a Site file, the restorations and the recall exam say whose they are on every page', async () => {
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page
      .getByRole('link', { name: /Whitcombe/ })
      .first()
      .click();
    await page.waitForURL(/\/patients\/[0-9a-f-]+$/);
    await page.getByRole('heading', { name: 'Arch' }).waitFor();
    const patientPath = new URL(page.url()).pathname;
    await page.getByTestId('print-patient').waitFor({ state: 'attached' });
    await expectFramed(page, 'Arch', await printedPages(page));

    await page.goto(`${patientPath}/restorations`);
    await page.getByTestId('print-patient').waitFor({ state: 'attached' });
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    await expectFramed(page, 'Restorations and lab prescriptions', await printedPages(page));

    await page.goto(patientPath);
    await page.getByRole('heading', { name: 'Arch' }).waitFor();
    await page.locator('a[href*="/sites/"]').first().click();
    await page.waitForURL(/\/sites\/[0-9a-f-]+$/);
    await page.getByTestId('print-patient').waitFor({ state: 'attached' });
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    // The Site file with its Timeline runs over several sheets: the frame is on each of them.
    await expectFramed(page, 'Site file', await printedPages(page), 2);
    await screenshot(page, 'print-site-file-screen');

    await page.goto(`/recalls${patientPath}/exam`);
    await page.getByTestId('print-patient').waitFor({ state: 'attached' });
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    await expectFramed(page, 'Recall exam', await printedPages(page));
    expect(h.problems.filter((p) => !/status of (401|404)/.test(p))).toEqual([]);
  });

  it('the recall desk prints the practice, the user and the date without a patient frame', async () => {
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page.goto('/recalls');
    await page.getByRole('heading', { level: 1 }).first().waitFor();
    const pages = await printedPages(page);
    expect(pages.length).toBeGreaterThanOrEqual(1);
    for (const text of pages) {
      expect(text).toContain('Larkspur Lane Dental');
      expect(text).toMatch(/Printed by Dr Ines Calloway on /);
      expect(text).not.toContain('Sign out');
    }
  });
});

describe('the practice contact', () => {
  it('the administrator sets address, phone and e-mail; a wrong e-mail is refused beside the field', async () => {
    await h.reset();
    const admin = await h.newPage();
    await signInAs(admin, 'odile.park@larkspur.example');
    await admin.goto('/practice/contact');
    await admin.getByRole('heading', { name: 'Practice contact' }).waitFor();
    await admin.getByLabel('Address').fill('ul. Żółkiewskiego 7\n90-001 Łódź');
    await admin.getByLabel('Phone').fill('+48 42 555 01 23');
    await admin.getByLabel('E-mail').fill('not an address');
    await admin.getByRole('button', { name: 'Save' }).click();
    await admin.getByTestId('error-email').waitFor();
    await admin.getByLabel('E-mail').fill('recepcja@larkspur-lane.example');
    await admin.getByRole('button', { name: 'Save' }).click();
    await admin.getByRole('status').filter({ hasText: 'Saved' }).waitFor();
    const saved = await admin.request.get(`${h.baseUrl}/api/practice/contact`);
    expect(await saved.json()).toEqual({
      name: 'Larkspur Lane Dental',
      address: 'ul. Żółkiewskiego 7\n90-001 Łódź',
      phone: '+48 42 555 01 23',
      email: 'recepcja@larkspur-lane.example',
    });
    await screenshot(admin, 'practice-contact');
  });
});
