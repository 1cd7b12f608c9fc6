import './recalls.css';
import { Classes } from '@blueprintjs/core';
import type { MaintenanceStatus } from '@torquetrail/contracts';
import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatDate } from '../../../lib/dates';
import { MAINTENANCE_STATUS_LABEL } from '../../../lib/labels';
import { MAINTENANCE_STYLE } from '../../../lib/maintenance-status';
import { useSiteExams } from '../api/recalls-api';

/** A point of the chart in the colour of that exam's status (recharts passes the data point as `payload`). */
function StatusDot({ cx, cy, payload }: { cx?: number; cy?: number; payload?: { status: MaintenanceStatus } }) {
  return payload ? <circle cx={cx} cy={cy} r={4} fill={MAINTENANCE_STYLE[payload.status].colour} /> : null;
}

/** Probing depth over the years for one implant: deepest and mean of the six sites, dots coloured (and labelled) by status. */
export function ProbingDepthChart({ siteId }: { siteId: string }) {
  const history = useSiteExams(siteId);
  if (history.isPending || history.isError) return null;
  const points = history.data.exams.map((e) => {
    const depths = e.sites.map((s) => s.probingDepthMm);
    return {
      date: e.examinedOn,
      label: formatDate(e.examinedOn),
      deepest: Math.max(...depths),
      mean: Math.round((depths.reduce((a, b) => a + b, 0) / depths.length) * 10) / 10,
      bleeding: e.sites.filter((s) => s.bleeding).length,
      status: e.status,
    };
  });
  return (
    <section className="probing-chart" aria-labelledby={`pd-chart-${siteId}`} data-testid="probing-depth-chart">
      <h2 id={`pd-chart-${siteId}`}>Probing depth over time</h2>
      {points.length === 0 ? (
        <p>No recall exam yet.</p>
      ) : (
        <>
          <div style={{ width: '100%', height: 240 }} aria-hidden="true">
            <ResponsiveContainer>
              <LineChart data={points} margin={{ top: 8, right: 16, bottom: 8, left: 0 }} accessibilityLayer={false}>
                <CartesianGrid strokeDasharray="3 3" />
                <XAxis dataKey="label" minTickGap={24} />
                <YAxis unit=" mm" domain={[0, 'dataMax + 1']} allowDecimals={false} />
                <Tooltip formatter={(value, name) => [`${String(value)} mm`, name]} />
                <Legend />
                <Line
                  type="linear"
                  dataKey="deepest"
                  name="Deepest site"
                  stroke="#0f5c5c"
                  isAnimationActive={false}
                  dot={<StatusDot />}
                />
                <Line
                  type="linear"
                  dataKey="mean"
                  name="Mean of six sites"
                  stroke="#8a9ba8"
                  strokeDasharray="4 3"
                  dot={false}
                  isAnimationActive={false}
                />
              </LineChart>
            </ResponsiveContainer>
          </div>
          <details>
            <summary>The exams as a table</summary>
            <table className={`${Classes.HTML_TABLE} ${Classes.COMPACT}`}>
              <thead>
                <tr>
                  <th>Date</th>
                  <th>Deepest</th>
                  <th>Mean</th>
                  <th>Sites bleeding</th>
                  <th>Status</th>
                </tr>
              </thead>
              <tbody>
                {points.map((p) => (
                  <tr key={p.label}>
                    <td>{p.label}</td>
                    <td>{p.deepest} mm</td>
                    <td>{p.mean} mm</td>
                    <td>{p.bleeding}</td>
                    <td>{MAINTENANCE_STATUS_LABEL[p.status]}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </details>
        </>
      )}
    </section>
  );
}
