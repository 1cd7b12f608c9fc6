import { Button, Callout, Card, HTMLSelect, InputGroup, TextArea } from '@blueprintjs/core';
import {
  MeasurementAmendmentBody,
  MeasurementBody,
  type Measurement,
  type RadiographDetail,
} from '@torquetrail/contracts';
import { formatTooth } from '@torquetrail/domain';
import { useMemo, useState, type MouseEvent, type ReactNode } from 'react';
import { FormProvider, useWatch } from 'react-hook-form';
import { Can } from '../../../lib/ability';
import {
  applyServerErrors,
  draftSchema,
  FieldError,
  FormField,
  formErrorMessage,
  useContractForm,
  withInputRef,
} from '../../../lib/forms';
import { formatDate } from '../../../lib/dates';
import { useToothSystem } from '../../../lib/tooth-system';
import { useAmendMeasurement, useMeasure } from '../api/radiographs-api';
import { runMutation } from '../../../lib/run-mutation';

type Point = { row: number; col: number };
const MEASURE_STEPS = [
  'Platform, one side of the shoulder',
  'Platform, other side',
  'Apex',
  'Mesial bone contact',
  'Distal bone contact',
] as const;

interface Draft {
  siteId: string;
  /** The implant's true length as typed; asked only when the site's placement record has none. */
  implantTrueMm: string;
  reason: string;
  points: Point[];
}

type SiteImplants = RadiographDetail['siteImplants'];
/** The placement record's implant length of a site shown on the radiograph (null: none recorded). */
const lengthIn = (siteImplants: SiteImplants, siteId: string) =>
  siteImplants.find((s) => s.siteId === siteId)?.implantLengthMm ?? null;

const marks = (p: Point[]) => ({ platform: [p[0], p[1]] as [Point, Point], apex: p[2], mesial: p[3], distal: p[4] });
/** '' → not given (the API then names what is missing); anything else as a number, 4,5 read as 4.5. */
const length = (text: string) => (text.trim() === '' ? undefined : Number(text.trim().replace(',', '.')));

/**
 * The image with its marks and the measuring form: five clicks (platform pair, apex, mesial and
 * distal contact), then Save. With `amending`, the five marks and a reason make an amendment of
 * that measurement (a new version; the first stays in the record).
 */
