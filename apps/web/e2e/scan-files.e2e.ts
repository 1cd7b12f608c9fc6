// A digital impression's scan file in a real browser: on Wendell Achterberg's seeded plan (a
// digital impression with scan bodies at 15 and 16), upload a small STL made here with the
// progress bar, open the 3D preview (three, loaded lazily) and drag to rotate: the canvas changes.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

/** A binary STL of an invented wedge, made here: 80-byte header, count, 50 bytes per triangle. */
function wedgeStl(): Buffer {
  const v = [
    [0, 0, 0],
    [12, 0, 0],
    [0, 9, 0],
    [0, 0, 7],
  ];
  const faces = [
    [0, 2, 1],
    [0, 1, 3],
    [0, 3, 2],
    [1, 2, 3],
  ];
  const b = Buffer.alloc(84 + 50 * faces.length);
  b.writeUInt32LE(faces.length, 80);
  faces.forEach((f, n) =>
    f.forEach((i, k) => v[i].forEach((c, j) => b.writeFloatLE(c, 84 + 50 * n + 12 + 12 * k + 4 * j))),
  );
  return b;
}

describe('scan files', () => {
  it('uploads an STL with a progress bar and rotates it in the 3D preview', async () => {
    await h.reset();
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page.getByTestId('patient-search').fill('Achterberg');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Achterberg/ })
      .click();
    await page.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    await page.goto(`${new URL(page.url()).pathname}/restorations`);
    const panel = page.getByTestId('impression-panel');
    await panel.waitFor();
    expect(await panel.textContent()).toMatch(/Digital \(intraoral scan\)/);
    expect(await panel.textContent()).toMatch(/SBX41-2615/);
    await panel.getByLabel('Scan file').setInputFiles({ name: 'wedge.stl', mimeType: 'model/stl', buffer: wedgeStl() });
    const bar = page.getByRole('progressbar', { name: 'Upload of wedge.stl' });
    await bar.waitFor();
    await expect.poll(() => panel.getByText('wedge.stl ·').count(), { timeout: 15_000 }).toBe(1);
    expect(await bar.getAttribute('aria-valuenow')).toBe('100');

    await panel
      .getByRole('listitem')
      .filter({ hasText: 'wedge.stl' })
      .getByRole('button', { name: 'Preview in 3D' })
      .click();
    await expect
      .poll(() => page.getByTestId('scan-preview').getAttribute('data-state'), { timeout: 20_000 })
      .toBe('ready');
    const canvas = page.getByTestId('scan-preview').locator('canvas');
    const pixels = () => canvas.evaluate((c: HTMLCanvasElement) => c.toDataURL());
    const before = await pixels();
    const box = (await canvas.boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width / 2 + 120, box.y + box.height / 2 + 40, { steps: 8 });
    await page.mouse.up();
    await expect.poll(pixels).not.toBe(before);
    await screenshot(page, 'scan-file-3d-preview');
  });
});
