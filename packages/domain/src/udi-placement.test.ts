// UDI against its placement: expiry (GS1 AI 17 use-by date; not used after it — common practice)
// and the typed lot against the scanned one (common practice). See docs/clinical-rules.md §4.
import { describe, expect, it } from 'vitest';
import { checkUdiForPlacement } from './udi-placement.js';

const udi = { gtin: '08845212345677', lot: 'SCN3511-26X', expiry: '2028-12-31' };

describe('checkUdiForPlacement', () => {
  it('says nothing when the lot matches and the implant is within its date', () => {
    expect(checkUdiForPlacement(udi, { placedOn: '2026-11-30', lot: 'SCN3511-26X' })).toEqual([]);
  });
  it('accepts a placement on the expiry date itself (decision: usable until the end of that day)', () => {
    expect(checkUdiForPlacement(udi, { placedOn: '2028-12-31' })).toEqual([]);
  });
  it('flags a placement after the expiry date, beside the UDI', () => {
    expect(checkUdiForPlacement(udi, { placedOn: '2029-01-01' })).toEqual([
      {
        code: 'expired-before-placement',
        field: 'udi',
        message: "The implant's expiry date 2028-12-31 (UDI element 17) is before the placement date 2029-01-01",
      },
    ]);
  });
  it('writes the two dates with the writer it is given (the practice order; issue 15 §7)', () => {
    const writeDate = (iso: string) => `<${iso.split('-').reverse().join('/')}>`;
    const [finding] = checkUdiForPlacement(udi, { placedOn: '2029-01-01' }, writeDate);
    expect(finding.message).toBe(
      "The implant's expiry date <31/12/2028> (UDI element 17) is before the placement date <01/01/2029>",
    );
  });
  it('flags a typed lot that differs from the scanned one (exact, case-sensitive), beside the lot', () => {
    expect(
      checkUdiForPlacement(udi, { placedOn: '2026-11-30', lot: 'scn3511-26x' }).map((f) => [f.code, f.field]),
    ).toEqual([['lot-mismatch', 'lot']]);
  });
  it('says nothing when the UDI has no lot or no expiry, or no lot is typed', () => {
    expect(checkUdiForPlacement({ gtin: udi.gtin }, { placedOn: '2030-01-01', lot: 'ANY' })).toEqual([]);
    expect(checkUdiForPlacement(udi, { placedOn: '2026-11-30', lot: null })).toEqual([]);
    expect(checkUdiForPlacement(udi, { placedOn: '2026-11-30', lot: '' })).toEqual([]);
  });
  it('reports both findings together', () => {
    expect(checkUdiForPlacement(udi, { placedOn: '2030-01-01', lot: 'OTHER' }).map((f) => f.code)).toEqual([
      'lot-mismatch',
      'expired-before-placement',
    ]);
  });
});
