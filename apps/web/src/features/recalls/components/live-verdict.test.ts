// The exam form's live status uses the domain's classifyPeriImplant (Berglundh et al. 2018
// consensus report); these check the form's wiring: parsing, completeness, the baseline used.
import { describe, expect, it } from 'vitest';
import { boneLevelSourceId, depthProblem, draftFromExam, emptyDraft, liveVerdict, parseMm } from './live-verdict';

const filled = (depths: string[], bop: number[] = []) => ({
  ...emptyDraft(),
  depths,
  bop: depths.map((_, i) => bop.includes(i)),
});

describe('live verdict of the exam form', () => {
  it('waits for all six depths', () => {
    expect(liveVerdict(emptyDraft(), null)).toEqual({ state: 'incomplete', message: 'Enter the six probing depths' });
    expect(liveVerdict(filled(['3', '3', '3', '3', '3', '']), null)).toMatchObject({
      message: 'Enter 1 more probing depth',
    });
  });
  it('accepts 0.5 mm steps and a decimal comma; rejects 3.3 and 16 (contract: 0–15 mm, 0.5 mm steps)', () => {
    expect(parseMm('3,5')).toBe(3.5);
    expect(depthProblem('3.5')).toBeNull();
    expect(depthProblem('3.3')).toMatch(/0.5 mm steps/);
    expect(depthProblem('16')).toMatch(/0–15/);
    expect(depthProblem('x')).toBe('a number of mm');
  });
  it('no baseline: BOP with a 6 mm pocket is mucositis, peri-implantitis not excluded (Berglundh et al. 2018)', () => {
    const v = liveVerdict(filled(['3', '6', '3', '3', '3', '3'], [1]), null);
    expect(v.state === 'ready' && v.result.status).toBe('mucositis');
    expect(v.state === 'ready' && v.result.flags).toContain('peri-implantitis-not-excluded-without-baseline');
  });
  it('uses a baseline with a bone level, unless the exam itself is marked as baseline', () => {
    const baseline = {
      sites: [3, 3, 3, 3, 3, 3].map((pd) => ({
        position: 'buccal' as const,
        probingDepthMm: pd,
        bleeding: false,
        suppuration: false,
      })),
      boneLevelMm: 1,
    } as never;
    const draft = { ...filled(['5', '3', '3', '3', '3', '3'], [0]), boneLevelMm: '2' };
    const v = liveVerdict(draft, baseline);
    expect(v.state === 'ready' && [v.result.status, v.usedBaseline]).toEqual(['peri-implantitis', true]);
    const asBaseline = liveVerdict({ ...draft, isBaseline: true }, baseline);
    expect(asBaseline.state === 'ready' && asBaseline.usedBaseline).toBe(false);
  });
});

describe('an amendment starts from the saved exam', () => {
  it('loads depths in chart order whatever order the sites came in, and the other fields as text', () => {
    const positions = ['lingual', 'mesiobuccal', 'distolingual', 'buccal', 'mesiolingual', 'distobuccal'] as const;
    const depth = { mesiobuccal: 1, buccal: 2, distobuccal: 3, mesiolingual: 4, lingual: 5, distolingual: 6 };
    const exam = {
      sites: positions.map((position) => ({
        position,
        probingDepthMm: depth[position],
        bleeding: position === 'buccal',
        suppuration: false,
      })),
      mobility: false,
      plaqueIndex: 1,
      bleedingIndex: null,
      keratinizedMucosaMm: 2.5,
      residualCement: true,
      boneLevelMm: null,
      isBaseline: false,
      notes: null,
    } as never;
    const draft = draftFromExam(exam);
    expect(draft.depths).toEqual(['1', '2', '3', '4', '5', '6']);
    expect(draft.bop).toEqual([false, true, false, false, false, false]);
    expect([
      draft.plaqueIndex,
      draft.bleedingIndex,
      draft.keratinizedMucosaMm,
      draft.boneLevelMm,
      draft.notes,
      draft.residualCement,
    ]).toEqual(['1', '', '2.5', '', '', true]);
  });
});

describe('the bone level accepted from a radiograph measurement', () => {
  const source = { measurementId: '5d0c8f4e-2f4b-4a55-9d8e-2b1f0c6a7e10', boneLevelMm: 2.9 };
  it('names its measurement while the field holds the accepted value (decimal comma too)', () => {
    expect(boneLevelSourceId({ boneLevelMm: '2.9', boneLevelSource: source })).toBe(source.measurementId);
    expect(boneLevelSourceId({ boneLevelMm: '2,9', boneLevelSource: source })).toBe(source.measurementId);
  });
  it("typed over or emptied, the value is the hygienist's own: no source", () => {
    expect(boneLevelSourceId({ boneLevelMm: '3.0', boneLevelSource: source })).toBeNull();
    expect(boneLevelSourceId({ boneLevelMm: '', boneLevelSource: source })).toBeNull();
    expect(boneLevelSourceId({ boneLevelMm: '2.9', boneLevelSource: null })).toBeNull();
  });
});
