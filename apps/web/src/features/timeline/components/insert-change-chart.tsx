// Loaded on demand (React.lazy in timeline.tsx): recharts stays out of the bundle until a Timeline
// of an overdenture site is shown.
import { INSERT_CHANGE_REASONS, type InsertChangeReason, type TimelineEvent } from '@torquetrail/contracts';
import { insertChangeHistory } from '@torquetrail/domain';
import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { INSERT_CHANGE_REASON_LABEL, INSERT_CHANGE_REASON_SHADE } from '../../../lib/clinical-labels';
import { localToday } from '../../../lib/dates';

/** The reasons' words in the text colour: the lighter shades would be hard to read as text. */
const legendText = (name: string) => <span className="insert-change-chart__legend">{name}</span>;

/**
 * The site's insert changes per calendar year, by reason: the current versions of the Timeline's
 * insert-change entries (amended ones are left out, as in the Site file's counts).
 */
export default function InsertChangeChart({ events }: { events: TimelineEvent[] }) {
  const years = insertChangeHistory(
    events
      .filter((e) => e.kind === 'insert-change' && !e.amended)
      .map((e) => ({ changedOn: e.at.slice(0, 10), reason: e.code as InsertChangeReason })),
    localToday(),
    INSERT_CHANGE_REASONS,
  );
  if (years.length === 0)
    return (
      <p className="muted" data-testid="insert-change-chart-empty">
        No insert change is logged at this site yet: the chart starts with the first one.
      </p>
    );
  const data = years.map((y) => ({ year: String(y.year), ...y.byReason }));
  const max = Math.max(...years.map((y) => y.total));
  return (
    <figure className="torque-chart" data-testid="insert-change-chart">
      <figcaption>Insert changes per year at this site ({years.reduce((n, y) => n + y.total, 0)} in all)</figcaption>
      <div style={{ width: '100%', height: 180 }}>
        <ResponsiveContainer>
          <BarChart data={data} margin={{ top: 8, right: 16, bottom: 4, left: 0 }}>
            <CartesianGrid strokeDasharray="3 3" vertical={false} />
            <XAxis dataKey="year" />
            <YAxis allowDecimals={false} domain={[0, Math.max(2, max)]} width={40} />
            <Tooltip />
            <Legend formatter={legendText} />
            {INSERT_CHANGE_REASONS.map((r) => (
              <Bar
                key={r}
                dataKey={r}
                stackId="changes"
                fill={INSERT_CHANGE_REASON_SHADE[r]}
                name={INSERT_CHANGE_REASON_LABEL[r]}
                isAnimationActive={false}
              />
            ))}
          </BarChart>
        </ResponsiveContainer>
      </div>
      {/* The figures the bars show, for screen readers and for reading exact counts. */}
      <table className="visually-hidden">
        <caption>Insert changes per year</caption>
        <thead>
          <tr>
            <th scope="col">Year</th>
            {INSERT_CHANGE_REASONS.map((r) => (
              <th key={r} scope="col">
                {INSERT_CHANGE_REASON_LABEL[r]}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {years.map((y) => (
            <tr key={y.year} data-testid="insert-change-year">
              <th scope="row">{y.year}</th>
              {INSERT_CHANGE_REASONS.map((r) => (
                <td key={r}>{y.byReason[r]}</td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
}
