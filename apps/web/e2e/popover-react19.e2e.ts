// Blueprint's popover under React 19 (issue 15 §7): opening one must not print React's warning
// about a removed API (element.ref, findDOMNode) or any other console warning.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('Blueprint popover under React 19', () => {
  it('opens and closes the case definitions without a console warning', async () => {
    const page = await h.newPage();
    const messages: string[] = [];
    page.on('console', (msg) => {
      if (msg.type() === 'warning' || msg.type() === 'error') messages.push(`${msg.type()}: ${msg.text()}`);
    });
    await signInAs(page, 'maren.holt@larkspur.example');
    await page.getByRole('link', { name: 'Recall desk' }).click();
    const table = page.getByTestId('recall-desk-table');
    await table.locator('tr', { hasText: 'Wendell Achterberg' }).getByRole('link', { name: 'Record exam' }).click();
    await page.waitForURL('**/recalls/patients/*/exam');
    await page.getByRole('button', { name: 'Case definitions' }).click();
    await expect.poll(() => page.getByTestId('case-definitions').textContent()).toContain('Without a baseline');
    await page.keyboard.press('Escape');
    await expect.poll(() => page.getByTestId('case-definitions').count()).toBe(0);
    expect(messages.filter((m) => !/status of 401/.test(m))).toEqual([]);
  });
});
