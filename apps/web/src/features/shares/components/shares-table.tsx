import { Button, Callout, HTMLTable, InputGroup, Tag } from '@blueprintjs/core';
import { RevokeShareBody, type Share } from '@torquetrail/contracts';
import { FormProvider } from 'react-hook-form';
import { useState } from 'react';
import { Can } from '../../../lib/ability';
import { applyServerErrors, FormField, formErrorMessage, useContractForm, withInputRef } from '../../../lib/forms';
import { formatDate } from '../../../lib/dates';
import { SHARE_SCOPE_LABEL, SHARE_STATUS_LABEL } from '../../../lib/labels';
import { useRevokeShare } from '../api/shares-api';
import { ChartNumber } from '../../../lib/components/chart-number';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { runMutation } from '../../../lib/run-mutation';

const STATUS_INTENT = { invited: 'primary', active: 'success', ended: 'none', revoked: 'warning' } as const;

/** Shares, newest first; an active one can be revoked (with a reason) by whoever may change shares. */
export function SharesTable({ shares, showPatient }: { shares: readonly Share[]; showPatient: boolean }) {
  return (
    <div className="table-scroll">
      <HTMLTable striped compact className="shares-table" data-testid="shares-table">
        <thead>
          <tr>
            {showPatient && <th scope="col">Patient</th>}
            <th scope="col">Surgeon</th>
            <th scope="col">Scope</th>
            <th scope="col">Sites</th>
            <th scope="col">Until</th>
            <th scope="col">Reason</th>
            <th scope="col">Status</th>
            <th scope="col">
              <span className="bp6-text-muted">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {shares.map((share) => (
            <tr key={share.id} data-testid={`share-${share.id}`}>
              {showPatient && (
                <td>
                  {share.patientName} <ChartNumber value={share.chartNumber} />
                </td>
              )}
              <td>
                {share.surgeon.displayName ?? share.surgeon.email}
                <div className="shares-table__note">
                  {share.surgeon.displayName === null
                    ? 'Invited to Torquetrail, not signed up yet'
                    : `${share.surgeon.email} · ${share.surgeon.practiceName ?? ''}`}
                </div>
              </td>
              <td>{share.scopes.map((s) => SHARE_SCOPE_LABEL[s]).join(' and ')}</td>
              <td>{share.sites === null ? 'All implant sites' : share.sites.map((s) => s.fdi).join(', ')}</td>
              <td>{share.endsOn ? formatDate(share.endsOn) : 'Until revoked'}</td>
              <td>{share.reason}</td>
              <td>
                <Tag minimal intent={STATUS_INTENT[share.status]}>
                  {SHARE_STATUS_LABEL[share.status]}
                </Tag>
                {share.status === 'invited' && share.invitationExpiresAt && (
                  <div className="shares-table__note">
                    Until {formatDate(share.invitationExpiresAt.slice(0, 10))} unless they sign up
                  </div>
                )}
                {share.revokedAt && (
                  <div className="shares-table__note">
                    {formatDate(share.revokedAt.slice(0, 10))} by {share.revokedByName}: {share.revokeReason}
                  </div>
                )}
              </td>
              <td>
                {(share.status === 'active' || share.status === 'invited') && (
                  <Can I="update" a="Share">
                    <RevokeControl share={share} />
                  </Can>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </HTMLTable>
    </div>
  );
}

function RevokeControl({ share }: { share: Share }) {
  const revoke = useRevokeShare();
  const [open, setOpen] = useState(false);
  useCloseOnEscape(open, () => setOpen(false));
  const form = useContractForm(RevokeShareBody, { reason: '' });
  if (!open)
    return (
      <Button small icon="disable" onClick={() => setOpen(true)}>
        Revoke
      </Button>
    );
  const submit = (body: RevokeShareBody) =>
    runMutation(revoke, { id: share.id, ...body }, { onError: (error) => applyServerErrors(form.setError, error) });
  const message = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <form
        className="shares-revoke"
        aria-label={`Revoke the share with ${share.surgeon.displayName ?? share.surgeon.email}`}
        noValidate
        onSubmit={(event) => void form.handleSubmit(submit)(event)}
      >
        <FormField name="reason" label="Why the share ends" labelFor={`revoke-${share.id}`}>
          {(a11y) => (
            <InputGroup small id={`revoke-${share.id}`} {...a11y} {...withInputRef(form.register('reason'))} />
          )}
        </FormField>
        <Button small type="submit" intent="danger" loading={revoke.isPending}>
          Revoke now
        </Button>
        <Button small minimal onClick={() => setOpen(false)}>
          Cancel
        </Button>
        {message && (
          <Callout intent="danger" role="alert">
            {message}
          </Callout>
        )}
      </form>
    </FormProvider>
  );
}
