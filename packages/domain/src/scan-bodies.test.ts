// Scan bodies of a digital impression: one per implant site, of the implant's platform, with the
// lot the catalogue asks for. Matching the scan body to the implant's platform and connection is
// [common practice] (docs/clinical-rules.md §8b).
import { describe, expect, it } from 'vitest';
import { checkScanBodies, type ScanBodyEntry, seatingRadiographFindings } from './scan-bodies.js';

const sites = [
  { fdi: 44, platformId: 'p-rp', platformName: 'RP 4.3' },
  { fdi: 46, platformId: 'p-wp', platformName: 'WP 5.0' },
];
const body = (
  fdi: number,
  platformId: string,
  more: Partial<ScanBodyEntry['part']> = {},
  lot: string | null = 'L1',
) => ({
  fdi,
  lot,
  part: {
    name: `Scan body ${platformId}`,
    kind: 'scan-body',
    platformId,
    platformName: platformId === 'p-rp' ? 'RP 4.3' : 'WP 5.0',
    requiresLot: true,
    ...more,
  },
});
const codes = (f: ReturnType<typeof checkScanBodies>) => f.map((x) => [x.code, x.fdi]);

describe('checkScanBodies [common practice]', () => {
  it('accepts one scan body of the right platform at every site, with its lot', () => {
    expect(checkScanBodies('digital', sites, [body(44, 'p-rp'), body(46, 'p-wp')])).toEqual([]);
  });

  it('names the site whose scan body is of another platform', () => {
    const f = checkScanBodies('digital', sites, [body(44, 'p-rp'), body(46, 'p-rp')]);
    expect(codes(f)).toEqual([['scan-body-platform-mismatch', 46]]);
    expect(f[0].severity).toBe('error');
    expect(f[0].message).toBe('Scan body p-rp is for the RP 4.3 platform; the implant at site 46 is WP 5.0');
  });

  it('asks for a scan body at a site without one, and for one only where two are given', () => {
    expect(codes(checkScanBodies('digital', sites, [body(44, 'p-rp')]))).toEqual([['scan-body-missing', 46]]);
    expect(codes(checkScanBodies('digital', sites, [body(44, 'p-rp'), body(44, 'p-rp'), body(46, 'p-wp')]))).toEqual([
      ['scan-body-missing', 44],
    ]);
  });

  it('refuses a part that is not a scan body, and a site outside the restoration', () => {
    expect(
      codes(
        checkScanBodies('digital', sites, [
          body(44, 'p-rp', { kind: 'impression-coping' }),
          body(46, 'p-wp'),
          body(11, 'p-rp'),
        ]),
      ),
    ).toEqual([
      ['scan-body-not-a-scan-body', 44],
      ['scan-body-not-a-site', 11],
    ]);
  });

  it('asks for the lot when the catalogue requires one, not otherwise', () => {
    expect(codes(checkScanBodies('digital', sites, [body(44, 'p-rp', {}, null), body(46, 'p-wp')]))).toEqual([
      ['scan-body-lot-missing', 44],
    ]);
    expect(
      checkScanBodies('digital', sites, [body(44, 'p-rp', { requiresLot: false }, null), body(46, 'p-wp')]),
    ).toEqual([]);
  });

  it('takes no scan body on an analog impression, and asks nothing more of it', () => {
    expect(checkScanBodies('analog', sites, [])).toEqual([]);
    expect(codes(checkScanBodies('analog', sites, [body(44, 'p-rp')]))).toEqual([
      ['scan-body-on-analog-impression', 44],
    ]);
  });
});

describe('seating radiograph of the scan bodies [common practice]: asked for where the practice requires it', () => {
  it('warns on a digital impression without a linked radiograph when the practice asks for one', () => {
    const found = seatingRadiographFindings('digital', false, true);
    expect(found.map((f) => [f.severity, f.code])).toEqual([['warning', 'scan-body-seating-radiograph-missing']]);
    expect(found[0].source).toBe('common practice');
  });

  it('asks nothing once a radiograph is linked, of an analog impression, or when the practice does not ask', () => {
    expect(seatingRadiographFindings('digital', true, true)).toEqual([]);
    expect(seatingRadiographFindings('analog', false, true)).toEqual([]);
    expect(seatingRadiographFindings('digital', false, false)).toEqual([]);
  });
});