export function MeasureWorkspace({
  radiograph,
  sites,
  amending,
  locked,
  onDone,
  renderStage,
}: {
  radiograph: RadiographDetail;
  sites: readonly { id: string; fdi: number }[];
  amending: Measurement | null;
  /** Entered in error: shown, never measured. */
  locked: boolean;
  onDone: () => void;
  /** Draws the viewer's stage around the image; `onClick` marks the next point. */
  renderStage: (image: { onClick: (e: MouseEvent<HTMLImageElement>) => void; marks: ReactNode }) => ReactNode;
}) {
  const [system] = useToothSystem();
  const measure = useMeasure(radiograph.id);
  const amend = useAmendMeasurement();
  const [saved, setSaved] = useState<Measurement | null>(null);
  const rows = radiograph.rows ?? 1;
  const cols = radiograph.columns ?? 1;
  const siteImplants = radiograph.siteImplants;

  const schema = useMemo(
    () =>
      amending
        ? draftSchema(MeasurementAmendmentBody, (d: Draft) => ({
            points: marks(d.points),
            implantTrueMm: lengthIn(siteImplants, amending.siteId) === null ? length(d.implantTrueMm) : undefined,
            reason: d.reason,
          }))
        : draftSchema(MeasurementBody, (d: Draft) => ({
            siteId: d.siteId,
            points: marks(d.points),
            implantTrueMm: lengthIn(siteImplants, d.siteId) === null ? length(d.implantTrueMm) : undefined,
          })),
    [amending, siteImplants],
  );
  const form = useContractForm<Draft, MeasurementBody | MeasurementAmendmentBody>(schema, {
    siteId: amending?.siteId ?? sites[0]?.id ?? '',
    implantTrueMm: amending ? String(amending.implantTrueMm) : '',
    reason: '',
    points: [],
  });
  const points = useWatch({ control: form.control, name: 'points' });
  const siteId = useWatch({ control: form.control, name: 'siteId' });
  const needsLength = lengthIn(siteImplants, amending?.siteId ?? siteId) === null;
  const formError = formErrorMessage(form.formState.errors, 'alone');
  const pending = measure.isPending || amend.isPending;

  const onClick = (e: MouseEvent<HTMLImageElement>) => {
    if (locked || points.length >= MEASURE_STEPS.length) return;
    const box = e.currentTarget.getBoundingClientRect();
    const p = { row: ((e.clientY - box.top) / box.height) * rows, col: ((e.clientX - box.left) / box.width) * cols };
    form.setValue('points', [...points, p]);
  };
  const submit = form.handleSubmit((body) => {
    const done = {
      onSuccess: (m: Measurement) => {
        setSaved(m);
        form.setValue('points', []);
        form.setValue('reason', '');
        if (amending) onDone();
      },
      onError: (error: Error) => applyServerErrors(form.setError, error),
    };
    if (amending) runMutation(amend, { measurementId: amending.id, body: body as MeasurementAmendmentBody }, done);
    else runMutation(measure, body as MeasurementBody, done);
  });

  const marksLayer = (
    <svg className="viewer-marks" viewBox={`0 0 ${cols} ${rows}`} aria-hidden="true">
      {points.map((p, i) => (
        <circle
          key={MEASURE_STEPS[i]}
          cx={p.col}
          cy={p.row}
          r={Math.max(cols, rows) / 120}
          className={`mark mark-${i}`}
        />
      ))}
    </svg>
  );

  return (
    <FormProvider {...form}>
      {renderStage({ onClick, marks: marksLayer })}
      {!locked && (
        <Can I="create" a="Radiograph">
          <Card className="viewer-measure" data-testid="measure-panel">
            <h2>
              {amending ? `Amend the measurement of ${formatDate(amending.measuredAt.slice(0, 10))}` : 'Bone level'}
            </h2>
            {sites.length === 0 ? (
              <p>This radiograph is not linked to an implant site.</p>
            ) : (
              <form onSubmit={(e) => void submit(e)} noValidate>
                {amending ? (
                  <p>Mark the five points again; the earlier version stays in the record, marked as amended.</p>
                ) : (
                  <FormField name="siteId" label="Implant site" labelFor="measure-site">
                    <HTMLSelect id="measure-site" {...form.register('siteId')}>
                      {sites.map((s) => (
                        <option key={s.id} value={s.id}>
                          {formatTooth(s.fdi, system)}
                        </option>
                      ))}
                    </HTMLSelect>
                  </FormField>
                )}
                {needsLength && (
                  <FormField
                    name="implantTrueMm"
                    label="Implant length (mm)"
                    labelFor="measure-implant-length"
                    help="The placement record has no implant length: give the implant's true length. It is kept with this measurement's calibration only."
                  >
                    {(a11y) => (
                      <InputGroup
                        id="measure-implant-length"
                        inputMode="decimal"
                        style={{ width: 90 }}
                        data-testid="implant-length"
                        {...withInputRef(form.register('implantTrueMm'))}
                        {...a11y}
                      />
                    )}
                  </FormField>
                )}
                <p data-testid="measure-step">
                  {points.length < MEASURE_STEPS.length
                    ? `Click: ${MEASURE_STEPS[points.length]}`
                    : 'All points marked'}
                </p>
                <FieldError as="p" className="field-error" name={['points', 'points.apex', 'points.platform']} />
                {amending && (
                  <FormField name="reason" label="Why is it amended?" labelFor="measure-reason">
                    {(a11y) => (
                      <TextArea id="measure-reason" fill {...withInputRef(form.register('reason'))} {...a11y} />
                    )}
                  </FormField>
                )}
                <Button text="Clear marks" onClick={() => form.setValue('points', [])} disabled={points.length === 0} />{' '}
                <Button
                  type="submit"
                  intent="primary"
                  text={amending ? 'Save amendment' : 'Save measurement'}
                  data-testid="save-measurement"
                  disabled={points.length < MEASURE_STEPS.length}
                  loading={pending}
                />
                {amending && (
                  <>
                    {' '}
                    <Button text="Cancel" onClick={onDone} />
                  </>
                )}
                {formError && (
                  <p role="alert" className="field-error">
                    {formError}
                  </p>
                )}
              </form>
            )}
            {saved && !amending && (
              <Callout intent="success" compact data-testid="measurement-saved">
                Saved: mesial {saved.mesialMm.toFixed(2)} mm, distal {saved.distalMm.toFixed(2)} mm from the platform.
              </Callout>
            )}
          </Card>
        </Can>
      )}
    </FormProvider>
  );
}
