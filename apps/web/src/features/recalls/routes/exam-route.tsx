import '../components/recalls.css';
import { Button, Callout, FormGroup, InputGroup, NonIdealState, TextArea } from '@blueprintjs/core';
import { PROBING_POSITIONS, type CreateVisitBody, type CreateVisitReply, type ExamContext, type RecallExam } from '@torquetrail/contracts';
import { useEffect, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { isApiError } from '../../../lib/api-client';
import { useAppAbility } from '../../../lib/ability';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { formatLongDate } from '../../../lib/dates';
import { MAINTENANCE_NOTE } from '../../../lib/labels';
import { MaintenanceStatusLabel } from '../../../lib/maintenance-status';
import { useAmendExam, useCreateVisit, useExamContext } from '../api/recalls-api';
import { CaseDefinitions } from '../components/case-definitions';
import { draftFromExam, emptyDraft, parseMm, type SiteDraft } from '../components/live-verdict';
import { SiteExamCard } from '../components/site-exam-card';

const num = (text: string) => (text.trim() === '' ? null : (parseMm(text) ?? Number.NaN));

/** The form's draft as the contract's exam input (the server validates and classifies). */
function toExamInput(d: SiteDraft) {
  return {
    sites: PROBING_POSITIONS.map((position, i) => ({ position, probingDepthMm: num(d.depths[i]!) ?? Number.NaN, bleeding: d.bop[i]!, suppuration: d.sup[i]! })),
    mobility: d.mobility,
    plaqueIndex: d.plaqueIndex === '' ? null : Number(d.plaqueIndex),
    bleedingIndex: d.bleedingIndex === '' ? null : Number(d.bleedingIndex),
    keratinizedMucosaMm: num(d.keratinizedMucosaMm),
    residualCement: d.residualCement,
    boneLevelMm: num(d.boneLevelMm),
    isBaseline: d.isBaseline,
    notes: d.notes.trim() || null,
  };
}

interface Amending {
  siteId: string;
  exam: RecallExam;
  draft: SiteDraft;
  reason: string;
}

/** /recalls/patients/:patientId/exam: one visit, one card per examinable implant. */
export function ExamRoute() {
  const { patientId = '' } = useParams();
  const context = useExamContext(patientId);
  const save = useCreateVisit();
  const [examinedOn, setExaminedOn] = useState('');
  const [drafts, setDrafts] = useState<Record<string, SiteDraft>>({});
  const [saved, setSaved] = useState<CreateVisitReply | null>(null);
  const amendSave = useAmendExam();
  const [amending, setAmending] = useState<Amending | null>(null);
  const [amended, setAmended] = useState<RecallExam | null>(null);
  const mayAmend = useAppAbility().can('amend', 'RecallExam');

  useEffect(() => {
    if (context.data && examinedOn === '') setExaminedOn(context.data.today);
  }, [context.data, examinedOn]);

  if (context.isPending) return <LoadingState label="Loading the exam form" />;
  if (context.isError) return <ErrorState title={isApiError(context.error, 404) ? 'Patient not found' : 'Could not load the exam form'} error={context.error} onRetry={() => void context.refetch()} />;

  const data = context.data;
  const sites = data.sites.filter((s) => s.examinable);
  const draftOf = (siteId: string) => drafts[siteId] ?? emptyDraft();
  const included = sites.filter((s) => draftOf(s.siteId).include);
  const fields = isApiError(save.error) ? save.error.fields : {};
  const errorsFor = (siteId: string) => {
    const index = included.findIndex((s) => s.siteId === siteId);
    const prefix = `exams.${index}.`;
    return Object.fromEntries(Object.entries(fields).filter(([k]) => k.startsWith(prefix)).map(([k, v]) => [k.slice(prefix.length), v]));
  };

  const submit = () => {
    const body: CreateVisitBody = {
      patientId: data.patient.id,
      examinedOn,
      exams: included.map((s) => ({ siteId: s.siteId, ...toExamInput(draftOf(s.siteId)) })),
    };
    save.mutate(body, { onSuccess: (reply) => setSaved(reply) });
  };

  return (
    <div className="exam-visit">
      <title>{`Recall exam · ${data.patient.name} · Torquetrail`}</title>
      <BreadcrumbTrail items={[{ text: 'Recall desk', to: '/recalls' }, { text: data.patient.name, to: `/patients/${data.patient.id}` }, { text: 'Recall exam' }]} />
      <h1 className="page-title">Recall exam · {data.patient.name}</h1>
      <Callout intent="primary" icon="info-sign" compact>
        {MAINTENANCE_NOTE} <CaseDefinitions />
      </Callout>
      {amended && (
        <Callout intent="success" title="Amendment saved" data-testid="exam-amended" style={{ marginTop: 12 }}>
          {amended.fdi}, exam of {formatLongDate(amended.examinedOn)}: <MaintenanceStatusLabel status={amended.status} /> (recomputed on the server). The
          earlier version stays in the record, marked as amended.
        </Callout>
      )}
      {amending ? (
        <AmendForm
          amending={amending}
          site={sites.find((s) => s.siteId === amending.siteId)!}
          onChange={setAmending}
          onCancel={() => setAmending(null)}
          saving={amendSave.isPending}
          error={amendSave.error}
          onSave={() =>
            amendSave.mutate(
              { examId: amending.exam.id, body: { ...toExamInput(amending.draft), amendmentReason: amending.reason } },
              {
                onSuccess: (exam) => {
                  setAmended(exam);
                  setAmending(null);
                },
              },
            )
          }
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
            Next recall: <strong>{formatLongDate(saved.nextRecall.dueOn)}</strong> ({saved.nextRecall.intervalMonths} months)
          </p>
          <Link to="/recalls">Back to the Recall desk</Link> · <Link to={`/patients/${data.patient.id}`}>Arch of {data.patient.name}</Link>
        </Callout>
      ) : sites.length === 0 ? (
        <NonIdealState icon="disable" title="No implant to examine" description="Only placed or restored implants are examined." />
      ) : (
        <>
          <div className="exam-visit__header">
            <FormGroup label="Examined on" labelFor="examined-on" helperText={fields.examinedOn} intent={fields.examinedOn ? 'danger' : 'none'}>
              <InputGroup id="examined-on" type="date" value={examinedOn} max={data.today} onChange={(e) => setExaminedOn(e.currentTarget.value)} />
            </FormGroup>
          </div>
          {sites.map((s) => (
            <SiteExamCard
              key={s.siteId}
              site={s}
              draft={draftOf(s.siteId)}
              onChange={(next) => setDrafts({ ...drafts, [s.siteId]: next })}
              errors={errorsFor(s.siteId)}
              onAmendPrevious={mayAmend && s.previous ? () => setAmending({ siteId: s.siteId, exam: s.previous!, draft: draftFromExam(s.previous!), reason: '' }) : undefined}
            />
          ))}
          {save.isError && (
            <Callout intent="danger" title="Not saved" role="alert">
              {save.error.message}
            </Callout>
          )}
          <Button intent="primary" icon="floppy-disk" loading={save.isPending} disabled={included.length === 0} onClick={submit} style={{ marginTop: 12 }}>
            Save exam
          </Button>
        </>
      )}
    </div>
  );
}

function AmendForm({ amending, site, onChange, onCancel, onSave, saving, error }: { amending: Amending; site: ExamContext['sites'][number]; onChange: (next: Amending) => void; onCancel: () => void; onSave: () => void; saving: boolean; error: Error | null }) {
  const fields = isApiError(error) ? error.fields : {};
  return (
    <div data-testid="amend-form" style={{ marginTop: 12 }}>
      <h2>
        Amend the exam of {formatLongDate(amending.exam.examinedOn)} at {site.fdi}
      </h2>
      {/* The exam being amended is never its own baseline (the server excludes it too). */}
      <SiteExamCard site={site.baseline?.id === amending.exam.id ? { ...site, baseline: null } : site} draft={amending.draft} onChange={(draft) => onChange({ ...amending, draft })} errors={fields} amending />
      <FormGroup label="Why is it amended?" labelFor="amend-reason" helperText={fields.amendmentReason} intent={fields.amendmentReason ? 'danger' : 'none'}>
        <TextArea id="amend-reason" fill value={amending.reason} onChange={(e) => onChange({ ...amending, reason: e.currentTarget.value })} />
      </FormGroup>
      {error && !Object.keys(fields).length && (
        <Callout intent="danger" role="alert">
          {error.message}
        </Callout>
      )}
      <Button intent="primary" icon="floppy-disk" loading={saving} onClick={onSave}>
        Save amendment
      </Button>{' '}
      <Button onClick={onCancel}>Cancel</Button>
    </div>
  );
}
