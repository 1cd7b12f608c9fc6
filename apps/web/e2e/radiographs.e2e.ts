// Radiographs in the browser: the hygienist opens the patient's Radiographs tab, uploads a DICOM
// file written by dcmjs, sees its progress and then the server-made thumbnail in the list.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dicomFile } from '../../api/test/support/radiograph-fixtures.js';
import { seriousA11yViolations } from './support/axe.js';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('radiographs', () => {
  it('hygienist uploads a DICOM with its progress shown, and its thumbnail appears', async () => {
    const page = await h.newPage();
    await signInAs(page, 'maren.holt@larkspur.example');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Whitcombe/ })
      .click();
    await page.getByTestId('open-radiographs').click();
    await page.getByRole('heading', { name: 'Radiographs' }).waitFor();
    await page.getByText('No radiographs yet').waitFor();

    // 256 × 256, 16 bits: a bright implant-like bar on a dark ground
    const file = dicomFile({
      rows: 256,
      columns: 256,
      bits: 16,
      photometric: 'MONOCHROME2',
      pixel: (r, c) => (c > 110 && c < 146 && r > 40 && r < 220 ? 3500 : 400 + ((r * 7 + c * 13) % 200)),
      pixelSpacing: [0.05, 0.05],
      studyDate: '20250611',
    });
    await page
      .getByTestId('radiograph-files')
      .setInputFiles({ name: 'lower-left.dcm', mimeType: 'application/dicom', buffer: file });
    await page.getByTestId('radiograph-kind').selectOption('periapical');
    await page.getByTestId('radiograph-upload').click();

    const row = page.getByTestId('upload-row').first();
    await expect.poll(() => row.textContent()).toMatch(/lower-left\.dcm.*\(100 %\)/);
    expect(await row.getByRole('progressbar').count()).toBe(1);
    const card = page.getByTestId('radiograph-card').first();
    await card.waitFor();
    expect(await card.textContent()).toMatch(/Periapical.*2025-06-11/);
    await expect
      .poll(() => card.locator('img').evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth))
      .toBeGreaterThan(0);
    await screenshot(page, 'radiographs-uploaded');
    expect(await seriousA11yViolations(page)).toEqual([]);
  });
});
