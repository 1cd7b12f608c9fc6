import type { MaintenanceStatus } from '@torquetrail/contracts';
import type { ReactElement } from 'react';
import { MAINTENANCE_STATUS_LABEL } from './labels';

/**
 * How a maintenance status is drawn. Colour is never the only signal: each status also has
 * its own ring dash pattern and marker shape, and every use carries the text label.
 */
export const MAINTENANCE_STYLE: Record<
  MaintenanceStatus,
  { colour: string; dash: string | undefined; shape: 'circle' | 'triangle' | 'diamond' | 'hollow-circle' }
> = {
  health: { colour: '#2a9d8f', dash: undefined, shape: 'circle' },
  mucositis: { colour: '#c98a0b', dash: '7 3', shape: 'triangle' },
  'peri-implantitis': { colour: '#a4161a', dash: '10 3 2 3', shape: 'diamond' },
  'not-examined': { colour: '#738091', dash: '2 3', shape: 'hollow-circle' },
};

type Shape = (typeof MAINTENANCE_STYLE)[MaintenanceStatus]['shape'];
type ShapeProps = { x: number; y: number; r: number; colour: string };

/** One drawing per marker shape (a map, so a new shape without a drawing does not compile). */
const SHAPES: Record<Shape, (p: ShapeProps) => ReactElement> = {
  circle: ({ x, y, r, colour }) => <circle cx={x} cy={y} r={r} fill={colour} />,
  'hollow-circle': ({ x, y, r, colour }) => (
    <circle cx={x} cy={y} r={r - 0.75} fill="#fff" stroke={colour} strokeWidth={1.5} />
  ),
  triangle: ({ x, y, r, colour }) => (
    <polygon points={`${x},${y - r} ${x + r},${y + r * 0.8} ${x - r},${y + r * 0.8}`} fill={colour} />
  ),
  diamond: ({ x, y, r, colour }) => (
    <polygon points={`${x},${y - r} ${x + r},${y} ${x},${y + r} ${x - r},${y}`} fill={colour} />
  ),
};

/** The status marker as an SVG element centred on (x, y), `size` across. */
export function StatusShape({ status, x, y, size }: { status: MaintenanceStatus; x: number; y: number; size: number }) {
  const { colour, shape } = MAINTENANCE_STYLE[status];
  return SHAPES[shape]({ x, y, r: size / 2, colour });
}

/** Marker plus text label, for use in running text and tables. */
export function MaintenanceStatusLabel({ status }: { status: MaintenanceStatus }) {
  return (
    <span className="maintenance-status">
      <svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true" focusable="false">
        <StatusShape status={status} x={6} y={6} size={11} />
      </svg>
      <span>{MAINTENANCE_STATUS_LABEL[status]}</span>
    </span>
  );
}
