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
    // The demo seed already holds Harold's recall radiographs.
    await page.getByTestId('radiograph-card').first().waitFor();

    // 256 × 256, 16 bits: a bright implant-like bar on a dark ground
    const file = dicomFile({
      rows: 256,
      columns: 256,
      bits: 16,
      photometric: 'MONOCHROME2',
      pixel: (r, c) => (c > 110 && c < 146 && r > 40 && r < 220 ? 3500 : 400 + ((r * 7 + c * 13) % 200)),
      pixelSpacing: [0.06, 0.06],
      studyDate: '20250611',
    });
    await page
      .getByTestId('radiograph-files')
      .setInputFiles({ name: 'lower-left.dcm', mimeType: 'application/dicom', buffer: file });
    await page.getByTestId('radiograph-kind').selectOption('periapical');
    await page.getByRole('checkbox', { name: '35' }).check({ force: true });
    await page.getByTestId('radiograph-upload').click();

    const row = page.getByTestId('upload-row').first();
    await expect.poll(() => row.textContent()).toMatch(/lower-left\.dcm.*\(100 %\)/);
    expect(await row.getByRole('progressbar').count()).toBe(1);
    const card = page.getByTestId('radiograph-card').filter({ hasText: '2025-06-11' });
    await card.waitFor();
    expect(await card.textContent()).toMatch(/Periapical.*2025-06-11/);
    await expect
      .poll(() => card.locator('img').evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth))
      .toBeGreaterThan(0);
    await screenshot(page, 'radiographs-uploaded');
    expect(await seriousA11yViolations(page)).toEqual([]);

    // The viewer: mark the shoulder (row 40, cols 110 and 146), the apex (220, 128), then the first
    // bone contacts 30 px (mesial) and 20 px (distal) below the platform. Harold's implant at 35 is
    // 10 mm long over 180 px: 30 px → 1.67 mm, 20 px → 1.11 mm along the axis.
    await card.getByTestId('open-viewer').click();
    const image = page.getByTestId('viewer-image');
    await expect.poll(() => image.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBe(256);
    const box = (await image.boundingBox())!;
    for (const [markRow, markCol] of [
      [40, 110],
      [40, 146],
      [220, 128],
      [70, 111],
      [60, 145],
    ]) {
      await image.click({ position: { x: (markCol / 256) * box.width, y: (markRow / 256) * box.height } });
    }
    await expect.poll(() => page.getByTestId('measure-step').textContent()).toBe('All points marked');
    await page.getByTestId('save-measurement').click();
    const saved = page.getByTestId('measurements');
    await saved.waitFor();
    expect(await saved.textContent()).toMatch(
      /Mesial 1\.6[6-8] mm, distal 1\.1[0-2] mm from the platform \(implant 10 mm\)/,
    );
    await screenshot(page, 'radiograph-viewer-measured');
    expect(await seriousA11yViolations(page)).toEqual([]);

    // The Site file of 35 shows its thumbnail, which opens the viewer again.
    await page.goto(new URL(page.url()).pathname.replace(/\/radiographs\/.*/, ''));
    await page.getByTestId('arch-cell-35').click();
    const thumb = page.getByTestId('site-radiograph').first();
    await thumb.waitFor();
    await expect
      .poll(() => thumb.locator('img').evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth))
      .toBeGreaterThan(0);
    await thumb.getByRole('link').click();
    await page.getByTestId('viewer-image').waitFor();
  });
});
