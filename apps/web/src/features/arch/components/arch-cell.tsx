import type { KeyboardEvent } from 'react';
import { MAINTENANCE_STYLE, StatusShape } from '../../../lib/maintenance-status';
import type { ArchCell as CellGeometry } from './arch-geometry';
import type { CellContent } from './cell-description';
import { ImplantGlyph } from './implant-glyph';

interface ArchCellProps {
  cell: CellGeometry;
  content: CellContent;
  accessibleName: string;
  isTabStop: boolean;
  onKeyDown: (event: KeyboardEvent<SVGGElement>) => void;
  onFocus: () => void;
  onOpen: (() => void) | undefined;
  registerRef: (element: SVGGElement | null) => void;
}

const RING_INSET = 4;
const FOCUS_INSET = 8;

/**
 * One tooth position, drawn in its own rotated frame: a plain cell for a natural tooth, a faint
 * dashed outline for a missing one, and for an implant site the threaded-post glyph, the status
 * ring (colour and dash pattern per maintenance status) and a shape marker.
 */
export function ArchCellView({
  cell,
  content,
  accessibleName,
  isTabStop,
  onKeyDown,
  onFocus,
  onOpen,
  registerRef,
}: ArchCellProps) {
  const { width: w, height: h } = cell;
  const site = content.type === 'site' ? content.site : null;
  const planned = site?.status === 'planned';
  const struck = site?.status === 'failed' || site?.status === 'removed';
  // Crown towards the biting plane: local +y points inwards on the upper arch, outwards on the lower.
  const crownDown = cell.arch === 'upper';
  const markerY = crownDown ? -h / 2 + 4 : h / 2 - 4;
  const ring = site ? MAINTENANCE_STYLE[site.maintenanceStatus] : null;
  const seatingMissing = (site?.partsMissingSeatingTorque ?? 0) > 0;

  const classes = ['arch-cell', `arch-cell--${content.type}`];
  if (planned) classes.push('arch-cell--planned');
  if (struck) classes.push('arch-cell--struck');
  if (seatingMissing) classes.push('arch-cell--seating-missing');

  return (
    <g
      ref={registerRef}
      className={classes.join(' ')}
      transform={`translate(${cell.x.toFixed(2)} ${cell.y.toFixed(2)}) rotate(${cell.rotation.toFixed(2)})`}
      role={site ? 'button' : 'img'}
      aria-label={accessibleName}
      tabIndex={isTabStop ? 0 : -1}
      data-testid={`arch-cell-${cell.fdi}`}
      data-seating-missing={seatingMissing || undefined}
      onKeyDown={onKeyDown}
      onFocus={onFocus}
      onClick={onOpen}
    >
      <rect
        className="arch-cell__focus"
        x={-w / 2 - FOCUS_INSET}
        y={-h / 2 - FOCUS_INSET}
        width={w + 2 * FOCUS_INSET}
        height={h + 2 * FOCUS_INSET}
        rx={12}
      />
      {ring && (
        <rect
          className="arch-cell__ring"
          x={-w / 2 - RING_INSET}
          y={-h / 2 - RING_INSET}
          width={w + 2 * RING_INSET}
          height={h + 2 * RING_INSET}
          rx={10}
          stroke={ring.colour}
          strokeDasharray={ring.dash}
        />
      )}
      <rect className="arch-cell__base" x={-w / 2} y={-h / 2} width={w} height={h} rx={7} />
      {site && <ImplantGlyph flip={crownDown} />}
      {struck && <line className="arch-cell__strike" x1={-w / 2 - 3} y1={h / 2 + 3} x2={w / 2 + 3} y2={-h / 2 - 3} />}
      {site && (
        // Counter-rotated, so a diamond never turns into a square on a tilted cell.
        <g
          className="arch-cell__marker"
          transform={`translate(${w / 2 - 4} ${markerY}) rotate(${(-cell.rotation).toFixed(2)})`}
        >
          <circle r={5.5} fill="#fff" />
          <StatusShape status={site.maintenanceStatus} x={0} y={0} size={8} />
        </g>
      )}
      {seatingMissing && (
        // The flag for a part whose seating torque was never logged, opposite the status marker.
        <g
          className="arch-cell__seating-flag"
          transform={`translate(${-w / 2 + 4} ${markerY}) rotate(${(-cell.rotation).toFixed(2)})`}
        >
          <circle r={6} />
          <text y={3.5} textAnchor="middle">
            !
          </text>
        </g>
      )}
    </g>
  );
}
