// Practice → People in a real browser: the practice administrator invites a hygienist; the
// invitation goes through the job queue to the real SMTP catcher; the hygienist opens the mailed
// link in a browser of their own, chooses a name and password (a weak one first), and signs in.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freshEmail, linkMailedTo } from '../../api/test/support/people.js';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  process.env.REMINDER_RETRY_DELAY_S = '1';
  h = await startHarness();
});
afterAll(() => h.close());

/** Console errors other than the expected HTTP replies (signed-out 401s, refused passwords' 400). */
const unexpectedProblems = () =>
  h.problems.filter((p) => !/Failed to load resource: the server responded with a status of (400|401)/.test(p));

describe('an invitation', () => {
  it('the admin invites a hygienist; the hygienist follows the e-mailed link, sets a password and signs in', async () => {
    await h.reset();
    const admin = await h.newPage();
    await signInAs(admin, 'odile.park@larkspur.example');
    await admin.getByRole('link', { name: 'Practice', exact: true }).click();
    await admin.waitForURL('**/practice/people');
    // The seeded invitation waits for its invitee.
    await expect
      .poll(() => admin.getByTestId('invitation-bea.lindqvist@larkspur.example').textContent())
      .toMatch(/Waiting for the invitee/);

    const email = freshEmail('juniper.ashby');
    await admin.getByLabel('E-mail').fill(email);
    await admin.getByLabel('Role', { exact: true }).selectOption('hygienist');
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => admin.getByRole('status').textContent()).toMatch(/on its way/);
    await expect.poll(() => admin.getByTestId(`invitation-${email}`).textContent()).toMatch(/Dental hygienist/);
    await screenshot(admin, 'practice-people');

    const { origin, page, token } = await linkMailedTo(email);
    expect(origin).toBe(h.baseUrl);
    // The invitee: another browser, no session.
    const invitee = await h.newPage();
    await invitee.goto(`/${page}#token=${token}`);
    await expect.poll(() => invitee.getByRole('heading', { level: 1 }).textContent()).toBe('Join Larkspur Lane Dental');
    // The token leaves the address bar once read.
    expect(invitee.url()).not.toContain(token);
    await invitee.getByLabel('Your name, as colleagues see it').fill('Juniper Ashby');
    await invitee.getByLabel('Password').fill('Sunshine2024!');
    await invitee.getByRole('button', { name: 'Create my account' }).click();
    await expect.poll(() => invitee.getByTestId('error-password').textContent()).toMatch(/most commonly used/);
    await invitee.getByLabel('Password').fill('Marram grass 1887');
    await invitee.getByRole('button', { name: 'Create my account' }).click();
    await expect.poll(() => invitee.getByRole('status').textContent()).toMatch(/Your account is ready/);
    await screenshot(invitee, 'invitation-accepted');

    await invitee.getByRole('link', { name: 'Sign in' }).click();
    await invitee.getByLabel('E-mail').fill(email);
    await invitee.getByLabel('Password').fill('Marram grass 1887');
    await invitee.getByRole('button', { name: 'Sign in' }).click();
    await invitee.waitForURL('**/patients**');
    await expect
      .poll(() => invitee.locator('.app-navbar__user').textContent())
      .toMatch(/Juniper Ashby.*Dental hygienist/);
    // A hygienist has no Practice screen.
    expect(await invitee.getByRole('link', { name: 'Practice', exact: true }).count()).toBe(0);

    // The same link again: a plain page, not an error screen.
    const again = await h.newPage();
    await again.goto(`/welcome#token=${token}`);
    await expect.poll(() => again.getByRole('alert').textContent()).toMatch(/used already/);
    await screenshot(again, 'invitation-used');

    await admin.reload();
    await expect.poll(() => admin.getByTestId(`invitation-${email}`).textContent()).toMatch(/Accepted/);
    expect(unexpectedProblems().filter((p) => !/status of 410/.test(p))).toEqual([]);
  });
});
