import { type IconName, type Intent, Tag } from '@blueprintjs/core';
import type { TorqueVerdict } from '@torquetrail/contracts';
import { TORQUE_VERDICT_LABEL } from '../../../lib/clinical-labels';

const VERDICT: Record<TorqueVerdict, { intent: Intent; icon: IconName }> = {
  within: { intent: 'success', icon: 'tick-circle' },
  under: { intent: 'warning', icon: 'arrow-down' },
  over: { intent: 'danger', icon: 'arrow-up' },
};

/** The torque verdict in words and an icon, never by colour alone. */
export function TorqueVerdictTag({ verdict }: { verdict: TorqueVerdict }) {
  const { intent, icon } = VERDICT[verdict];
  const text = TORQUE_VERDICT_LABEL[verdict];
  return (
    <Tag intent={intent} icon={icon} minimal={verdict === 'within'}>
      {text}
    </Tag>
  );
}
