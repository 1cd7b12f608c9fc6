import { Button, NumericInput } from '@blueprintjs/core';
import { type CatalogueComponent, TOLERANCE_PCT_RANGE } from '@torquetrail/contracts';
import { TORQUE_NCM_RANGE } from '@torquetrail/domain';
import { useState } from 'react';
import { Can } from '../../../lib/ability';
import { isApiError } from '../../../lib/api-client';
import { useSaveComponent } from '../api/catalogue-api';
import { COMPONENT_KIND_LABEL, INTERFACE_LABEL, TRAY_LABEL } from '../../../lib/clinical-labels';

/** One part: its torque specification and tolerance, editable by the practice admin. */
export function ComponentRow({ part }: { part: CatalogueComponent }) {
  const [editing, setEditing] = useState(false);
  const [spec, setSpec] = useState<number | null>(part.torqueSpecNcm);
  const [tol, setTol] = useState(part.tolerancePct);
  const save = useSaveComponent();
  const fields = isApiError(save.error) ? save.error.fields : {};
  return (
    <tr data-testid="catalogue-part">
      <td>{part.name}</td>
      <td className="mono">{part.referenceCode}</td>
      <td>{COMPONENT_KIND_LABEL[part.kind]}</td>
      <td>{part.engaging === null ? '—' : INTERFACE_LABEL[part.engaging ? 'engaging' : 'non-engaging'].toLowerCase()}{part.tray ? `, ${TRAY_LABEL[part.tray].toLowerCase()}` : ''}{part.angleDeg ? `, ${part.angleDeg}°` : ''}{part.collarHeightMm ? `, collar ${part.collarHeightMm} mm` : ''}</td>
      <td>
        {editing ? (
          <>
            <NumericInput buttonPosition="none" aria-label={`Torque of ${part.referenceCode} (N·cm, empty = hand-tight)`} min={TORQUE_NCM_RANGE.min} max={TORQUE_NCM_RANGE.max} value={spec ?? ''} onValueChange={(v) => setSpec(Number.isFinite(v) ? v : null)} intent={fields.torqueSpecNcm ? 'danger' : 'none'} />
            {fields.torqueSpecNcm && <span className="planner-error">{fields.torqueSpecNcm}</span>}
          </>
        ) : part.torqueSpecNcm === null ? (
          'hand-tight'
        ) : (
          `${part.torqueSpecNcm} N·cm`
        )}
      </td>
      <td>{editing ? <NumericInput buttonPosition="none" aria-label={`Tolerance of ${part.referenceCode} (%)`} min={TOLERANCE_PCT_RANGE.min} max={TOLERANCE_PCT_RANGE.max} value={tol} onValueChange={setTol} /> : `±${part.tolerancePct} %`}</td>
      <td>{part.requiresLot ? 'lot required' : ''}{part.inUse ? (part.requiresLot ? ', in use' : 'in use') : ''}</td>
      <Can I="update" a="Catalogue">
        <td>
          {editing ? (
            <>
              <Button small intent="primary" text="Save" loading={save.isPending} onClick={() => save.mutate({ id: part.id, body: { torqueSpecNcm: spec, tolerancePct: tol } }, { onSuccess: () => setEditing(false) })} />
              <Button small variant="minimal" text="Cancel" onClick={() => setEditing(false)} />
            </>
          ) : (
            <Button small variant="minimal" icon="edit" text="Edit" onClick={() => setEditing(true)} />
          )}
        </td>
      </Can>
    </tr>
  );
}
