// The bone-level journey in the browser: the hygienist uploads a DICOM (written by dcmjs) to
// Harold Whitcombe's 35, cancels it, meets a failed upload and retries it, then measures on the
// implant in the viewer; the values appear in the Site file's bone-level chart and are offered in
// the recall exam form. Then the measurement is amended and the radiograph marked entered in error.
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dicomFile } from '../../api/test/support/radiograph-fixtures.js';
import { seriousA11yViolations } from './support/axe.js';
import { screenshot, signInAs, startHarness, type Harness } from './support/harness.js';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

/** Taken today, so it is the site's latest radiograph whatever the seed holds. */
const today = new Date().toISOString().slice(0, 10);

/** Marks five points on the viewer's 256 × 256 image: platform pair, apex, mesial, distal. */
async function markPoints(page: Page, marks: readonly (readonly [number, number])[]) {
  const image = page.getByTestId('viewer-image');
  await expect.poll(() => image.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBe(256);
  const box = (await image.boundingBox())!;
  for (const [markRow, markCol] of marks) {
    await image.click({ position: { x: (markCol / 256) * box.width, y: (markRow / 256) * box.height } });
  }
  await expect.poll(() => page.getByTestId('measure-step').textContent()).toBe('All points marked');
}

describe('bone levels from radiographs', () => {
  it('upload (cancel, retry), measure, see the chart and the offer in the exam form, amend, entered in error', async () => {
    await h.reset();
    const page = await h.newPage();
    await signInAs(page, 'maren.holt@larkspur.example');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Whitcombe/ })
      .click();
    await page.getByTestId('open-radiographs').click();
    await page.getByRole('heading', { name: 'Radiographs' }).waitFor();
    const patientId = new URL(page.url()).pathname.split('/')[2];

    // The first upload is held until cancelled; the second fails as a storage outage would; the
    // third goes through to the server.
    let posts = 0;
    let release: () => void = () => undefined;
    const held = new Promise<void>((resolve) => {
      release = resolve;
    });
    await page.route(/\/api\/patients\/[^/]+\/radiographs\?/, async (route) => {
      if (route.request().method() !== 'POST') return route.fallback();
      posts += 1;
      if (posts === 1) {
        await held;
        return route.abort().catch(() => undefined);
      }
      if (posts === 2) {
        return route.fulfill({
          status: 503,
          contentType: 'application/json',
          body: JSON.stringify({
            statusCode: 503,
            error: 'Service Unavailable',
            message: 'Object storage is unavailable; the radiograph was not saved. Try again in a few minutes',
          }),
        });
      }
      return route.fallback();
    });

    // 256 × 256, 16 bits: a bright implant-like bar on a dark ground
    const file = dicomFile({
      rows: 256,
      columns: 256,
      bits: 16,
      photometric: 'MONOCHROME2',
      pixel: (r, c) => (c > 110 && c < 146 && r > 40 && r < 220 ? 3500 : 400 + ((r * 7 + c * 13) % 200)),
      pixelSpacing: [0.06, 0.06],
      studyDate: today.replaceAll('-', ''),
      seriesNumber: 41,
    });
    await page
      .getByTestId('radiograph-files')
      .setInputFiles({ name: 'lower-left-35.dcm', mimeType: 'application/dicom', buffer: file });
    await page.getByTestId('radiograph-kind').selectOption('periapical');
    await page.getByRole('checkbox', { name: '35' }).check({ force: true });
    await page.getByTestId('radiograph-upload').click();

    const row = page.getByTestId('upload-row').first();
    await row.getByRole('button', { name: 'Cancel' }).waitFor();
    expect(await row.getByRole('progressbar').count()).toBe(1);
    expect(await row.textContent()).toMatch(/lower-left-35\.dcm.*KB of .*KB \(\d+ %\)/);
    await screenshot(page, 'bone-levels-upload-in-progress');
    await row.getByRole('button', { name: 'Cancel' }).click();
    await expect.poll(() => row.getByRole('alert').textContent()).toBe('Upload cancelled');
    release();

    await row.getByRole('button', { name: 'Retry' }).click();
    await expect.poll(() => row.getByRole('alert').textContent()).toMatch(/Object storage is unavailable/);
    await row.getByRole('button', { name: 'Retry' }).click();
    await expect.poll(() => row.textContent()).toMatch(/lower-left-35\.dcm.*\(100 %\)/);
    expect(await row.getByRole('alert').count()).toBe(0);
    expect(posts).toBe(3);

    // The viewer: the shoulder at row 40 (cols 110 and 146), the apex at (220, 128); bone contacts
    // 30 px (mesial) and 20 px (distal) below the platform. Harold's implant at 35 is 10 mm over
    // 180 px: 30 px → 1.67 mm, 20 px → 1.11 mm along the axis.
    const card = page.getByTestId('radiograph-card').filter({ hasText: today });
    await card.getByTestId('open-viewer').click();
    await markPoints(page, [
      [40, 110],
      [40, 146],
      [220, 128],
      [70, 111],
      [60, 145],
    ]);
    await page.getByTestId('save-measurement').click();
    await page.getByTestId('measurement-saved').waitFor();
    expect(await page.getByTestId('measurements').textContent()).toMatch(
      /Mesial 1\.6[6-8] mm, distal 1\.1[0-2] mm from the platform \(implant 10 mm\)/,
    );
    const viewerPath = new URL(page.url()).pathname;

    // The Site file's chart: the latest values, straight segments only, and the ICOI grade.
    await page.goto(`/patients/${patientId}`);
    await page.getByTestId('arch-cell-35').click();
    const chart = page.getByTestId('bone-level-chart');
    await chart.getByTestId('bone-level-latest').waitFor();
    const siteId = new URL(page.url()).pathname.split('/')[4];
    expect(await chart.getByTestId('bone-level-latest').textContent()).toMatch(
      /mesial 1\.6[6-8] mm,\s*distal 1\.1[0-2] mm/,
    );
    // A dot per side at least (one reading draws dots; more draw lines between them).
    await expect.poll(() => chart.locator('.recharts-line-dot').count()).toBeGreaterThanOrEqual(2);
    const curves = await chart
      .locator('.recharts-line-curve')
      .evaluateAll((paths) => paths.map((p) => p.getAttribute('d') ?? ''));
    for (const d of curves) expect(d).not.toMatch(/[CQSTA]/); // no curve commands: straight segments only
    expect(await chart.getByTestId('bone-level-table').locator('tbody tr').first().textContent()).toMatch(
      /1\.6[6-8] mm1\.1[0-2] mm10 mmMaren Holt/,
    );
    expect(await chart.getByTestId('icoi-grade').textContent()).toMatch(/ICOI health scale of the latest value: I/);
    expect(await chart.textContent()).toContain('Supporting information, not a diagnosis');
    await screenshot(page, 'bone-levels-site-file-chart');
    expect(await seriousA11yViolations(page)).toEqual([]);

    // The exam form offers 1.7 mm (worse of 1.67 and 1.11) with its source; one click accepts it.
    await page.goto(`/recalls/patients/${patientId}/exam`);
    const offer = page.getByTestId('measured-bone-35');
    await offer.waitFor();
    expect(await offer.textContent()).toMatch(/Measured bone level 1\.7 mm .*measured by Maren Holt/);
    await page.getByTestId('use-measured-bone-35').click();
    expect(await page.locator('#bone-35').inputValue()).toBe('1.7');
    await page.getByTestId('bone-source-35').waitFor();
    // Typed over, it is the hygienist's own value again, without a source.
    await page.locator('#bone-35').fill('2.0');
    await page.getByTestId('use-measured-bone-35').waitFor();
    await screenshot(page, 'bone-levels-exam-offer');
    // Accepted again and saved, the exam records the measurement it came from.
    await page.getByTestId('use-measured-bone-35').click();
    await page.getByLabel('Examine 37 in this visit').uncheck({ force: true });
    for (const position of ['mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual']) {
      await page.getByLabel(`35 ${position} probing depth`).fill('3');
    }
    await page.getByRole('button', { name: 'Save exam' }).click();
    await page.getByTestId('exam-saved').waitFor();
    const exams = (await (await page.request.get(`/api/recalls/sites/${siteId}/exams`)).json()) as {
      exams: { examinedOn: string; boneLevelMm: number | null; boneLevelMeasurementId: string | null }[];
    };
    const saved = exams.exams.at(-1)!;
    expect(saved).toMatchObject({ examinedOn: today, boneLevelMm: 1.7 });
    expect(saved.boneLevelMeasurementId).toMatch(/^[0-9a-f-]{36}$/);

    // Amend the measurement with a reason: a new version, the first kept.
    await page.goto(viewerPath);
    await page.getByTestId('measurements').getByRole('button', { name: 'Amend' }).click();
    await markPoints(page, [
      [40, 110],
      [40, 146],
      [220, 128],
      [76, 111],
      [60, 145],
    ]);
    await page.getByLabel('Why is it amended?').fill('Mesial contact is one thread lower');
    await page.getByTestId('save-measurement').click();
    await expect
      .poll(() => page.getByTestId('measurements').textContent())
      .toMatch(/Mesial 2\.0\d mm.*amended: Mesial contact is one thread lower/);

    // Entered in error: kept, hidden from the list unless asked for.
    await page.getByRole('button', { name: 'Mark entered in error…' }).click();
    await page.getByRole('button', { name: 'Mark entered in error', exact: true }).click();
    await page.getByText('Say why (at least 3 characters)').waitFor();
    await page.getByLabel('Why is this radiograph entered in error?').fill('Filed to the wrong site');
    await page.getByRole('button', { name: 'Mark entered in error', exact: true }).click();
    await page.getByTestId('entered-in-error').waitFor();
    await page.goto(`/patients/${patientId}/radiographs`);
    await page.getByRole('heading', { name: 'Radiographs' }).waitFor();
    await page.getByTestId('radiograph-card').or(page.getByText('No radiographs yet')).first().waitFor();
    await expect.poll(() => page.getByTestId('entered-in-error-tag').count()).toBe(0);
    await page.getByText('Show entered in error').click();
    await page.getByTestId('entered-in-error-tag').first().waitFor();
    await screenshot(page, 'bone-levels-entered-in-error');
  });

  it('asks for the implant length when the placement record has none, with its message beside the field', async () => {
    await h.reset();
    const page = await h.newPage();
    await signInAs(page, 'ines.calloway@larkspur.example');
    await page
      .getByTestId('patients-table')
      .getByRole('link', { name: /Whitcombe/ })
      .click();
    await page.getByTestId('arch-cell-35').waitFor();
    const patientId = new URL(page.url()).pathname.split('/')[2];
    // A planned site has no placement record, so no implant length.
    const patient = (await (await page.request.get(`/api/patients/${patientId}`)).json()) as {
      sites: { fdi: number }[];
    };
    const fdi = [46, 45, 44, 36, 34, 26, 16].find((f) => !patient.sites.some((s) => s.fdi === f))!;
    const site = await page.request.post(`/api/patients/${patientId}/sites`, { data: { fdi } });
    expect(site.status()).toBe(201);
    const siteId = ((await site.json()) as { id: string }).id;
    const upload = await page.request.post(
      `/api/patients/${patientId}/radiographs?siteIds=${siteId}&kind=periapical&takenOn=${today}`,
      {
        headers: { 'Content-Type': 'application/octet-stream' },
        data: dicomFile({
          rows: 256,
          columns: 256,
          bits: 8,
          photometric: 'MONOCHROME2',
          pixel: (r, c) => (c > 110 && c < 146 && r > 40 && r < 220 ? 240 : 30 + ((r + c) % 40)),
          seriesNumber: 42,
        }),
      },
    );
    expect(upload.status()).toBe(201);
    const radiographId = ((await upload.json()) as { id: string }).id;

    await page.goto(`/patients/${patientId}/radiographs/${radiographId}`);
    await page.getByTestId('implant-length').waitFor();
    await markPoints(page, [
      [40, 110],
      [40, 146],
      [220, 128],
      [70, 111],
      [60, 145],
    ]);
    const save = page.getByTestId('save-measurement');
    await save.click();
    await expect.poll(() => page.getByTestId('error-implantTrueMm').textContent()).toMatch(/implant length/);
    await page.getByTestId('implant-length').fill('2');
    await save.click();
    await expect.poll(() => page.getByTestId('error-implantTrueMm').textContent()).toBe('Implants are 4–25 mm long');
    await page.getByTestId('implant-length').fill('11');
    await save.click();
    // 11 mm over 180 px: 30 px → 1.83 mm, 20 px → 1.22 mm
    await expect
      .poll(() => page.getByTestId('measurements').textContent())
      .toMatch(/Mesial 1\.8[2-4] mm, distal 1\.2[1-3] mm from the platform \(implant 11 mm\)/);
    await screenshot(page, 'bone-levels-implant-length-asked');
    // The length went with the measurement only: the site still has no placement record.
    const levels = (await (await page.request.get(`/api/sites/${siteId}/bone-levels`)).json()) as {
      implantLengthMm: number;
    };
    expect(levels.implantLengthMm).toBe(11);
    const detail = (await (await page.request.get(`/api/radiographs/${radiographId}`)).json()) as {
      siteImplants: { implantLengthMm: number | null }[];
    };
    expect(detail.siteImplants[0].implantLengthMm).toBeNull();
    // Kept from the failed fresh-clone run, whose cause is not proven (a preview behind a job
    // backlog no longer waits: radiographs-preview-queue.e2e-spec.ts); a loaded machine's page loads.
  }, 150_000);
});
