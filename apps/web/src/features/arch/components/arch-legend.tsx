import { MAINTENANCE_STATUS_LABEL, MAINTENANCE_NOTE } from '../../../lib/labels';
import { MAINTENANCE_STATUSES } from '@torquetrail/contracts';
import { MAINTENANCE_STYLE, StatusShape } from '../../../lib/maintenance-status';
import { ImplantGlyph } from './implant-glyph';

/** Keys to the drawing, in words: every colour and pattern on the Arch is named here. */
export function ArchLegend() {
  return (
    <aside className="arch-legend" aria-label="Legend">
      <h2 className="arch-legend__title">Maintenance status</h2>
      <ul className="arch-legend__list">
        {MAINTENANCE_STATUSES.map((status) => (
          <li key={status}>
            <svg width="40" height="24" viewBox="0 0 40 24" aria-hidden="true" focusable="false">
              <rect
                x={2}
                y={3}
                width={24}
                height={18}
                rx={5}
                fill="none"
                strokeWidth={2.5}
                stroke={MAINTENANCE_STYLE[status].colour}
                strokeDasharray={MAINTENANCE_STYLE[status].dash}
              />
              <StatusShape status={status} x={33} y={12} size={9} />
            </svg>
            <span>{MAINTENANCE_STATUS_LABEL[status]}</span>
          </li>
        ))}
      </ul>
      <p className="maintenance-note">{MAINTENANCE_NOTE}</p>
      <h2 className="arch-legend__title">Positions</h2>
      <ul className="arch-legend__list">
        <LegendCell className="arch-cell--natural" text="Natural tooth" />
        <LegendCell className="arch-cell--missing" text="Missing tooth (faint dashed outline)" />
        <LegendCell className="arch-cell--site" text="Implant site (post glyph, status ring)" glyph />
        <LegendCell className="arch-cell--site arch-cell--planned" text="Planned site (dashed outline)" glyph />
        <LegendCell
          className="arch-cell--site arch-cell--struck"
          text="Failed or removed (struck through)"
          glyph
          strike
        />
        <li>
          <svg width="40" height="24" viewBox="0 0 40 24" aria-hidden="true" focusable="false">
            <g className="arch-cell__seating-flag" transform="translate(14 12)">
              <circle r={6} />
              <text y={3.5} textAnchor="middle">
                !
              </text>
            </g>
          </svg>
          <span>Seating torque missing on a part (never logged)</span>
        </li>
      </ul>
    </aside>
  );
}

function LegendCell({
  className,
  text,
  glyph,
  strike,
}: {
  className: string;
  text: string;
  glyph?: boolean;
  strike?: boolean;
}) {
  return (
    <li>
      <svg width="40" height="24" viewBox="0 0 40 24" aria-hidden="true" focusable="false">
        <g className={`arch-cell ${className}`} transform="translate(14 12)">
          <rect className="arch-cell__base" x={-8} y={-10} width={16} height={20} rx={4} />
          {glyph && (
            <g transform="scale(0.6)">
              <ImplantGlyph flip={false} />
            </g>
          )}
          {strike && <line className="arch-cell__strike" x1={-10} y1={12} x2={10} y2={-12} />}
        </g>
      </svg>
      <span>{text}</span>
    </li>
  );
}
