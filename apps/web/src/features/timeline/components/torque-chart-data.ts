import type { TorqueSeries } from '@torquetrail/contracts';
import { torqueToleranceBand } from '@torquetrail/domain';

export interface TorqueChartPoint {
  t: number;
  applied: number;
  /** The tolerance window this reading was judged against, as stored with it. */
  band: [number, number];
  /** The specification this reading was judged against, as stored with it. */
  spec: number;
}

/**
 * The chart's points: each reading with the band and spec torqueVerdict judged it against, as
 * stored with the entry (ADR 0006). The part's spec of today (`series.specNcm`) plays no part, so
 * a later catalogue edit neither moves past bands nor draws today's spec over old readings.
 */
export function torqueChartPoints(series: TorqueSeries): TorqueChartPoint[] {
  return series.points.map((p) => {
    const band = torqueToleranceBand(p.specNcm, p.tolerancePct);
    return {
      t: new Date(p.at).getTime(),
      applied: p.appliedNcm,
      band: [band.lowNcm, band.highNcm],
      spec: p.specNcm,
    };
  });
}
