import { Callout, Checkbox, type IconName, type Intent } from '@blueprintjs/core';
import type { Finding, FindingSeverity } from '@torquetrail/contracts';
import { FINDING_SEVERITY_LABEL } from '../../../lib/clinical-labels';
import { ackKey } from './plan-state';

const LOOK: Record<FindingSeverity, { intent: Intent; icon: IconName }> = {
  error: { intent: 'danger', icon: 'error' },
  warning: { intent: 'warning', icon: 'warning-sign' },
  info: { intent: 'primary', icon: 'info-sign' },
};

/** Findings as they arise: errors block saving, warnings need the clinician's acknowledgement, notes ask nothing. */
export function FindingsPanel({
  findings,
  acknowledged,
  onAcknowledge,
}: {
  findings: Finding[];
  acknowledged: string[];
  onAcknowledge: (key: string, on: boolean) => void;
}) {
  return (
    <section className="planner-findings" aria-labelledby="findings-heading" aria-live="polite" data-testid="findings">
      <h2 id="findings-heading">Findings</h2>
      <p className="muted">Findings are advice, not a diagnosis: they point at what to check; the clinician decides.</p>
      {findings.length === 0 ? (
        <Callout intent="success" icon="tick" compact data-testid="no-findings">
          No findings for this plan.
        </Callout>
      ) : (
        <ul className="planner-findings__list">
          {findings.map((f) => (
            <li key={ackKey(f)} data-testid={`finding-${f.severity}`} data-code={f.code}>
              <Callout intent={LOOK[f.severity].intent} icon={LOOK[f.severity].icon} compact>
                <strong>
                  {FINDING_SEVERITY_LABEL[f.severity]}
                  {f.fdi ? ` at ${f.fdi}` : ''}:
                </strong>{' '}
                {f.message}
                {f.source && <span className="planner-findings__source"> Source: {f.source}.</span>}
                {f.severity === 'warning' && (
                  <Checkbox
                    label="I have read this warning and accept the plan"
                    checked={acknowledged.includes(ackKey(f))}
                    onChange={(e) => onAcknowledge(ackKey(f), e.currentTarget.checked)}
                  />
                )}
              </Callout>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
