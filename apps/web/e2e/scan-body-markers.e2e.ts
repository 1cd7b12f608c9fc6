// Scan bodies marked on the mesh, in a real browser: Wendell Achterberg's seeded scan file shows a
// labelled pin on each scan body; the dentist moves the marker of 15 by clicking the surface (three's
// Raycaster), saves, reloads and sees the pin where it was put. Keyboard: focusing a scan body in
// the legend highlights its pin and turns the camera to it.
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

async function openDemoScan(page: Page) {
  const panel = page.getByTestId('impression-panel');
  await panel.waitFor();
  await panel
    .getByRole('listitem')
    .filter({ hasText: 'upper-right-15-16.stl' })
    .getByRole('button', { name: 'Preview in 3D' })
    .click();
  const preview = page.getByTestId('scan-preview');
  await expect.poll(() => preview.getAttribute('data-state'), { timeout: 20_000 }).toBe('ready');
  return preview;
}

describe('scan-body markers', () => {
  it('shows the seeded pins, places one by clicking the mesh, and keeps it after a reload', async () => {
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
    let preview = await openDemoScan(page);
    const pin = (fdi: number) => preview.locator(`[data-testid="scan-body-pin"][data-fdi="${fdi}"]`);
    await expect.poll(() => preview.getByTestId('scan-body-pin').count(), { timeout: 10_000 }).toBe(2);
    expect(await pin(15).textContent()).toBe('15 (FDI)');
    expect(await pin(15).getAttribute('data-point')).toBe('4.50 0.00 16.00');

    // Keyboard: focusing 16 in the legend highlights its pin and turns the camera to it.
    const canvas = preview.getByTestId('scan-preview-canvas');
    const pixels = () => canvas.evaluate((c: HTMLCanvasElement) => c.toDataURL());
    const before = await pixels();
    await preview.getByRole('button', { name: /^Site 16: .*marked on the scan: show it/ }).focus();
    await expect.poll(() => pin(16).getAttribute('class')).toMatch(/scan-preview__pin--active/);
    expect(await preview.getByTestId('scan-body-row-16').getAttribute('class')).toMatch(/--active/);
    await expect.poll(pixels).not.toBe(before);
    await screenshot(page, 'scan-markers-focus-16');

    // Move 15: choose it, then click the middle of the canvas. The camera was turned, so face the
    // scan from above again first (the view at opening), by reopening the preview.
    await page.reload();
    preview = await openDemoScan(page);
    await preview.getByRole('button', { name: 'Move the marker of site 15' }).click();
    const box = (await canvas.boundingBox())!;
    await page.mouse.click(box.x + box.width / 2, box.y + box.height / 2);
    // The ridge's top, between the two scan bodies (file coordinates: the mesh is not re-centred).
    await expect.poll(() => pin(15).getAttribute('data-point')).toBe('0.00 0.00 6.00');
    await preview.getByTestId('save-scan-markers').click();
    await expect.poll(() => preview.getByTestId('save-scan-markers').count(), { timeout: 15_000 }).toBe(0);

    await page.reload();
    preview = await openDemoScan(page);
    await expect.poll(() => pin(15).getAttribute('data-point'), { timeout: 10_000 }).toBe('0.00 0.00 6.00');
    expect(await pin(16).getAttribute('data-point')).toBe('-4.50 0.00 16.00');
    await screenshot(page, 'scan-markers-moved-15');
    // The sign-in page's first look for a session is a 401; nothing else may go wrong.
    expect(h.problems.filter((p) => !/status of 401/.test(p))).toEqual([]);
  }, 150_000);
});
