import { describe, it, expect } from 'vitest';
import * as domain from './index.js';

describe('package root exports the public API', () => {
  it.each([
    'fdiToUniversal', 'universalToFdi', 'formatTooth', 'toothKind', 'toothArch', 'isPrimaryTooth', 'isValidFdi',
    'classifyPeriImplant', 'gtinCheckDigit', 'isValidGtin', 'parseUdi', 'checkUdiForPlacement', 'divergenceDeg', 'pixelDistanceMm',
    'correctByKnownLength', 'torqueVerdict', 'albrektssonAllowanceMm', 'meetsAlbrektsson', 'icoiGrade',
    'minRestorativeSpaceMm', 'validateRestorationPlan', 'nextRecallDate',
    'torqueToleranceBand', 'retorqueDueAt', 'choosePeriImplantBaseline', 'toPeriImplantExam', 'toPeriImplantBaseline', 'remindersDue',
    'addCalendarDays', 'isRetrievable',
  ])('%s is a function', (name) => {
    expect(typeof (domain as Record<string, unknown>)[name]).toBe('function');
  });
  it('constants and error classes', () => {
    expect(domain.RULES_VERSION).toMatch(/^\d{4}\.\d{1,2}\.\d+$/);
    expect(domain.TOOTH_POSITIONS_PERMANENT).toHaveLength(32);
    expect(domain.TOOTH_POSITIONS_PRIMARY).toHaveLength(20);
    expect(new domain.UdiError('bad-date', 'x')).toBeInstanceOf(domain.DomainError);
    expect(new domain.ValidationError('empty', 'x')).toBeInstanceOf(domain.DomainError);
    expect(new domain.ToothPositionError('x')).toBeInstanceOf(RangeError);
    expect(new domain.UdiError('bad-date', 'x').name).toBe('UdiError');
    expect(domain.PERI_IMPLANT_FLAGS.PERI_IMPLANTITIS_NOT_EXCLUDED_WITHOUT_BASELINE).toBe('peri-implantitis-not-excluded-without-baseline');
  });
});
