import type { ArchSite } from '@torquetrail/contracts';
import { formatTooth } from '@torquetrail/domain';
import { type KeyboardEvent, useMemo, useRef, useState } from 'react';
import type { ToothSystem } from '../../../lib/tooth-system';
import { ArchCellView } from './arch-cell';
import { type ArchCell, layoutArches } from './arch-geometry';
import { cellContents, describeCell } from './cell-description';

interface ArchDrawingProps {
  positions: readonly number[];
  sites: readonly ArchSite[];
  missingTeeth: readonly number[];
  system: ToothSystem;
  onOpenSite: (siteId: string) => void;
  label: string;
  testId: string;
}

/**
 * The two arches in SVG, scaled to the container. One roving tab stop over all positions:
 * Left/Right move along an arch in drawing order, Up/Down jump between arches, Home/End go to
 * an arch's ends, Enter or Space opens an implant site's Site file.
 */
export function ArchDrawing({ positions, sites, missingTeeth, system, onOpenSite, label, testId }: ArchDrawingProps) {
  const layout = useMemo(() => layoutArches(positions), [positions]);
  const contents = useMemo(() => cellContents(positions, sites, missingTeeth), [positions, sites, missingTeeth]);
  const rows = useMemo(
    () => ({
      upper: layout.cells.filter((c) => c.arch === 'upper').sort((a, b) => a.column - b.column),
      lower: layout.cells.filter((c) => c.arch === 'lower').sort((a, b) => a.column - b.column),
    }),
    [layout],
  );
  const [active, setActive] = useState<number | null>(null);
  const elements = useRef(new Map<number, SVGGElement>());

  const drawingOrder = [...rows.upper, ...rows.lower];
  const firstSite = drawingOrder.find((cell) => contents.get(cell.fdi)?.type === 'site');
  const tabStop = active ?? firstSite?.fdi ?? drawingOrder[0]?.fdi;

  const siteAt = (fdi: number) => {
    const content = contents.get(fdi);
    return content?.type === 'site' ? content.site : null;
  };

  const moveTo = (cell: ArchCell | undefined) => {
    if (!cell) return;
    setActive(cell.fdi);
    elements.current.get(cell.fdi)?.focus();
  };

  const onKeyDown = (cell: ArchCell) => (event: KeyboardEvent<SVGGElement>) => {
    const row = rows[cell.arch];
    const other = rows[cell.arch === 'upper' ? 'lower' : 'upper'];
    const inOther = other[Math.min(cell.column, other.length - 1)];
    switch (event.key) {
      case 'ArrowRight':
        moveTo(row[Math.min(cell.column + 1, row.length - 1)]);
        break;
      case 'ArrowLeft':
        moveTo(row[Math.max(cell.column - 1, 0)]);
        break;
      case 'ArrowUp':
        if (cell.arch === 'lower') moveTo(inOther);
        break;
      case 'ArrowDown':
        if (cell.arch === 'upper') moveTo(inOther);
        break;
      case 'Home':
        moveTo(row[0]);
        break;
      case 'End':
        moveTo(row[row.length - 1]);
        break;
      case 'Enter':
      case ' ': {
        const site = siteAt(cell.fdi);
        if (site) onOpenSite(site.id);
        break;
      }
      default:
        return;
    }
    event.preventDefault();
  };

  return (
    <svg
      className="arch-svg"
      viewBox={`0 0 ${layout.width} ${layout.height}`}
      role="group"
      aria-label={label}
      data-testid={testId}
    >
      <g aria-hidden="true" className="arch-orientation">
        <text x={16} y={layout.height / 2} textAnchor="start">
          Patient's right
        </text>
        <text x={layout.width - 16} y={layout.height / 2} textAnchor="end">
          Patient's left
        </text>
      </g>
      {layout.cells.map((cell) => {
        const content = contents.get(cell.fdi) ?? { type: 'natural' as const };
        const site = content.type === 'site' ? content.site : null;
        return (
          <ArchCellView
            key={cell.fdi}
            cell={cell}
            content={content}
            accessibleName={describeCell(cell.fdi, system, content)}
            isTabStop={cell.fdi === tabStop}
            onKeyDown={onKeyDown(cell)}
            onFocus={() => setActive(cell.fdi)}
            onOpen={site ? () => onOpenSite(site.id) : undefined}
            registerRef={(element) => {
              if (element) elements.current.set(cell.fdi, element);
              else elements.current.delete(cell.fdi);
            }}
          />
        );
      })}
      <g aria-hidden="true">
        {layout.cells.map((cell) => (
          <text
            key={cell.fdi}
            className={contents.get(cell.fdi)?.type === 'site' ? 'arch-number arch-number--site' : 'arch-number'}
            x={cell.label.x}
            y={cell.label.y}
          >
            {formatTooth(cell.fdi, system)}
          </text>
        ))}
      </g>
    </svg>
  );
}
