import type { SurvivalCurve } from '@torquetrail/contracts';
import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';

const COLOURS = ['#2d72d2', '#d9822b', '#238551', '#ac2f33', '#7961db', '#00a396'];

interface Row {
  years: number;
  [group: string]: number;
}

/** Each curve as steps from (0, 100 %), joined on one time axis (a curve skips rows it has no value in). */
function rows(curves: SurvivalCurve[], name: (c: SurvivalCurve) => string): Row[] {
  const out: Row[] = [];
  for (const c of curves) {
    out.push({ years: 0, [name(c)]: 100 });
    for (const s of c.steps) out.push({ years: s.years, [name(c)]: Math.round(s.survival * 1000) / 10 });
  }
  return out.sort((a, b) => a.years - b.years);
}

/**
 * Kaplan–Meier curves (steps, no smoothing) and the number at risk at each whole year under the
 * axis, one row per group.
 */
export function SurvivalChart({ curves, name }: { curves: SurvivalCurve[]; name: (c: SurvivalCurve) => string }) {
  const longest = Math.max(1, ...curves.map((c) => c.atRiskByYear.length - 1));
  const years = Array.from({ length: longest + 1 }, (_, y) => y);
  return (
    <figure className="survival-chart" data-testid="survival-chart">
      <div className="survival-chart__plot" role="img" aria-label="Implant survival over the years since placement">
        <ResponsiveContainer width="100%" height={300}>
          <LineChart data={rows(curves, name)} margin={{ top: 10, right: 20, bottom: 10, left: 0 }}>
            <CartesianGrid strokeDasharray="3 3" />
            <XAxis
              dataKey="years"
              type="number"
              domain={[0, longest]}
              ticks={years}
              label={{ value: 'Years since placement', position: 'insideBottom', offset: -5 }}
            />
            <YAxis domain={[0, 100]} unit=" %" />
            <Tooltip formatter={(v) => `${String(v)} %`} labelFormatter={(y) => `${Number(y).toFixed(1)} years`} />
            <Legend verticalAlign="top" />
            {curves.map((c, i) => (
              <Line
                key={name(c)}
                dataKey={name(c)}
                type="stepAfter"
                stroke={COLOURS[i % COLOURS.length]}
                dot={false}
                connectNulls
                isAnimationActive={false}
              />
            ))}
          </LineChart>
        </ResponsiveContainer>
      </div>
      <table className="survival-chart__at-risk" data-testid="number-at-risk">
        <caption>Number at risk (implants still followed) at each year</caption>
        <thead>
          <tr>
            <th scope="col">Group</th>
            {years.map((y) => (
              <th key={y} scope="col">
                {y}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {curves.map((c) => (
            <tr key={name(c)}>
              <th scope="row">{name(c)}</th>
              {years.map((y) => (
                <td key={y}>{c.atRiskByYear[y] ?? 0}</td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
}
