import '../components/recalls.css';
import { Button, Callout, NonIdealState, TextArea } from '@blueprintjs/core';
import {
  AmendExamBody,
  CreateVisitBody,
  PROBING_POSITIONS,
  type CreateVisitReply,
  type ExamContext,
  type RecallExam,
} from '@torquetrail/contracts';
import { useMemo, useState } from 'react';
import { FormProvider, useWatch } from 'react-hook-form';
import { Link, useParams } from 'react-router-dom';
import { isApiError } from '../../../lib/api-client';
import { useAppAbility } from '../../../lib/ability';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { formatLongDate } from '../../../lib/dates';
import {
  applyServerErrors,
  DateField,
  draftSchema,
  formErrorMessage,
  FormField,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { MAINTENANCE_NOTE } from '../../../lib/labels';
import { MaintenanceStatusLabel } from '../../../lib/maintenance-status';
import { useAmendExam, useCreateVisit, useExamContext } from '../api/recalls-api';
import { CaseDefinitions } from '../components/case-definitions';
import { boneLevelSourceId, draftFromExam, emptyDraft, parseMm, type SiteDraft } from '../components/live-verdict';
import { SiteExamCard } from '../components/site-exam-card';
import { useCloseOnEscape } from '../../../lib/use-close-on-escape';
import { runMutation } from '../../../lib/run-mutation';

const num = (text: string) => (text.trim() === '' ? null : (parseMm(text) ?? Number.NaN));

/** The form's draft as the contract's exam input (the server validates and classifies). */
function toExamInput(d: SiteDraft) {
  return {
    sites: PROBING_POSITIONS.map((position, i) => ({
      position,
      probingDepthMm: num(d.depths[i]) ?? Number.NaN,
      bleeding: d.bop[i],
      suppuration: d.sup[i],
    })),
    mobility: d.mobility,
    plaqueIndex: d.plaqueIndex === '' ? null : Number(d.plaqueIndex),
    bleedingIndex: d.bleedingIndex === '' ? null : Number(d.bleedingIndex),
    keratinizedMucosaMm: num(d.keratinizedMucosaMm),
    residualCement: d.residualCement,
    boneLevelMm: num(d.boneLevelMm),
    boneLevelMeasurementId: boneLevelSourceId(d),
    isBaseline: d.isBaseline,
    notes: d.notes.trim() || null,
  };
}

type Site = ExamContext['sites'][number];

interface VisitDraft {
  examinedOn: string;
  /** One draft per examinable implant, by site id. */
  drafts: Record<string, SiteDraft>;
}

/** /recalls/patients/:patientId/exam: one visit, one card per examinable implant. */
export function ExamRoute() {
  const { patientId = '' } = useParams();
  const context = useExamContext(patientId);
  if (context.isPending) return <LoadingState label="Loading the exam form" />;
  if (context.isError)
    return (
      <ErrorState
        title={isApiError(context.error, 404) ? 'Patient not found' : 'Could not load the exam form'}
        error={context.error}
        onRetry={() => void context.refetch()}
      />
    );
  return <ExamVisit data={context.data} />;
}

/** The visit form; it stays mounted while an earlier exam is amended, so the drafts are kept. */
function ExamVisit({ data }: { data: ExamContext }) {
  const save = useCreateVisit();
  const [saved, setSaved] = useState<CreateVisitReply | null>(null);
  const [amending, setAmending] = useState<{ siteId: string; exam: RecallExam } | null>(null);
  useCloseOnEscape(amending !== null, () => setAmending(null));
  const [amended, setAmended] = useState<RecallExam | null>(null);
  const mayAmend = useAppAbility().can('amend', 'RecallExam');

  const sites = useMemo(() => data.sites.filter((s) => s.examinable), [data.sites]);
  const schema = useMemo(
    () =>
      draftSchema(CreateVisitBody, (d: VisitDraft) => ({
        patientId: data.patient.id,
        examinedOn: d.examinedOn,
        exams: sites
          .filter((s) => d.drafts[s.siteId]?.include)
          .map((s) => ({ siteId: s.siteId, ...toExamInput(d.drafts[s.siteId]) })),
      })),
    [data.patient.id, sites],
  );
  const form = useContractForm(schema, {
    examinedOn: data.today,
    drafts: Object.fromEntries(sites.map((s) => [s.siteId, emptyDraft()])),
  });
  const drafts = useWatch({ control: form.control, name: 'drafts' });
  const examinedOn = useWatch({ control: form.control, name: 'examinedOn' });
  const included = sites.filter((s) => drafts[s.siteId]?.include);
  // The contract numbers the exams of the visit: the n-th implant included is `exams.<n>`.
  const errorPrefix = (siteId: string) => `exams.${included.findIndex((s) => s.siteId === siteId)}.`;

  const submit = (body: CreateVisitBody) =>
    runMutation(save, body, {
      onSuccess: (reply) => setSaved(reply),
      onError: (error) => applyServerErrors(form.setError, error),
    });
  const formError = formErrorMessage(form.formState.errors, 'always');

  return (
    <div className="exam-visit">
      <title>{`Recall exam · ${data.patient.name} · Torquetrail`}</title>
      <BreadcrumbTrail
        items={[
          { text: 'Recall desk', to: '/recalls' },
          { text: data.patient.name, to: `/patients/${data.patient.id}` },
          { text: 'Recall exam' },
        ]}
      />
      <h1 className="page-title">Recall exam · {data.patient.name}</h1>
      <Callout intent="primary" icon="info-sign" compact>
        {MAINTENANCE_NOTE} <CaseDefinitions />
      </Callout>
      {amended && (
        <Callout intent="success" title="Amendment saved" data-testid="exam-amended" style={{ marginTop: 12 }}>
          {amended.fdi}, exam of {formatLongDate(amended.examinedOn)}:{' '}
          <MaintenanceStatusLabel status={amended.status} /> (recomputed on the server). The earlier version stays in
          the record, marked as amended.
        </Callout>
      )}
      {amending ? (
        <AmendForm
          site={sites.find((s) => s.siteId === amending.siteId)!}
          exam={amending.exam}
          onCancel={() => setAmending(null)}
          onSaved={(exam) => {
            setAmended(exam);
            setAmending(null);
          }}
        />
      ) : saved ? (
        <Callout intent="success" title="Exam saved" data-testid="exam-saved" style={{ marginTop: 12 }}>
          <ul>
            {saved.exams.map((e) => (
              <li key={e.id}>
                {e.fdi}: <MaintenanceStatusLabel status={e.status} /> (computed on the server, rules {e.rulesVersion})
              </li>
            ))}
          </ul>
          <p>
            Next recall: <strong>{formatLongDate(saved.nextRecall.dueOn)}</strong> ({saved.nextRecall.intervalMonths}{' '}
            months)
          </p>
          <Link to="/recalls">Back to the Recall desk</Link> ·{' '}
          <Link to={`/patients/${data.patient.id}`}>Arch of {data.patient.name}</Link>
        </Callout>
      ) : sites.length === 0 ? (
        <NonIdealState
          icon="disable"
          title="No implant to examine"
          description="Only placed or restored implants are examined."
        />
      ) : (
        <FormProvider {...form}>
          <div className="exam-visit__header">
            <FormField name="examinedOn" label="Examined on" labelFor="examined-on">
              <DateField id="examined-on" name="examinedOn" />
            </FormField>
          </div>
          {sites.map((s) => (
            <SiteExamCard
              key={s.siteId}
              site={s}
              examinedOn={examinedOn}
              name={`drafts.${s.siteId}`}
              errorPrefix={errorPrefix(s.siteId)}
              onAmendPrevious={
                mayAmend && s.previous ? () => setAmending({ siteId: s.siteId, exam: s.previous! }) : undefined
              }
            />
          ))}
          {formError && (
            <Callout intent="danger" title="Not saved" role="alert">
              {formError}
            </Callout>
          )}
          {/* Not a <form>: Enter in a probing cell must not save the visit half typed. */}
          <Button
            intent="primary"
            icon="floppy-disk"
            loading={save.isPending}
            disabled={included.length === 0}
            onClick={() => void form.handleSubmit(submit)()}
            style={{ marginTop: 12 }}
          >
            Save exam
          </Button>
        </FormProvider>
      )}
    </div>
  );
}

interface AmendDraft {
  draft: SiteDraft;
  amendmentReason: string;
}

const amendSchema = draftSchema(AmendExamBody, (d: AmendDraft) => ({
  ...toExamInput(d.draft),
  amendmentReason: d.amendmentReason,
}));

/** An amendment of one earlier exam: its values to correct, and why. */
function AmendForm({
  site,
  exam,
  onCancel,
  onSaved,
}: {
  site: Site;
  exam: RecallExam;
  onCancel: () => void;
  onSaved: (exam: RecallExam) => void;
}) {
  const amendSave = useAmendExam();
  const form = useContractForm(amendSchema, { draft: draftFromExam(exam), amendmentReason: '' });
  const submit = (body: AmendExamBody) =>
    runMutation(
      amendSave,
      { examId: exam.id, body },
      { onSuccess: onSaved, onError: (error) => applyServerErrors(form.setError, error) },
    );
  const formError = formErrorMessage(form.formState.errors, 'alone');
  return (
    <FormProvider {...form}>
      <div data-testid="amend-form" style={{ marginTop: 12 }}>
        <h2>
          Amend the exam of {formatLongDate(exam.examinedOn)} at {site.fdi}
        </h2>
        {/* The exam being amended is never its own baseline (the server excludes it too). */}
        <SiteExamCard
          site={site.baseline?.id === exam.id ? { ...site, baseline: null } : site}
          examinedOn={exam.examinedOn}
          name="draft"
          errorPrefix=""
          amending
        />
        <FormField name="amendmentReason" label="Why is it amended?" labelFor="amend-reason">
          <TextArea id="amend-reason" fill {...withInputRef(form.register('amendmentReason'))} />
        </FormField>
        {formError && (
          <Callout intent="danger" role="alert">
            {formError}
          </Callout>
        )}
        <Button
          intent="primary"
          icon="floppy-disk"
          loading={amendSave.isPending}
          onClick={() => void form.handleSubmit(submit)()}
        >
          Save amendment
        </Button>{' '}
        <Button onClick={onCancel}>Cancel</Button>
      </div>
    </FormProvider>
  );
}
