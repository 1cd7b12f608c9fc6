import '../components/recalls.css';
import { Button, Callout } from '@blueprintjs/core';
import { RecallPolicyBody, type RecallPolicyReply } from '@torquetrail/contracts';
import {
  DEFAULT_OVERDUE_REMINDER_DAYS_AFTER,
  DEFAULT_RECALL_MONTHS,
  DEFAULT_REMINDER_DAYS_BEFORE,
  DEFAULT_RISK_RECALL_MONTHS,
  RECALL_RISK_FACTORS,
} from '@torquetrail/domain';
import { FormProvider } from 'react-hook-form';
import { useAppAbility } from '../../../lib/ability';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { RISK_FACTOR_LABEL } from '../../../lib/clinical-labels';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { applyServerErrors, FormField, formErrorMessage, NumberInput, useContractForm } from '../../../lib/forms';
import { useRecallPolicy, useUpdatePolicy } from '../api/recalls-api';
import { runMutation } from '../../../lib/run-mutation';
import { InsertReviewSection } from '../components/insert-review-settings';

const riskFactors = RECALL_RISK_FACTORS.map((factor, i) =>
  i === 0 ? RISK_FACTOR_LABEL[factor] : RISK_FACTOR_LABEL[factor].toLowerCase(),
).join(', ');

const FIELDS: { key: keyof RecallPolicyBody; label: string; help: string }[] = [
  {
    key: 'baseMonths',
    label: 'Recall interval (months)',
    help: `Without risk factors. Default ${DEFAULT_RECALL_MONTHS}.`,
  },
  {
    key: 'riskMonths',
    label: 'Interval with risk factors (months)',
    help: `${riskFactors}. Default ${DEFAULT_RISK_RECALL_MONTHS}.`,
  },
  {
    key: 'reminderDaysBefore',
    label: 'Reminder, days before the recall',
    help: `Default ${DEFAULT_REMINDER_DAYS_BEFORE}.`,
  },
  {
    key: 'overdueReminderDaysAfter',
    label: 'Overdue reminder, days after',
    help: `Default ${DEFAULT_OVERDUE_REMINDER_DAYS_AFTER}.`,
  },
];

/** /recalls/policy: the practice's recall intervals and reminder timing (practice admin edits). */
export function PolicyRoute() {
  const policy = useRecallPolicy();
  // Other roles read the policy; a form they could not save would be a dead end.
  const canEdit = useAppAbility().can('update', 'RecallPolicy');
  if (policy.isPending) return <LoadingState label="Loading the recall policy" />;
  if (policy.isError)
    return <ErrorState title="Could not load the policy" error={policy.error} onRetry={() => void policy.refetch()} />;
  return (
    <div className="recall-policy">
      <title>Recall policy · Torquetrail</title>
      <BreadcrumbTrail items={[{ text: 'Recall desk', to: '/recalls' }, { text: 'Recall policy' }]} />
      <h1 className="page-title">Recall policy</h1>
      <p>
        No published algorithm fixes the interval; this is the practice&apos;s policy (examine at least every 6 months,
        more often at higher risk: Herrera et al. 2023, EFP S3 guideline).{' '}
        {policy.data.isDefault ? 'The defaults are in use.' : ''}
      </p>
      {canEdit ? <PolicyForm policy={policy.data} /> : <PolicySummary policy={policy.data} />}
      <InsertReviewSection />
    </div>
  );
}

/** The policy to read, for the roles that work with it but do not set it. */
function PolicySummary({ policy }: { policy: RecallPolicyReply }) {
  return (
    <>
      <dl className="recall-policy__summary" data-testid="recall-policy-summary">
        {FIELDS.map((f) => (
          <div key={f.key}>
            <dt>{f.label}</dt>
            <dd>
              {policy[f.key]} <span className="recall-policy__help">{f.help}</span>
            </dd>
          </div>
        ))}
      </dl>
      <p>The practice administrator sets the policy.</p>
    </>
  );
}

/** The policy as loaded first; saving does not reset what is being edited. */
function PolicyForm({ policy }: { policy: RecallPolicyReply }) {
  const update = useUpdatePolicy();
  const form = useContractForm(RecallPolicyBody, {
    baseMonths: policy.baseMonths,
    riskMonths: policy.riskMonths,
    reminderDaysBefore: policy.reminderDaysBefore,
    overdueReminderDaysAfter: policy.overdueReminderDaysAfter,
  });
  const submit = (body: RecallPolicyBody) =>
    runMutation(update, body, { onError: (error) => applyServerErrors(form.setError, error) });
  const formError = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      {/* A submit the contract refuses is no save: the last "Saved." goes with it. */}
      <form onSubmit={(event) => void form.handleSubmit(submit, () => update.reset())(event)}>
        {FIELDS.map((f) => (
          <FormField key={f.key} name={f.key} label={f.label} labelFor={`policy-${f.key}`} help={f.help}>
            <NumberInput name={f.key} emptyValue={0} buttonPosition="none" id={`policy-${f.key}`} min={0} max={180} />
          </FormField>
        ))}
        <Button type="submit" intent="primary" loading={update.isPending}>
          Save policy
        </Button>
        {update.isSuccess && <Callout intent="success">Saved. New exams are scheduled with this policy.</Callout>}
        {formError && <Callout intent="danger">{formError}</Callout>}
      </form>
    </FormProvider>
  );
}
