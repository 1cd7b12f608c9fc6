// Automatic logoff in a real browser, with the idle period shortened by configuration
// (SESSION_IDLE_OVERRIDE_S = 12 s: the warning shows 6 s before). The warning's "Stay signed in"
// keeps the session; left alone, the page signs out, says why, and after signing in again returns
// to the same page with what was typed.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../api/src/seed/demo-scenario.js';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness({ SESSION_IDLE_OVERRIDE_S: 12 });
});
afterAll(() => h.close());

describe('idle sign-out', () => {
  it('warns, stays on request, then signs out an idle page and keeps what was typed', async () => {
    const page = await h.newPage();
    await signInAs(page, 'odile.park@larkspur.example');
    await page.goto('/practice/people');
    await page.getByLabel('E-mail').fill('half.typed@larkspur.example');

    const dialog = page.getByRole('dialog', { name: 'Still there?' });
    await dialog.waitFor({ state: 'visible', timeout: 15_000 });
    await screenshot(page, 'idle-warning');
    await dialog.getByRole('button', { name: 'Stay signed in' }).click();
    await dialog.waitFor({ state: 'hidden' });
    expect(page.url()).toMatch(/\/practice\/people$/);

    // Left alone: signed out, with the reason, remembering the page.
    await page.waitForURL('**/sign-in?**', { timeout: 20_000 });
    expect(page.url()).toContain('reason=idle');
    await expect.poll(() => page.getByRole('status').textContent()).toMatch(/not used for a while/);
    expect((await page.request.get('/api/auth/me')).status()).toBe(401);
    await screenshot(page, 'idle-signed-out');

    await page.getByLabel('E-mail').fill('odile.park@larkspur.example');
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL('**/practice/people');
    await expect.poll(() => page.getByLabel('E-mail').inputValue()).toBe('half.typed@larkspur.example');
  });
});
