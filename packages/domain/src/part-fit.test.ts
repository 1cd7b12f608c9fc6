import { describe, expect, it } from 'vitest';
import { catalogueValueFindings, catalogueValuesRead, type PartValues } from './catalogue-values.js';
import {
  engagingFindings,
  impressionLevelFindings,
  impressionLevelFor,
  PART_FIT_FINDING_CODES as C,
} from './part-fit.js';
import { type CopingLevel, RETENTIONS } from './choices.js';

// Sources. Coping level: a restoration screwed to multi-unit abutments is made on the abutments, so
// the impression records them with multi-unit level copings or scan bodies; any other restoration is
// recorded at implant level [common practice]. Engaging: a single unit needs an anti-rotational
// (engaging) connection or it turns and its screw loosens; splinted units are kept from turning by
// the splint [common practice] — the same reasoning as the existing `non-engaging-single-crown`
// rule (docs/clinical-rules.md §8). The severity of a value the catalogue does not state is a
// [decision] recorded in docs/clinical-rules.md §8c.

const rows = (findings: { code: string; fdi?: number; severity: string }[]) =>
  findings.map((f) => [f.code, f.fdi, f.severity]);
const coping = (copingLevel: CopingLevel | null): PartValues => ({
  name: 'Coping Z',
  kind: 'impression-coping',
  angleDeg: null,
  engaging: false,
  copingLevel,
});

describe('impressionLevelFor — the level the impression records', () => {
  it('multi-unit only for a restoration screwed to multi-unit abutments, implant level for every other', () => {
    expect(RETENTIONS.map((r) => [r, impressionLevelFor(r)])).toEqual([
      ['screw-to-implant', 'implant'],
      ['screw-to-multi-unit', 'multi-unit'],
      ['cement-on-abutment', 'implant'],
      ['lingual-set-screw', 'implant'],
    ]);
  });
});

describe('impressionLevelFindings — a coping or scan body of the level the restoration needs [common practice]', () => {
  it('worked case: bridge on multi-units at 34 and 44; a multi-unit scan body passes, an implant-level one is an error', () => {
    expect(
      impressionLevelFindings('screw-to-multi-unit', 34, 'scan body', { name: 'SB-M', copingLevel: 'multi-unit' }),
    ).toEqual([]);
    const wrong = impressionLevelFindings('screw-to-multi-unit', 44, 'scan body', {
      name: 'Scan body X',
      copingLevel: 'implant',
    });
    expect(rows(wrong)).toEqual([[C.COPING_LEVEL_MISMATCH, 44, 'error']]);
    expect(wrong[0].message).toBe(
      'Site 44: Scan body X works at implant level, but this restoration is screwed to multi-unit abutments: the impression must record the abutment with a multi-unit level scan body.',
    );
  });

  it('worked case: cemented crown at 36 with a multi-unit coping: an error, there is no multi-unit abutment', () => {
    const f = impressionLevelFindings('cement-on-abutment', 36, 'coping', {
      name: 'Coping M',
      copingLevel: 'multi-unit',
    });
    expect(rows(f)).toEqual([[C.COPING_LEVEL_MISMATCH, 36, 'error']]);
    expect(f[0].message).toMatch(/^Site 36: Coping M works on a multi-unit abutment, but this restoration has none/);
  });

  it('a part whose catalogue entry states no level: a warning naming the level needed', () => {
    const f = impressionLevelFindings('screw-to-multi-unit', 33, 'coping', { name: 'Coping Q', copingLevel: null });
    expect(rows(f)).toEqual([[C.COPING_LEVEL_MISSING, 33, 'warning']]);
    expect(f[0].message).toMatch(
      /^Site 33: the catalogue does not state whether Coping Q works at implant level or on a multi-unit abutment.*multi-unit level impression coping/,
    );
  });

  it("catalogueValueFindings reads the chosen coping's level for the plan", () => {
    const onMua = { kind: 'splinted-bridge', retention: 'screw-to-multi-unit' } as const;
    expect(rows(catalogueValueFindings(onMua, [{ fdi: 33, impressionCoping: coping('multi-unit') }]))).toEqual([]);
    expect(rows(catalogueValueFindings(onMua, [{ fdi: 33, impressionCoping: coping('implant') }]))).toEqual([
      [C.COPING_LEVEL_MISMATCH, 33, 'error'],
    ]);
    expect(catalogueValuesRead('impression-coping')).toContain('copingLevel');
    expect(catalogueValuesRead('scan-body')).toEqual(['copingLevel']);
  });
});

describe('engagingFindings — the abutment under a restoration that sits on abutments [common practice]', () => {
  const abutment = (engaging: boolean | null) => ({ name: 'Stock abutment 4.3', engaging });

  it('worked case: single crown cemented at 46 on an engaging abutment with an engaging connection passes', () => {
    expect(
      engagingFindings({ kind: 'single-crown' }, [{ fdi: 46, interface: 'engaging', abutment: abutment(true) }]),
    ).toEqual([]);
  });

  it('single crown on a non-engaging abutment: an error in plain words, whatever the plan says of the connection', () => {
    const f = engagingFindings({ kind: 'single-crown' }, [
      { fdi: 46, interface: 'engaging', abutment: abutment(false) },
    ]);
    expect(rows(f)).toEqual([[C.ABUTMENT_NON_ENGAGING_SINGLE, 46, 'error']]);
    expect(f[0].message).toBe(
      'Site 46: Stock abutment 4.3 is non-engaging. A single crown needs an engaging (anti-rotational) abutment: on a non-engaging one the crown and abutment can turn and the screw loosen.',
    );
  });

  it('splinted bridge cemented on 34 and 36: either is accepted, but the abutment must agree with the stated connection', () => {
    const bridge = { kind: 'splinted-bridge' } as const;
    expect(
      engagingFindings(bridge, [
        { fdi: 34, interface: 'non-engaging', abutment: abutment(false) },
        { fdi: 36, interface: 'engaging', abutment: abutment(true) },
      ]),
    ).toEqual([]);
    const f = engagingFindings(bridge, [{ fdi: 36, interface: 'non-engaging', abutment: abutment(true) }]);
    expect(rows(f)).toEqual([[C.ABUTMENT_INTERFACE_DISAGREES, 36, 'error']]);
    expect(f[0].message).toMatch(/is engaging, but the plan says the connection there is non-engaging/);
  });

  it('engaging not stated: an error for a single crown, a warning on splinted units [decision]', () => {
    expect(rows(engagingFindings({ kind: 'single-crown' }, [{ fdi: 46, abutment: abutment(null) }]))).toEqual([
      [C.ABUTMENT_ENGAGING_MISSING, 46, 'error'],
    ]);
    expect(rows(engagingFindings({ kind: 'full-arch' }, [{ fdi: 46, abutment: abutment(null) }]))).toEqual([
      [C.ABUTMENT_ENGAGING_MISSING, 46, 'warning'],
    ]);
  });

  it('catalogueValueFindings judges abutments only where the restoration sits on them', () => {
    const part: PartValues = {
      name: 'Angled 15',
      kind: 'abutment-angled',
      angleDeg: 15,
      engaging: false,
      copingLevel: null,
    };
    const site = { fdi: 46, interface: 'engaging' as const, abutment: part };
    expect(rows(catalogueValueFindings({ kind: 'single-crown', retention: 'lingual-set-screw' }, [site]))).toEqual([
      [C.ABUTMENT_NON_ENGAGING_SINGLE, 46, 'error'],
    ]);
    expect(catalogueValueFindings({ kind: 'single-crown', retention: 'screw-to-implant' }, [site])).toEqual([]);
  });
});
