import type { TorqueSeries } from '@torquetrail/contracts';
import { TORQUE_VERDICT_LABEL } from '../../../lib/clinical-labels';
import { formatDayOf, formatYear } from '../../../lib/dates';
import { torqueChartPoints } from './torque-chart-data';
import { CartesianGrid, Line, ComposedChart, Area, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';

/** Torque history of one part: applied values over the years against its specification window. */
export function TorqueChart({ series }: { series: TorqueSeries }) {
  // Band and spec line step with the readings: each shows what its reading was judged against.
  const data = torqueChartPoints(series);
  const max = Math.max(...data.map((d) => Math.max(d.applied, d.band[1]))) * 1.15;
  return (
    <figure className="torque-chart" data-testid="torque-chart">
      <figcaption>{series.label}</figcaption>
      <div style={{ width: '100%', height: 180 }}>
        <ResponsiveContainer>
          <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 4, left: 0 }}>
            <CartesianGrid strokeDasharray="3 3" />
            <XAxis
              dataKey="t"
              type="number"
              scale="time"
              domain={['dataMin', 'dataMax']}
              tickFormatter={(t: number) => formatYear(t)}
            />
            <YAxis domain={[0, Math.ceil(max)]} unit=" N·cm" width={70} />
            <Area
              type="stepAfter"
              dataKey="band"
              stroke="none"
              fill="#0f766e"
              fillOpacity={0.1}
              isAnimationActive={false}
              name="Tolerance band"
            />
            <Line
              type="stepAfter"
              dataKey="spec"
              stroke="#0f766e"
              strokeDasharray="4 4"
              dot={false}
              isAnimationActive={false}
              name="Spec judged against"
            />
            <Tooltip
              labelFormatter={(t) => formatDayOf(Number(t))}
              formatter={(v, name) =>
                Array.isArray(v)
                  ? [`${String(v[0])}–${String(v[1])} N·cm`, 'Band judged against']
                  : [`${String(v)} N·cm`, name === 'applied' ? 'Applied' : String(name)]
              }
            />
            <Line type="linear" dataKey="applied" stroke="#134e4a" dot={{ r: 4 }} isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <table className="visually-hidden">
        <caption>Torque entries of {series.label}</caption>
        <tbody>
          {series.points.map((p) => (
            <tr key={p.id}>
              <td>{formatDayOf(p.at)}</td>
              <td>{p.appliedNcm} N·cm</td>
              <td>
                against {p.specNcm} N·cm ±{p.tolerancePct} %
              </td>
              <td>{TORQUE_VERDICT_LABEL[p.verdict].toLowerCase()}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
}
