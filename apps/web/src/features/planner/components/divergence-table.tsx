import { DIVERGENCE_LIMIT_DEG, divergenceDeg, formatTooth, type Vec3 } from '@torquetrail/domain';
import type { ToothSystem } from '../../../lib/tooth-system';

/**
 * Pairwise divergence of the chosen implants' axes (θ = arccos(u·v / |u||v|), divergenceDeg),
 * before any multi-unit correction. Impressions stayed accurate below about 15° (Jang et al. 2011).
 */
export function DivergenceTable({ axes, system }: { axes: { fdi: number; axis: Vec3 | null }[]; system: ToothSystem }) {
  const known = axes.filter((a): a is { fdi: number; axis: Vec3 } => a.axis !== null);
  const rows: { pair: string; deg: number | null }[] = [];
  for (let i = 0; i < known.length; i++) {
    for (let j = i + 1; j < known.length; j++) {
      let deg: number | null = null;
      try {
        deg = divergenceDeg(known[i].axis, known[j].axis);
      } catch {
        deg = null; // a zero or non-numeric axis: the Findings name the field
      }
      rows.push({ pair: `${formatTooth(known[i].fdi, system)}–${formatTooth(known[j].fdi, system)}`, deg });
    }
  }
  if (rows.length === 0) return null;
  return (
    <section aria-labelledby="divergence-heading" data-testid="divergence">
      <h3 id="divergence-heading">Divergence between implants</h3>
      <table className="planner-divergence">
        <tbody>
          {rows.map((r) => (
            <tr key={r.pair}>
              <th scope="row">{r.pair}</th>
              <td>
                {r.deg === null
                  ? 'axis not valid'
                  : `${r.deg.toFixed(1)}°${r.deg > DIVERGENCE_LIMIT_DEG ? ` (over ${DIVERGENCE_LIMIT_DEG}° before any multi-unit correction)` : ''}`}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {axes.length > known.length && (
        <p className="muted">Sites without an axis are not compared: enter one to check.</p>
      )}
    </section>
  );
}
