// The Recall desk's CSV carries each patient's phone and e-mail where the user may read them
// (issue 15 §7): the practice's own people, by the CASL rules of their role; never the contact
// details of a shared patient, so never in a surgeon's export of shares. The desk on screen shows neither.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { patients } from '../src/db/schema/index.js';
import { actorCookies } from './support/role-matrix.js';
import { type AccountKey, startTestApp, type TestContext } from './support/test-app.js';

let ctx: TestContext;
let cookies: Record<AccountKey, string>;

beforeAll(async () => {
  ctx = await startTestApp();
  cookies = await actorCookies(ctx);
  // Imogen Farrow (LL-1002, shared with the Northgate surgeon) has an e-mail in the seed; give her a phone.
  await ctx.db.update(patients).set({ phone: '+44 7700 900123' }).where(eq(patients.chartNumber, 'LL-1002'));
});
afterAll(async () => {
  await ctx?.close();
});

const csv = async (who: AccountKey) => {
  const res = await ctx.http.get('/api/recalls/desk/csv').set('Cookie', cookies[who]);
  expect(res.status).toBe(200);
  return res.text.trim().split('\r\n');
};

describe('recall desk CSV: contact details', () => {
  it.each(['hygienist', 'dentist', 'practice_admin'] as const)(
    'the %s exports the phone and e-mail of the practice’s patients',
    async (who) => {
      const [header, ...rows] = await csv(who);
      expect(header.split(',').slice(0, 4)).toEqual(['chart number', 'patient', 'phone', 'e-mail']);
      // The leading apostrophe is csvLine's guard: a cell starting with + is not run as a spreadsheet formula.
      expect(rows.find((r) => r.startsWith('LL-1002,'))).toMatch(
        /^LL-1002,Imogen Farrow,'\+44 7700 900123,imogen\.farrow@mail\.example,/,
      );
    },
  );

  it('the surgeon’s export of shared patients has no contact details', async () => {
    const [header, ...rows] = await csv('surgeon');
    // The columns follow what the surgeon may read of their own practice's patients (the header
    // leaves before the first row); a shared patient's cells stay empty.
    expect(header).toBe(
      'chart number,patient,phone,e-mail,next recall,overdue days,last exam,last status per implant,risk factors',
    );
    expect(rows.some((r) => r.startsWith('LL-1002,Imogen Farrow,,,'))).toBe(true);
    const text = rows.join('\n');
    expect(text).not.toContain('@');
    expect(text).not.toContain('7700 900123');
  });

  it('the desk on screen carries no contact details, for anyone', async () => {
    for (const who of ['hygienist', 'surgeon'] as const) {
      const res = await ctx.http.get('/api/recalls/desk?pageSize=200').set('Cookie', cookies[who]);
      expect(res.status).toBe(200);
      expect(JSON.stringify(res.body)).not.toMatch(/imogen\.farrow@|7700 900123|"contact"/);
    }
  });
});
