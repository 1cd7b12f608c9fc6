import { AnchorButton, Button, Callout, Tag } from '@blueprintjs/core';
import { useRef } from 'react';
import { Can } from '../../../lib/ability';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { formatDateTime } from '../../../lib/dates';
import { REMINDER_STATUS_LABEL } from '../../../lib/labels';
import { useReferralSummary, useSendReferralSummary } from '../api/outcomes-api';
import { runMutation } from '../../../lib/run-mutation';

/**
 * The patient's referral summary (PDF): download, or e-mail it to the surgeon of a share. One
 * idempotency key per press: a second click while the first is on its way is the same request.
 */
export function ReferralSummaryPanel({ patientId }: { patientId: string }) {
  const state = useReferralSummary(patientId);
  const send = useSendReferralSummary(patientId);
  const pressKey = useRef<string | null>(null);
  const press = (shareId: string) => {
    pressKey.current ??= crypto.randomUUID();
    runMutation(
      send,
      { shareId, idempotencyKey: pressKey.current },
      {
        onSettled: () => {
          pressKey.current = null;
        },
      },
    );
  };
  return (
    <section className="referral-summary" aria-labelledby="referral-heading" data-testid="referral-summary">
      <h2 id="referral-heading">Referral summary</h2>
      <p>
        Placement, the restoration delivered, the last recall status and the bone-level trend of each implant, as a PDF.
      </p>
      <AnchorButton icon="download" href={`/api/patients/${patientId}/referral-summary/pdf`} text="Download the PDF" />
      {state.isPending ? (
        <LoadingState label="Loading the referral summary" />
      ) : state.isError ? (
        <ErrorState
          title="Could not load the referral summary"
          error={state.error}
          onRetry={() => void state.refetch()}
        />
      ) : (
        <Can I="create" a="ReferralSummary">
          {state.data.recipients.length === 0 ? (
            <p>The patient is not shared with a surgeon, so there is no one to e-mail the summary to.</p>
          ) : (
            <ul>
              {state.data.recipients.map((r) => (
                <li key={r.shareId}>
                  <Button
                    icon="envelope"
                    loading={send.isPending}
                    onClick={() => press(r.shareId)}
                    text={`E-mail it to ${r.surgeonName} (${r.practiceName})`}
                  />
                </li>
              ))}
            </ul>
          )}
          {send.isError && (
            <Callout intent="danger" role="alert">
              The summary was not queued: {send.error.message}
            </Callout>
          )}
          {state.data.mails.length > 0 && (
            <ul aria-label="Referral summaries e-mailed" data-testid="referral-mails">
              {state.data.mails.map((m) => (
                <li key={m.id}>
                  {formatDateTime(m.requestedAt)} to {m.sentTo}:{' '}
                  <Tag minimal intent={m.status === 'sent' ? 'success' : m.status === 'failed' ? 'danger' : 'none'}>
                    {REMINDER_STATUS_LABEL[m.status]}
                  </Tag>
                </li>
              ))}
            </ul>
          )}
        </Can>
      )}
    </section>
  );
}
