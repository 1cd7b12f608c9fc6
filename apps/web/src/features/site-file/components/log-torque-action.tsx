import { Button, Callout } from '@blueprintjs/core';
import { useState } from 'react';
import { Can } from '../../../lib/ability';

/**
 * "Log torque", shown only to those who may record torque (restorative dentists); everyone else
 * sees no edit control at all. Rendered inside the Stack's heading row, the notice wraps below.
 *
 * PLACEHOLDER — the torque entry form lands with the restoration ledger issue. Until then the
 * button only says, inline, that torque entry is not available in this build.
 */
export function LogTorqueAction() {
  const [open, setOpen] = useState(false);
  return (
    <Can I="create" a="TorqueEvent">
      <Button
        className="log-torque"
        icon="wrench"
        text="Log torque"
        intent="primary"
        data-testid="log-torque-button"
        aria-expanded={open}
        aria-controls={open ? 'log-torque-notice' : undefined}
        onClick={() => setOpen((value) => !value)}
      />
      {open && (
        <Callout id="log-torque-notice" intent="primary" icon="info-sign" className="log-torque__notice" role="status">
          Torque entry is not yet available in this build: the form arrives with the restoration ledger.
        </Callout>
      )}
    </Can>
  );
}
