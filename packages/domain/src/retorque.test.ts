// Re-tighten about 10 minutes after the first tightening: Siamos G, Winkler S, Boberick KG 2002,
// J Oral Implantol 28:67–73 [pub]. Moved from the API's Site file tests with the rule.
import { describe, expect, it } from 'vitest';
import { earlySettlingRetorque, retorqueDueAt, seatingTorqueMissing } from './retorque.js';
import { RETIGHTEN_AFTER_MINUTES } from './torque.js';

const at = (iso: string) => new Date(iso);

describe('retorqueDueAt (re-tighten about 10 min after the first tightening, Siamos et al. 2002)', () => {
  it('is due RETIGHTEN_AFTER_MINUTES after the initial seating until a re-torque follows it', () => {
    const seated = [{ reason: 'initial-seating' as const, performedAt: at('2026-12-01T10:00:00Z') }];
    expect(retorqueDueAt(seated)).toBe(
      new Date(Date.parse('2026-12-01T10:00:00Z') + RETIGHTEN_AFTER_MINUTES * 60_000).toISOString(),
    );
    expect(
      retorqueDueAt([...seated, { reason: 're-torque-after-settling', performedAt: at('2026-12-01T10:11:00Z') }]),
    ).toBeNull();
  });
  it('ignores a re-torque logged before the seating, and treats a replaced screw as a new seating', () => {
    expect(
      retorqueDueAt([
        { reason: 're-torque-at-recall', performedAt: at('2026-01-01T10:00:00Z') },
        { reason: 'initial-seating', performedAt: at('2026-12-01T10:00:00Z') },
      ]),
    ).not.toBeNull();
    expect(retorqueDueAt([{ reason: 'screw-replaced', performedAt: at('2026-12-01T10:00:00Z') }])).not.toBeNull();
    expect(retorqueDueAt([])).toBeNull();
    expect(retorqueDueAt([{ reason: 'loosening-found', performedAt: at('2026-12-01T10:00:00Z') }])).toBeNull();
  });
});

describe('seatingTorqueMissing [decision]', () => {
  it('flags a part with a specification and no seating logged; hand-tight parts never', () => {
    expect(seatingTorqueMissing(15, [])).toBe(true);
    expect(seatingTorqueMissing(15, [{ reason: 're-torque-at-recall', performedAt: at('2026-12-01T10:00:00Z') }])).toBe(
      true,
    );
    expect(seatingTorqueMissing(15, [{ reason: 'initial-seating', performedAt: at('2026-12-01T10:00:00Z') }])).toBe(
      false,
    );
    expect(seatingTorqueMissing(15, [{ reason: 'screw-replaced', performedAt: at('2026-12-01T10:00:00Z') }])).toBe(
      false,
    );
    expect(seatingTorqueMissing(null, [])).toBe(false);
  });
});

describe('earlySettlingRetorque (settling needs about 10 min, Siamos et al. 2002)', () => {
  const seated = [{ reason: 'initial-seating' as const, performedAt: at('2026-12-01T10:00:00Z') }];
  it('is early one minute after the seating and not at RETIGHTEN_AFTER_MINUTES', () => {
    expect(earlySettlingRetorque('re-torque-after-settling', at('2026-12-01T10:01:00Z'), seated)).toEqual({
      seatedAt: at('2026-12-01T10:00:00Z'),
      minutesAfter: 1,
    });
    const onTime = new Date(Date.parse('2026-12-01T10:00:00Z') + RETIGHTEN_AFTER_MINUTES * 60_000);
    expect(earlySettlingRetorque('re-torque-after-settling', onTime, seated)).toBeNull();
    expect(
      earlySettlingRetorque('re-torque-after-settling', new Date(onTime.getTime() - 1000), seated)?.minutesAfter,
    ).toBe(RETIGHTEN_AFTER_MINUTES - 1);
  });
  it('follows the latest seating before it; other reasons and no seating are never early', () => {
    const replaced = [...seated, { reason: 'screw-replaced' as const, performedAt: at('2026-12-01T11:00:00Z') }];
    expect(earlySettlingRetorque('re-torque-after-settling', at('2026-12-01T11:02:00Z'), replaced)?.minutesAfter).toBe(
      2,
    );
    expect(earlySettlingRetorque('re-torque-after-settling', at('2026-12-01T10:30:00Z'), replaced)).toBeNull();
    expect(earlySettlingRetorque('re-torque-at-recall', at('2026-12-01T10:01:00Z'), seated)).toBeNull();
    expect(earlySettlingRetorque('re-torque-after-settling', at('2026-12-01T10:01:00Z'), [])).toBeNull();
  });
});
