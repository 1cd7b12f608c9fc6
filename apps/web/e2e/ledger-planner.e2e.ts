// The restoration ledger in a real browser: plan a splinted screw-retained bridge on Wendell
// Achterberg's two Tessely EX 4.1 implants (15, 16), meet the error Finding an engaging coping
// raises (engaging-impression-for-platform-bridge, common practice — docs/clinical-rules.md §8),
// fix it, save, deliver with lot numbers, seat every screw in one form and see each verdict (torqueVerdict, §6).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

/** Console errors other than the expected HTTP replies; `from` skips what earlier tests saw. */
const unexpectedProblems = (from = 0, allowed = '401|404') =>
  h.problems
    .slice(from)
    .filter((p) => !new RegExp(`Failed to load resource: the server responded with a status of (${allowed})`).test(p));

describe('restorative dentist', () => {
  it('plans, fixes an error Finding, delivers and seats every screw of a splinted bridge 15–16', async () => {
    await h.reset(); // this test writes: a retry starts from the seed, not from the first attempt's plans
    const problemsBefore = h.problems.length; // a retry counts its own console problems only
    const page = await h.newPage();
    const refused: string[] = [];
    page.on('response', (r) => {
      if (r.status() === 400) refused.push(`${r.request().method()} ${new URL(r.url()).pathname}`);
    });
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page.getByTestId('patient-search').fill('Achterberg');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Achterberg/ })
      .click();
    await page.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    await page.goto(`${new URL(page.url()).pathname}/restorations`);
    await page.getByTestId('new-plan').click();
    await page.waitForURL(/\/restorations\/new$/);

    await page.getByTestId('planner-sites').getByLabel(/^15 /).check({ force: true }); // Blueprint draws its own indicator over the input
    await page.getByTestId('planner-sites').getByLabel(/^16 /).check({ force: true }); // Blueprint draws its own indicator over the input
    await page.getByLabel('Restoration', { exact: true }).selectOption('splinted-bridge');
    await page.getByLabel('Retention').selectOption('screw-to-implant');
    await page.getByLabel('Impression copings splinted together before the impression').check({ force: true }); // Blueprint draws its own indicator over the input
    // Placement axes (0.05, 0, 1) and (−0.1, 0.02, 1): θ = arccos(u·v / |u||v|) = 8.65° [derived, clinical-checks §9].
    await expect.poll(() => page.getByTestId('divergence').textContent()).toMatch(/15–16\s*8\.6°/);
    const site15 = page.getByTestId('planner-site-15');
    const site16 = page.getByTestId('planner-site-16');

    // An engaging coping for a bridge screwed to the implants: an error Finding, shown beside the field.
    await site15.getByLabel('Impression technique').selectOption('engaging');
    const error = page.locator('[data-testid="finding-error"][data-code="engaging-impression-for-platform-bridge"]');
    await expect.poll(() => error.count()).toBe(1);
    expect(await page.getByTestId('error-sites.0.impressionCoping').textContent()).toMatch(/non-engaging/i);
    expect(await page.getByTestId('save-plan').isDisabled()).toBe(true);
    await screenshot(page, 'planner-error-finding');

    // Fixed: non-engaging copings from the catalogue, prosthetic screws at implant level.
    await site15.getByLabel('Impression technique').selectOption('non-engaging');
    await expect.poll(() => error.count()).toBe(0);
    for (const site of [site15, site16]) {
      await site
        .getByLabel('Impression coping (catalogue)')
        .selectOption({ label: 'Impression coping, non-engaging, open tray [TEX-41-ICN-O]' });
      await site.getByLabel(/Prosthetic screw, implant level/).check({ force: true }); // Blueprint draws its own indicator over the input
      await site.getByLabel('Restorative space (mm)').fill('7');
    }
    await expect.poll(() => page.getByTestId('no-findings').count()).toBe(1);
    await page.getByLabel('Laboratory', { exact: true }).fill('Ferncliff Dental Lab');
    await page.getByTestId('save-plan').click();
    await page.waitForURL(/\/restorations$/);

    // Amend before delivery: a new version; the first stays, marked as amended.
    // The newest plan comes first; Wendell's seeded plan (a digital impression) stays below it.
    await page.getByRole('link', { name: 'Amend plan' }).first().click();
    await page.getByRole('heading', { name: 'Amend the plan' }).waitFor();
    await page.getByLabel('Shade').fill('A2');
    await page.getByLabel('Reason for the amendment').fill('Shade chosen at try-in');
    // The save refreshes the plan list and, more slowly here, the Stack's sites: the list's new
    // version (the amended one superseded) must not unmount the form before it navigates away.
    await page.route('**/api/patients/*/restorable-sites', async (route) => {
      await new Promise((resolve) => setTimeout(resolve, 600));
      await route.continue();
    });
    await page.getByTestId('save-plan').click();
    await page.waitForURL(/\/restorations$/);
    await expect.poll(() => page.getByTestId('restoration-card').count()).toBe(3);
    const card = page.getByTestId('restoration-card').first();
    expect(await card.textContent()).toMatch(/shade A2/);
    expect(await card.textContent()).toMatch(/Amendment: Shade chosen at try-in/);
    expect(await page.getByTestId('restoration-card').nth(1).textContent()).toMatch(/amended/);
    await expect.poll(() => card.getAttribute('data-status')).toBe('planned');

    // The lab prescription: generated on the server, listed with a download link serving the PDF.
    await card.getByTestId('make-lab-pdf').click();
    await expect.poll(() => card.getByTestId('lab-pdf-link').count(), { timeout: 15_000 }).toBe(1);
    // Pressing again opens the same prescription (the PDF downloads), never a second one.
    const download = page.waitForEvent('download');
    await card.getByTestId('make-lab-pdf').click();
    expect((await download).suggestedFilename()).toMatch(/^lab-prescription-.*\.pdf$/);
    expect(await card.getByTestId('lab-pdf-link').count()).toBe(1);
    expect(await card.getByTestId('lab-pdf-link').textContent()).toMatch(/^Lab prescription no\. \d+ of /);
    const href = await card.getByTestId('lab-pdf-link').getAttribute('href');
    const pdf = await page.evaluate(async (url) => {
      const r = await fetch(url!);
      return {
        type: r.headers.get('content-type'),
        head: new TextDecoder().decode((await r.arrayBuffer()).slice(0, 5)),
      };
    }, href);
    expect(pdf).toEqual({ type: 'application/pdf', head: '%PDF-' });

    await card.getByTestId('deliver-button').click();
    // The lot is required by the catalogue: leaving one empty is refused beside the field, nothing saved.
    await card.getByLabel('Lot of Prosthetic screw, implant level at 15').fill('TEX-PSI-2612');
    await card.getByTestId('record-delivery').click();
    await expect.poll(() => card.getByTestId('error-parts.1.lot').count()).toBe(1);
    await card.getByLabel('Lot of Prosthetic screw, implant level at 16').fill('TEX-PSI-2612');
    // The refreshed list (now "delivered") unmounts the delivery form before the slower patient
    // reply lands: the move on to the seating form must survive that (lib/run-mutation.ts).
    await page.route(/\/api\/patients\/[0-9a-f-]{36}$/, async (route) => {
      await new Promise((resolve) => setTimeout(resolve, 800));
      await route.continue();
    });
    await card.getByTestId('record-delivery').click();
    await expect.poll(() => card.getAttribute('data-status')).toBe('delivered');

    // The delivery flow ends on the seating form: every screw with its spec, one wrench and time.
    const seat = card.getByTestId('seat-form');
    await expect.poll(() => seat.getByTestId('seat-screw').count(), { timeout: 15_000 }).toBe(2);
    expect(await seat.textContent()).toMatch(
      /manufacturer's instructions, the clinician's judgement and local regulations rule/,
    );
    expect(await seat.getByTestId('seat-spec').allTextContents()).toEqual(['32 N·cm ± 10 %', '32 N·cm ± 10 %']);

    // Seated later: until then the Stack and the Arch flag the missing seating torque.
    await seat.getByRole('button', { name: 'Later' }).click();
    await expect.poll(() => card.getByTestId('seat-form').count()).toBe(0);
    const restorationsPath = new URL(page.url()).pathname;
    await card.getByRole('link', { name: 'Site 15' }).click();
    await page.waitForURL(/\/sites\//);
    await expect.poll(() => page.getByTestId('seating-torque-missing').count()).toBe(1);
    await page.goto(restorationsPath.replace(/\/restorations$/, ''));
    await expect.poll(() => page.getByTestId('arch-cell-15').getAttribute('data-seating-missing')).toBe('true');
    expect(await page.getByTestId('arch-cell-15').getAttribute('aria-label')).toMatch(
      /seating torque missing on one part/,
    );
    expect(await page.getByTestId('site-seating-torque').allTextContents()).toEqual([
      'seating torque missing on one part',
      'seating torque missing on one part',
    ]);
    await screenshot(page, 'arch-seating-torque-missing');
    await page.goto(restorationsPath);
    await page.getByTestId('seat-restoration-button').first().click();
    await expect.poll(() => seat.getByTestId('seat-screw').count()).toBe(2);
    // Spec 32 N·cm ±10 % (demo catalogue, common practice): 32 is within, 36 over; judged live per screw.
    await seat.getByLabel(/^Applied torque at 15/).fill('32');
    await seat.getByLabel(/^Applied torque at 16/).fill('36');
    await expect
      .poll(() => seat.getByTestId('seat-verdict').allTextContents())
      .toEqual(['Within specification', 'Over specification']);
    await seat.getByLabel('Wrench (for every screw)').selectOption({ index: 1 });
    await screenshot(page, 'seat-restoration-form');
    await seat.getByRole('button', { name: 'Save seating torques' }).click();
    await expect.poll(() => card.getByTestId('seat-form').count()).toBe(0);

    await card.getByRole('link', { name: 'Site 15' }).click();
    await page.waitForURL(/\/sites\//);
    const part = page.getByTestId('stack-part');
    await expect.poll(() => part.count()).toBe(1);
    expect(await part.textContent()).toMatch(/Prosthetic screw, implant level/);
    expect(await part.textContent()).toMatch(/TEX-PSI-2612/);
    await expect.poll(() => part.textContent()).toMatch(/32 N·cm .*Initial seating.*Within specification/);
    // Re-torque reminder after the initial seating (about 10 min, Siamos et al. 2002); seated, no flag.
    await expect.poll(() => page.getByTestId('retorque-due').count()).toBe(1);
    expect(await page.getByTestId('seating-torque-missing').count()).toBe(0);
    const torqueEvents = page.locator('[data-testid="timeline-event"][data-kind="torque"]');
    await expect.poll(() => torqueEvents.count()).toBe(1);
    expect(await torqueEvents.first().textContent()).toMatch(/32 N·cm .*within specification/);
    await expect.poll(() => page.getByTestId('torque-chart').count()).toBe(1);
    await screenshot(page, 'site-file-after-torque');

    // Amend the torque entry: the old one stays in the Timeline, marked as amended.
    await torqueEvents.first().getByRole('button', { name: 'Amend' }).click();
    await torqueEvents.first().getByLabel('Corrected torque (N·cm)').fill('31');
    await torqueEvents.first().getByLabel('Reason for the amendment').fill('Misread the wrench');
    await torqueEvents.first().getByRole('button', { name: 'Save amendment' }).click();
    await expect.poll(() => torqueEvents.count()).toBe(2);
    expect(await torqueEvents.nth(0).textContent()).toMatch(/32 N·cm.*amended/);
    expect(await torqueEvents.nth(1).textContent()).toMatch(/31 N·cm.*Amendment: Misread the wrench/);
    await expect.poll(() => part.textContent()).toMatch(/31 N·cm/);
    // The one 400 is the delivery refused for the missing lot, above.
    expect(
      h.problems.slice(problemsBefore).filter((p) => /status of 400/.test(p)),
      JSON.stringify(refused),
    ).toHaveLength(1);
    expect(unexpectedProblems(problemsBefore, '400|401|404')).toEqual([]);
  });
});

