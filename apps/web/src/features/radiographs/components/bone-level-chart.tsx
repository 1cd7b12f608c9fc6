import './radiographs.css';
import { Callout, Classes, Tag } from '@blueprintjs/core';
import type { SiteBoneLevels } from '@torquetrail/contracts';
import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { Link } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { ICOI_GRADE_LABEL } from '../../../lib/clinical-labels';
import { calendarYearOfMs, formatCalendarMs, formatDate } from '../../../lib/dates';
import { useSiteBoneLevels } from '../api/bone-levels-api';

const mm = (v: number) => `${v.toFixed(2)} mm`;
const time = (date: string) => Date.parse(`${date}T00:00:00Z`);
const HALF_YEAR_MS = 182 * 24 * 3600 * 1000;

interface ChartRow {
  t: number;
  mesial?: number;
  distal?: number;
  allowance?: number;
}

/** Readings and the allowance line on one time axis (each line skips the rows it has no value in). */
function chartRows(data: SiteBoneLevels): ChartRow[] {
  const rows: ChartRow[] = data.items.flatMap((i) =>
    i.takenOn ? [{ t: time(i.takenOn), mesial: i.mesialMm, distal: i.distalMm }] : [],
  );
  for (const a of data.albrektsson?.allowance ?? []) rows.push({ t: time(a.date), allowance: a.maxBoneLevelMm });
  return rows.sort((a, b) => a.t - b.t);
}

function AlbrektssonLine({ data }: { data: SiteBoneLevels }) {
  const a = data.albrektsson;
  if (!a) return <li>Albrektsson criteria: no delivery recorded, so no loading date to start from.</li>;
  return (
    <li data-testid="albrektsson">
      Albrektsson criteria (1.5 mm in the first year, then 0.2 mm a year):{' '}
      <strong>{a.meets ? 'met' : a.firstYearLossMm === null ? 'not assessable yet' : 'not met'}</strong>
      <ul>
        {a.reasons.map((r) => (
          <li key={r}>{r}</li>
        ))}
      </ul>
    </li>
  );
}

/**
 * The Site file's bone levels from radiograph measurements: mesial and distal over the years,
 * points joined by straight lines (no smoothing), the Albrektsson allowance and the ICOI grade of
 * the latest value. Supporting information for the clinician, not a diagnosis.
 */
export function BoneLevelChart({ siteId, patientId }: { siteId: string; patientId: string }) {
  const levels = useSiteBoneLevels(siteId);
  return (
    <Can I="read" a="Radiograph">
      <section className="bone-level-chart" aria-labelledby={`bone-chart-${siteId}`} data-testid="bone-level-chart">
        <h2 id={`bone-chart-${siteId}`}>Bone level from radiographs (mm below the platform)</h2>
        {levels.isPending ? (
          <p>Loading bone levels…</p>
        ) : levels.isError ? (
          <p role="alert">The bone levels could not be loaded: {levels.error.message}</p>
        ) : levels.data.items.length === 0 ? (
          <p>
            No bone level measured yet. Measure one in the viewer of a{' '}
            <Link to={`/patients/${patientId}/radiographs`}>radiograph</Link> showing this site.
          </p>
        ) : (
          <BoneLevelBody data={levels.data} />
        )}
      </section>
    </Can>
  );
}

function BoneLevelBody({ data }: { data: SiteBoneLevels }) {
  const rows = chartRows(data);
  const latest = data.items[0];
  // Half a year either side, so a single reading is not drawn on the chart's edge.
  const domain = rows.length ? [rows[0].t - HALF_YEAR_MS, rows[rows.length - 1].t + HALF_YEAR_MS] : [0, 1];
  return (
    <>
      <Callout compact icon="info-sign">
        Supporting information, not a diagnosis: measured on radiographs, calibrated by the implant&apos;s length (about
        0.4 mm error when the projection is not square to the implant).
      </Callout>
      <div style={{ width: '100%', height: 260 }} aria-hidden="true">
        <ResponsiveContainer>
          <LineChart data={rows} margin={{ top: 8, right: 16, bottom: 8, left: 8 }} accessibilityLayer={false}>
            <CartesianGrid strokeDasharray="3 3" />
            <XAxis
              dataKey="t"
              type="number"
              scale="time"
              domain={domain}
              tickFormatter={calendarYearOfMs}
              minTickGap={24}
            />
            <YAxis unit=" mm" width={64} />
            <Tooltip
              labelFormatter={(t) => formatCalendarMs(Number(t))}
              formatter={(value, name) => [mm(Number(value)), name]}
            />
            <Legend />
            <Line
              type="linear"
              dataKey="mesial"
              name="Mesial"
              stroke="#0f5c5c"
              connectNulls
              isAnimationActive={false}
            />
            <Line
              type="linear"
              dataKey="distal"
              name="Distal"
              stroke="#a34a1f"
              strokeDasharray="2 2"
              connectNulls
              isAnimationActive={false}
            />
            <Line
              type="linear"
              dataKey="allowance"
              name="Albrektsson allowance"
              stroke="#8a9ba8"
              strokeDasharray="6 4"
              dot={false}
              connectNulls
              isAnimationActive={false}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <ul className="bone-level-summary">
        <li data-testid="bone-level-latest">
          Latest ({latest.takenOn ? formatDate(latest.takenOn) : 'date not known'}): mesial {mm(latest.mesialMm)},
          distal {mm(latest.distalMm)}
          {/* A share's reply names no staff: no "measured by" without a name. */}
          {latest.measuredBy && ` · measured by ${latest.measuredBy}`}
          {latest.amended && ' (amended)'}
        </li>
        <AlbrektssonLine data={data} />
        {data.icoi && (
          <li data-testid="icoi-grade">
            ICOI health scale of the latest value: <Tag minimal>{ICOI_GRADE_LABEL[data.icoi.grade]}</Tag>
            <ul>
              {data.icoi.reasons.map((r) => (
                <li key={r}>{r}</li>
              ))}
            </ul>
          </li>
        )}
      </ul>
      <details>
        <summary>The measurements as a table</summary>
        <table className={`${Classes.HTML_TABLE} ${Classes.COMPACT}`} data-testid="bone-level-table">
          <thead>
            <tr>
              <th>Taken on</th>
              <th>Mesial</th>
              <th>Distal</th>
              <th>Implant length used</th>
              <th>Measured by</th>
            </tr>
          </thead>
          <tbody>
            {data.items.map((i) => (
              <tr key={i.measurementId}>
                <td>{i.takenOn ? formatDate(i.takenOn) : 'not known'}</td>
                <td>{mm(i.mesialMm)}</td>
                <td>{mm(i.distalMm)}</td>
                <td>{i.implantTrueMm} mm</td>
                <td>
                  {i.measuredBy ?? '—'}
                  {i.amended && ' (amended)'}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </>
  );
}
