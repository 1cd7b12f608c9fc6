import '../components/radiographs.css';
import { Button, ButtonGroup, Card, HTMLSelect, Slider, Switch } from '@blueprintjs/core';
import type { MeasurementBody } from '@torquetrail/contracts';
import { formatTooth } from '@torquetrail/domain';
import { useState, type KeyboardEvent, type MouseEvent, type WheelEvent } from 'react';
import { useParams } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { BreadcrumbTrail } from '../../../lib/components/breadcrumb-trail';
import { ErrorState } from '../../../lib/components/error-state';
import { LoadingState } from '../../../lib/components/loading-state';
import { useToothSystem } from '../../../lib/tooth-system';
import { RADIOGRAPH_KIND_LABEL } from '../../../lib/labels';
import { usePatient } from '../../patients';
import { useMeasure, useRadiograph } from '../api/radiographs-api';
import { PreviewNotice } from '../components/preview-notice';

type Point = { row: number; col: number };
const STEPS = [
  'Platform, one side of the shoulder',
  'Platform, other side',
  'Apex',
  'Mesial bone contact',
  'Distal bone contact',
] as const;
const ZOOM_STEP = 1.25;
const mm = (v: number) => `${v.toFixed(2)} mm`;

/** /patients/:patientId/radiographs/:radiographId: the preview with zoom, pan, windowing and the bone-level marks. */
export function RadiographViewerRoute() {
  const { patientId = '', radiographId = '' } = useParams();
  const patient = usePatient(patientId);
  const [system] = useToothSystem();
  const radiograph = useRadiograph(radiographId);
  const measure = useMeasure(radiographId);
  const [zoom, setZoom] = useState(1);
  const [pan, setPan] = useState({ x: 0, y: 0 });
  const [drag, setDrag] = useState<{ x: number; y: number } | null>(null);
  const [brightness, setBrightness] = useState(100);
  const [contrast, setContrast] = useState(100);
  const [invert, setInvert] = useState(false);
  const [points, setPoints] = useState<Point[]>([]);
  const [siteId, setSiteId] = useState('');

  if (radiograph.isPending) return <LoadingState label="Loading the radiograph" />;
  if (radiograph.isError)
    return (
      <ErrorState
        title="Could not load the radiograph"
        error={radiograph.error}
        onRetry={() => void radiograph.refetch()}
      />
    );
  const r = radiograph.data;
  const rows = r.rows ?? 1;
  const cols = r.columns ?? 1;
  const sites = (patient.data?.sites ?? []).filter((s) => r.siteIds.includes(s.id));
  const chosenSite = siteId || sites[0]?.id || '';
  const patientName = patient.data ? `${patient.data.givenName} ${patient.data.familyName}` : 'Patient';
  const fit = () => {
    setZoom(1);
    setPan({ x: 0, y: 0 });
  };
  const onKey = (e: KeyboardEvent) => {
    if (e.key === '+' || e.key === '=') setZoom((z) => z * ZOOM_STEP);
    else if (e.key === '-') setZoom((z) => z / ZOOM_STEP);
    else if (e.key === '0') fit();
  };
  const onWheel = (e: WheelEvent) => setZoom((z) => (e.deltaY < 0 ? z * ZOOM_STEP : z / ZOOM_STEP));
  /** A click on the image marks the next point, in the original image's pixels. */
  const onImageClick = (e: MouseEvent<HTMLImageElement>) => {
    if (points.length >= STEPS.length) return;
    const box = e.currentTarget.getBoundingClientRect();
    const p = { row: ((e.clientY - box.top) / box.height) * rows, col: ((e.clientX - box.left) / box.width) * cols };
    setPoints((all) => [...all, p]);
  };
  const save = () => {
    const [a, b, apex, mesial, distal] = points;
    const body: MeasurementBody = { siteId: chosenSite, points: { platform: [a, b], apex, mesial, distal } };
    measure.mutate(body, { onSuccess: () => setPoints([]) });
  };

  return (
    <div className="radiograph-viewer">
      <title>Radiograph · Torquetrail</title>
      <BreadcrumbTrail
        items={[
          { text: 'Patients', to: '/patients' },
          { text: patientName, to: `/patients/${patientId}` },
          { text: 'Radiographs', to: `/patients/${patientId}/radiographs` },
          { text: `${RADIOGRAPH_KIND_LABEL[r.kind]} ${r.takenOn ?? ''}` },
        ]}
      />
      <div className="viewer-tools">
        <ButtonGroup>
          <Button icon="zoom-in" aria-label="Zoom in" onClick={() => setZoom((z) => z * ZOOM_STEP)} />
          <Button icon="zoom-out" aria-label="Zoom out" onClick={() => setZoom((z) => z / ZOOM_STEP)} />
          <Button icon="zoom-to-fit" text="Fit" onClick={fit} />
        </ButtonGroup>
        <label className="viewer-slider">
          Brightness
          <Slider
            min={20}
            max={300}
            stepSize={5}
            labelRenderer={false}
            value={brightness}
            onChange={setBrightness}
            handleHtmlProps={{ 'aria-label': 'Brightness' }}
          />
        </label>
        <label className="viewer-slider">
          Contrast
          <Slider
            min={20}
            max={300}
            stepSize={5}
            labelRenderer={false}
            value={contrast}
            onChange={setContrast}
            handleHtmlProps={{ 'aria-label': 'Contrast' }}
          />
        </label>
        <Switch label="Invert" checked={invert} onChange={() => setInvert((v) => !v)} />
      </div>
      {r.previewStatus !== 'ready' ? (
        <PreviewNotice radiograph={r} />
      ) : (
        <div
          className="viewer-stage"
          tabIndex={0}
          role="group"
          aria-label="Radiograph: + and − zoom, 0 fits, drag with the right button to pan"
          onKeyDown={onKey}
          onWheel={onWheel}
          onMouseDown={(e) => e.button === 2 && setDrag({ x: e.clientX - pan.x, y: e.clientY - pan.y })}
          onMouseMove={(e) => drag && setPan({ x: e.clientX - drag.x, y: e.clientY - drag.y })}
          onMouseUp={() => setDrag(null)}
          onContextMenu={(e) => e.preventDefault()}
        >
          <div className="viewer-layer" style={{ transform: `translate(${pan.x}px, ${pan.y}px) scale(${zoom})` }}>
            <img
              src={`/api/radiographs/${r.id}/preview`}
              alt={`${RADIOGRAPH_KIND_LABEL[r.kind]} radiograph`}
              data-testid="viewer-image"
              style={{ filter: `brightness(${brightness}%) contrast(${contrast}%) invert(${invert ? 1 : 0})` }}
              onClick={onImageClick}
              draggable={false}
            />
            <svg className="viewer-marks" viewBox={`0 0 ${cols} ${rows}`} aria-hidden="true">
              {points.map((p, i) => (
                <circle
                  key={STEPS[i]}
                  cx={p.col}
                  cy={p.row}
                  r={Math.max(cols, rows) / 120}
                  className={`mark mark-${i}`}
                />
              ))}
            </svg>
          </div>
        </div>
      )}
      <Can I="create" a="Radiograph">
        <Card className="viewer-measure">
          <h2>Bone level</h2>
          {sites.length === 0 ? (
            <p>This radiograph is not linked to an implant site.</p>
          ) : (
            <>
              <label>
                Implant site{' '}
                <HTMLSelect value={chosenSite} onChange={(e) => setSiteId(e.target.value)}>
                  {sites.map((s) => (
                    <option key={s.id} value={s.id}>
                      {formatTooth(s.fdi, system)}
                    </option>
                  ))}
                </HTMLSelect>
              </label>
              <p data-testid="measure-step">
                {points.length < STEPS.length ? `Click: ${STEPS[points.length]}` : 'All points marked'}
              </p>
              <Button text="Clear marks" onClick={() => setPoints([])} disabled={points.length === 0} />{' '}
              <Button
                intent="primary"
                text="Save measurement"
                data-testid="save-measurement"
                disabled={points.length < STEPS.length}
                loading={measure.isPending}
                onClick={save}
              />
              {measure.isError && <p role="alert">{measure.error.message}</p>}
            </>
          )}
        </Card>
      </Can>
      <Card>
        <h2>Measurements</h2>
        {r.measurements.length === 0 ? (
          <p>None yet.</p>
        ) : (
          <ul data-testid="measurements">
            {r.measurements.map((m) => (
              <li key={m.id}>
                Mesial {mm(m.mesialMm)}, distal {mm(m.distalMm)} from the platform (implant {m.implantTrueMm} mm)
                {m.spacingEstimate &&
                  ` · by Pixel Spacing: mesial ${mm(m.spacingEstimate.mesialMm)}, distal ${mm(m.spacingEstimate.distalMm)}`}
                {m.spacingEstimate?.flagged &&
                  ` · the two scales differ by ${Math.round(Math.abs(m.spacingEstimate.disagreement) * 100)} %: the projection may be foreshortened or elongated`}
                {` · ${m.measuredBy}`}
              </li>
            ))}
          </ul>
        )}
        <small>Supporting information, not a diagnosis.</small>
      </Card>
    </div>
  );
}