describe('dental hygienist', () => {
  it('reads the Timeline of Harold Whitcombe 35 with the 2016 loosening, and cannot plan or log torque', async () => {
    const seen = h.problems.length;
    const page = await h.newPage();
    await signInAs(page, 'maren.holt@larkspur.example');
    await page.getByTestId('patient-search').fill('Whitcombe');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Whitcombe/ })
      .click();
    await page.getByTestId('arch-cell-35').click();
    await page.waitForURL(/\/sites\//);
    const complication = page.locator('[data-testid="timeline-event"][data-kind="complication"]');
    await expect.poll(() => complication.count()).toBe(1);
    expect(await complication.textContent()).toMatch(/screw loosening/);
    expect(await page.getByTestId('log-torque-button').count()).toBe(0);
    await page.goto(`${new URL(page.url()).pathname.replace(/\/sites\/.*/, '')}/restorations`);
    await expect.poll(() => page.getByTestId('restoration-card').count()).toBe(1);
    expect(await page.getByTestId('new-plan').count()).toBe(0);
    expect(await page.getByTestId('deliver-button').count()).toBe(0);
    await page.getByRole('link', { name: 'Catalogue' }).click();
    await expect.poll(() => page.getByTestId('catalogue-caution').count()).toBe(1);
    expect(await page.getByRole('button', { name: 'Edit' }).count()).toBe(0);
    expect(unexpectedProblems(seen)).toEqual([]);
  });
});
