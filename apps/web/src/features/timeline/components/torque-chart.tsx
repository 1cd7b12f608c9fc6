import type { TorqueSeries } from '@torquetrail/contracts';
import { torqueToleranceBand } from '@torquetrail/domain';
import { TORQUE_VERDICT_LABEL } from '../../../lib/clinical-labels';
import {
  CartesianGrid,
  Line,
  LineChart,
  ReferenceArea,
  ReferenceLine,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';

const day = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });

/** Torque history of one part: applied values over the years against its specification window. */
export function TorqueChart({ series }: { series: TorqueSeries }) {
  const data = series.points.map((p) => ({
    t: new Date(p.at).getTime(),
    applied: p.appliedNcm,
    verdict: p.verdict,
    reason: p.reason,
  }));
  const spec = series.specNcm;
  // The band torqueVerdict judges against (one formula, in the domain).
  const band = spec !== null ? torqueToleranceBand(spec, series.tolerancePct) : null;
  const lo = band?.lowNcm ?? null;
  const hi = band?.highNcm ?? null;
  const max = Math.max(...data.map((d) => d.applied), hi ?? 0) * 1.15;
  return (
    <figure className="torque-chart" data-testid="torque-chart">
      <figcaption>{series.label}</figcaption>
      <div style={{ width: '100%', height: 180 }}>
        <ResponsiveContainer>
          <LineChart data={data} margin={{ top: 8, right: 16, bottom: 4, left: 0 }}>
            <CartesianGrid strokeDasharray="3 3" />
            <XAxis
              dataKey="t"
              type="number"
              scale="time"
              domain={['dataMin', 'dataMax']}
              tickFormatter={(t: number) => new Date(t).getFullYear().toString()}
            />
            <YAxis domain={[0, Math.ceil(max)]} unit=" N·cm" width={70} />
            {lo !== null && hi !== null && <ReferenceArea y1={lo} y2={hi} fill="#0f766e" fillOpacity={0.1} />}
            {spec !== null && (
              <ReferenceLine
                y={spec}
                stroke="#0f766e"
                strokeDasharray="4 4"
                label={{ value: `spec ${spec}`, position: 'insideTopRight' }}
              />
            )}
            <Tooltip
              labelFormatter={(t) => day.format(new Date(Number(t)))}
              formatter={(v) => [`${String(v)} N·cm`, 'Applied']}
            />
            <Line type="monotone" dataKey="applied" stroke="#134e4a" dot={{ r: 4 }} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <table className="visually-hidden">
        <caption>Torque entries of {series.label}</caption>
        <tbody>
          {series.points.map((p) => (
            <tr key={p.id}>
              <td>{day.format(new Date(p.at))}</td>
              <td>{p.appliedNcm} N·cm</td>
              <td>{TORQUE_VERDICT_LABEL[p.verdict].toLowerCase()}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
}
