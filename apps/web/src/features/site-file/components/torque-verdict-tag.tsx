import { type IconName, type Intent, Tag } from '@blueprintjs/core';
import type { TorqueVerdict } from '@torquetrail/contracts';

const VERDICT: Record<TorqueVerdict, { intent: Intent; icon: IconName; text: string }> = {
  within: { intent: 'success', icon: 'tick-circle', text: 'Within specification' },
  under: { intent: 'warning', icon: 'arrow-down', text: 'Under specification' },
  over: { intent: 'danger', icon: 'arrow-up', text: 'Over specification' },
};

/** The torque verdict in words and an icon, never by colour alone. */
export function TorqueVerdictTag({ verdict }: { verdict: TorqueVerdict }) {
  const { intent, icon, text } = VERDICT[verdict];
  return (
    <Tag intent={intent} icon={icon} minimal={verdict === 'within'}>
      {text}
    </Tag>
  );
}
