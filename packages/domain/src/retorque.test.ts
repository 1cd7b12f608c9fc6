// Re-tighten about 10 minutes after the first tightening: Siamos G, Winkler S, Boberick KG 2002,
// J Oral Implantol 28:67–73 [pub]. Moved from the API's Site file tests with the rule.
import { describe, expect, it } from 'vitest';
import { retorqueDueAt } from './retorque.js';
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
