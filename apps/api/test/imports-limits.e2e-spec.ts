// The import's size limit (IMPORT_MAX_BYTES) against an app of its own, so the main import file
// keeps the default limit: over it → 413 before the file is read, and nothing written.
import { afterAll, describe, expect, it } from 'vitest';
import { rowCounts, sendImport } from './support/import-files.js';
import { signIn, startTestApp } from './support/test-app.js';

const ctx = await startTestApp({ IMPORT_MAX_BYTES: 2000 });
afterAll(() => ctx.close());

describe('import size limit', () => {
  it('refuses a file over IMPORT_MAX_BYTES with 413 and writes nothing', async () => {
    const cookie = await signIn(ctx, 'practice_admin');
    const header = 'event,chart_number,family_name,given_name,birth_date,fdi,date\r\n';
    const before = await rowCounts(ctx);
    const big = await sendImport(ctx, cookie, header + 'x'.repeat(2500));
    expect(big.status).toBe(413);
    expect(big.body.message).toMatch(/larger than the limit/);
    expect((await sendImport(ctx, cookie, header + 'x'.repeat(2500), { dryRun: true })).status).toBe(413);
    expect(await rowCounts(ctx)).toEqual(before);
    // Under the limit the same kind of file is read (and reported on).
    expect((await sendImport(ctx, cookie, header, { dryRun: true })).status).toBe(200);
  });
});
