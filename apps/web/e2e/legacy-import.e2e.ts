// Legacy import in a real browser (issue 14): the practice admin checks the example file (dry
// run), changes nothing, imports it with the progress bar, and finds the imported history in a
// Site file's Timeline, each entry marked with its file and row.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

const example = path.join(
  path.dirname(fileURLToPath(import.meta.url)),
  '../public/import/torquetrail-import-example.csv',
);

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('legacy import', () => {
  it('the admin dry-runs the example file, imports it and sees it in a Timeline marked as imported', async () => {
    await h.reset();
    const admin = await h.newPage();
    await signInAs(admin, 'odile.park@larkspur.example');
    await admin.getByRole('link', { name: 'Import', exact: true }).click();
    await admin.getByRole('heading', { name: 'Import records from a spreadsheet' }).waitFor();
    // The template and the example are served beside the app.
    expect((await admin.request.get(`${h.baseUrl}/import/torquetrail-import-template.csv`)).status()).toBe(200);

    await admin.getByLabel('CSV file to import').setInputFiles(example);
    await admin.getByRole('button', { name: 'Check the file' }).click();
    const report = admin.getByTestId('import-report');
    await report.waitFor({ timeout: 30_000 });
    expect(await report.textContent()).toMatch(/0 error\(s\), 0 warning\(s\)/);
    expect(await admin.getByTestId('import-counts').textContent()).toMatch(/New patients3/);
    await screenshot(admin, 'import-dry-run');

    await admin.getByRole('button', { name: 'Import', exact: true }).click();
    const result = admin.getByTestId('import-result');
    await result.waitFor({ timeout: 60_000 });
    expect(await result.textContent()).toMatch(/Imported/);
    await screenshot(admin, 'import-result');

    await result.getByRole('link', { name: /Fenwick, Odalys \(LEG-0001\)/ }).click();
    await admin.waitForURL(/\/patients\/[0-9a-f-]+$/);
    const patientId = /\/patients\/([0-9a-f-]+)$/.exec(admin.url())![1];
    const detail = (await (await admin.request.get(`/api/patients/${patientId}`)).json()) as {
      sites: { id: string; fdi: number }[];
    };
    const site = detail.sites.find((s) => s.fdi === 36)!;
    await admin.goto(`${h.baseUrl}/patients/${patientId}/sites/${site.id}`);
    const timeline = admin.getByTestId('timeline');
    await timeline.waitFor();
    const imported = timeline.getByTestId('timeline-imported');
    // Placement, plan and delivery (one restoration), part, two torque entries, two exams.
    await expect.poll(() => imported.count()).toBe(8);
    expect(await imported.first().textContent()).toMatch(/imported from torquetrail-import-example\.csv, row 2/);
    await screenshot(admin, 'import-timeline');
    expect(h.problems.filter((p) => !/status of (401|404)/.test(p))).toEqual([]);
  });
});
