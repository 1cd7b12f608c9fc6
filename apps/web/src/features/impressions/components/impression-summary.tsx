import { formatTooth } from '@torquetrail/domain';
import { IMPRESSION_METHOD_LABEL } from '../../../lib/clinical-labels';
import { formatDate } from '../../../lib/dates';
import type { ToothSystem } from '../../../lib/tooth-system';
import { useImpressions } from '../api/impressions-api';

/**
 * One line for the restoration card's list of lab prescriptions: the impression the prescription
 * carries (its current version), with the scan bodies and their lots and the scan files, as the
 * lab sheet lists them. Nothing while loading or when none is recorded; the panel below says so.
 */
export function ImpressionSummary({ restorationId, system }: { restorationId: string; system: ToothSystem }) {
  const query = useImpressions(restorationId);
  const current = query.data?.items.find((i) => i.current);
  if (!query.data || !current) return null;
  const bodies = current.scanBodies.map(
    (b) => `${formatTooth(b.fdi, system)} ${b.referenceCode}${b.lot ? ` (lot ${b.lot})` : ''}`,
  );
  const files = current.method === 'digital' ? query.data.scanFiles : [];
  return (
    <li data-testid="prescription-impression">
      Impression: {IMPRESSION_METHOD_LABEL[current.method].toLowerCase()}, taken {formatDate(current.takenOn)}
      {bodies.length > 0 && ` · scan bodies ${bodies.join(', ')}`}
      {files.length > 0 &&
        ` · ${files.length === 1 ? '1 scan file' : `${files.length} scan files`}: ${files.map((f) => f.originalName ?? f.fileType.toUpperCase()).join(', ')}`}
    </li>
  );
}
