import { Button } from '@blueprintjs/core';
import type { StackPart } from '@torquetrail/contracts';
import { useState } from 'react';
import { Can } from '../../../lib/ability';
import { TorqueForm } from './torque-form';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import './torque.css';

/** "Log torque": shown only to those who may record torque; opens the torque entry form inline. */
export function LogTorquePanel({ siteId, parts }: { siteId: string; parts: StackPart[] }) {
  const [open, setOpen] = useState(false);
  useCloseOnEscape(open, () => setOpen(false));
  return (
    <Can I="create" a="TorqueEvent">
      <Button
        className="log-torque"
        icon="wrench"
        text="Log torque"
        intent="primary"
        data-testid="log-torque-button"
        aria-expanded={open}
        onClick={() => setOpen((v) => !v)}
      />
      {open && (
        <div className="log-torque__panel">
          <TorqueForm siteId={siteId} parts={parts} onDone={() => setOpen(false)} />
        </div>
      )}
    </Can>
  );
}
