import '../components/recalls.css';
import { Button, Callout, FormGroup, NumericInput } from '@blueprintjs/core';
import type { RecallPolicyBody } from '@torquetrail/contracts';
import { DEFAULT_OVERDUE_REMINDER_DAYS_AFTER, DEFAULT_RECALL_MONTHS, DEFAULT_REMINDER_DAYS_BEFORE, DEFAULT_RISK_RECALL_MONTHS, RECALL_RISK_FACTORS } from '@torquetrail/domain';
import { useEffect, useState } from 'react';
import { isApiError } from '../../../lib/api-client';
import { RISK_FACTOR_LABEL } from '../../../lib/clinical-labels';
import { Can } from '../../../lib/ability';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { useRecallPolicy, useUpdatePolicy } from '../api/recalls-api';

const riskFactors = RECALL_RISK_FACTORS.map((factor, i) => (i === 0 ? RISK_FACTOR_LABEL[factor] : RISK_FACTOR_LABEL[factor].toLowerCase())).join(', ');

const FIELDS: { key: keyof RecallPolicyBody; label: string; help: string }[] = [
  { key: 'baseMonths', label: 'Recall interval (months)', help: `Without risk factors. Default ${DEFAULT_RECALL_MONTHS}.` },
  { key: 'riskMonths', label: 'Interval with risk factors (months)', help: `${riskFactors}. Default ${DEFAULT_RISK_RECALL_MONTHS}.` },
  { key: 'reminderDaysBefore', label: 'Reminder, days before the recall', help: `Default ${DEFAULT_REMINDER_DAYS_BEFORE}.` },
  { key: 'overdueReminderDaysAfter', label: 'Overdue reminder, days after', help: `Default ${DEFAULT_OVERDUE_REMINDER_DAYS_AFTER}.` },
];

/** /recalls/policy: the practice's recall intervals and reminder timing (practice admin edits). */
export function PolicyRoute() {
  const policy = useRecallPolicy();
  const update = useUpdatePolicy();
  const [form, setForm] = useState<RecallPolicyBody | null>(null);
  useEffect(() => {
    if (policy.data && !form) setForm({ baseMonths: policy.data.baseMonths, riskMonths: policy.data.riskMonths, reminderDaysBefore: policy.data.reminderDaysBefore, overdueReminderDaysAfter: policy.data.overdueReminderDaysAfter });
  }, [policy.data, form]);
  if (policy.isPending || !form) return policy.isError ? <ErrorState title="Could not load the policy" error={policy.error} onRetry={() => void policy.refetch()} /> : <LoadingState label="Loading the recall policy" />;
  const fields = isApiError(update.error) ? update.error.fields : {};
  return (
    <div className="recall-policy">
      <title>Recall policy · Torquetrail</title>
      <BreadcrumbTrail items={[{ text: 'Recall desk', to: '/recalls' }, { text: 'Recall policy' }]} />
      <h1 className="page-title">Recall policy</h1>
      <p>
        No published algorithm fixes the interval; this is the practice&apos;s policy (examine at least every 6 months, more often at higher
        risk: Herrera et al. 2023, EFP S3 guideline). {policy.data?.isDefault ? 'The defaults are in use.' : ''}
      </p>
      <form
        onSubmit={(e) => {
          e.preventDefault();
          update.mutate(form);
        }}
      >
        {FIELDS.map((f) => (
          <FormGroup key={f.key} label={f.label} labelFor={`policy-${f.key}`} helperText={fields[f.key] ?? f.help} intent={fields[f.key] ? 'danger' : 'none'}>
            <NumericInput buttonPosition="none" id={`policy-${f.key}`} min={0} max={180} value={form[f.key]} onValueChange={(v) => setForm({ ...form, [f.key]: Number.isFinite(v) ? v : 0 })} />
          </FormGroup>
        ))}
        <Can I="update" a="RecallPolicy">
          <Button type="submit" intent="primary" loading={update.isPending}>
            Save policy
          </Button>
        </Can>
        {update.isSuccess && <Callout intent="success">Saved. New exams are scheduled with this policy.</Callout>}
        {update.isError && !Object.keys(fields).length && <Callout intent="danger">{update.error.message}</Callout>}
      </form>
    </div>
  );
}
