// The first vertical slice in a real browser: sign-in, Patients, the Arch, the Site file, and
// what each role sees. Runs against the built app served by the real API on the test database.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

/** Console errors other than the expected HTTP replies (the signed-out 401 of /api/auth/me). */
const unexpectedProblems = () =>
  h.problems.filter((p) => !/Failed to load resource: the server responded with a status of (401|404)/.test(p));

describe('restorative dentist', () => {
  it('signs in, finds a patient, reads the Arch in FDI and Universal, and opens a Site file', async () => {
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');

    const table = page.getByTestId('patients-table');
    await expect.poll(() => table.locator('tbody tr').count()).toBe(9);
    await page.getByTestId('patient-search').fill('whit');
    await expect.poll(() => table.locator('tbody tr').count()).toBe(1);
    expect(page.url()).toContain('search=whit');
    await table.getByRole('link', { name: /Whitcombe/ }).click();

    // The Arch: implant sites 35 and 37 with their accessible names (numbering via packages/domain);
    // the seeded recall history makes the latest status of 35 'peri-implant health'.
    const cell35 = page.getByTestId('arch-cell-35');
    await expect
      .poll(() => cell35.getAttribute('aria-label'))
      .toMatch(/^35, implant, peri-implant health, last exam \d{1,2} \w+ \d{4}$/);
    expect(await page.getByTestId('arch-cell-36').getAttribute('aria-label')).toBe(
      '36, implant failed, not yet examined',
    );
    expect(await page.getByTestId('arch-cell-11').getAttribute('aria-label')).toBe('11, natural tooth');
    await screenshot(page, 'arch-dentist');

    // Universal numbering: FDI 35 is Universal 20, FDI 11 is 8 (HL7 Universal tooth code system).
    await page.getByRole('radio', { name: 'Universal' }).click();
    await expect.poll(() => cell35.getAttribute('aria-label')).toMatch(/^20, implant, peri-implant health, /);
    expect(await page.getByTestId('arch-cell-11').getAttribute('aria-label')).toBe('8, natural tooth');
    await page.getByRole('radio', { name: 'FDI' }).click();

    // Keyboard: focus the implant cell and open it with Enter.
    await cell35.focus();
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/sites\//);
    const header = page.getByTestId('site-file-header');
    await expect.poll(() => header.textContent()).toContain('Solvra CN');
    const headerText = (await header.textContent()) ?? '';
    expect(headerText).toMatch(/Internal conical/);
    expect(headerText).toMatch(/4\.3/);
    await expect.poll(() => page.getByTestId('stack-part').count()).toBe(1);
    expect(await page.getByTestId('stack-part').textContent()).toMatch(/Prosthetic screw, implant level/);
    expect(await page.getByTestId('stack-restoration').textContent()).toMatch(/Zirconia/i);
    expect(await page.getByTestId('log-torque-button').count()).toBe(1);
    expect(await page.getByText(/manufacturer-specific/).count()).toBeGreaterThan(0);
    await screenshot(page, 'site-file-dentist');
    expect(unexpectedProblems()).toEqual([]);
  });
});

describe('dental hygienist', () => {
  it('reads the Stack but sees no way to edit it', async () => {
    const page = await h.newPage();
    await signInAs(page, 'maren.holt@larkspur.example');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Okafor/ })
      .click();
    await page.getByTestId('arch-cell-46').click();
    await page.waitForURL(/\/sites\//);
    await expect.poll(() => page.getByTestId('stack-part').count()).toBe(2);
    expect(await page.getByTestId('stack-restoration').textContent()).toMatch(/not retrievable/i);
    expect(await page.getByTestId('log-torque-button').count()).toBe(0);
    expect(await page.getByRole('button', { name: /log torque|record|edit|amend/i }).count()).toBe(0);
    await screenshot(page, 'site-file-hygienist');
  });
});

describe('referring surgeon and another practice', () => {
  it('the surgeon sees only the four patients shared with him', async () => {
    const page = await h.newPage();
    await signInAs(page, 'rafael.imbert@northgate.example');
    const rows = page.getByTestId('patients-table').locator('tbody tr');
    await expect.poll(() => rows.count()).toBe(4);
    expect(await page.getByTestId('patients-table').textContent()).not.toMatch(/Okafor/);
  });

  it("a dentist of another practice gets 'not found' for a Larkspur patient's address", async () => {
    const larkspur = await h.newPage();
    await signInAs(larkspur, 'ines.calloway@larkspur.example');
    await larkspur
      .getByTestId('patients-table')
      .getByRole('link', { name: /Whitcombe/ })
      .click();
    await larkspur.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    const address = new URL(larkspur.url()).pathname;

    const other = await h.newPage();
    await signInAs(other, 'nell.ashdown@quarryhill.example');
    await other.goto(address);
    await expect.poll(() => other.getByText(/No such patient|not found/i).count()).toBeGreaterThan(0);
    expect(await other.getByText(/Whitcombe/).count()).toBe(0);
  });
});

describe('sign-in page', () => {
  it('shows the plain message for a wrong password and stays on the page', async () => {
    const page = await h.newPage();
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill('ines.calloway@larkspur.example');
    await page.getByLabel('Password').fill('wrong-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByText('The e-mail or password is not right').count()).toBe(1);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
  });
});

describe('API documentation (development only)', () => {
  it('renders the OpenAPI document in Swagger UI under the same Content-Security-Policy', async () => {
    const page = await h.newPage();
    await page.goto('/api/docs');
    await expect
      .poll(() => page.locator('.swagger-ui .title').first().textContent(), { timeout: 15_000 })
      .toMatch(/Torquetrail API/);
    expect(await page.getByText('/api/patients/{id}').count()).toBeGreaterThan(0);
  });
});
