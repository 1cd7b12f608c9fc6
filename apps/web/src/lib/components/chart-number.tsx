/** A patient's chart number, never broken across lines (its hyphen would otherwise allow a break). */
export function ChartNumber({ value }: { value: string }) {
  return <span className="chart-number mono">{value}</span>;
}
