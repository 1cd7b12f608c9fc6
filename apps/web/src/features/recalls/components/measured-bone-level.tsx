import { Button, Callout } from '@blueprintjs/core';
import type { ExamContext } from '@torquetrail/contracts';
import { formatDate } from '../../../lib/dates';

type Offer = NonNullable<ExamContext['sites'][number]['measuredBoneLevel']>;

/**
 * The latest bone level measured on a radiograph (worse of mesial and distal), offered as the
 * exam's: accepted with one click, or typed over (then the exam records no source).
 */
export function MeasuredBoneLevel({
  offer,
  fdi,
  accepted,
  onAccept,
}: {
  offer: Offer | null;
  fdi: number;
  accepted: boolean;
  onAccept: (offer: Offer) => void;
}) {
  if (!offer) return null;
  const source = `radiograph of ${offer.takenOn ? formatDate(offer.takenOn) : 'unknown date'}, measured by ${offer.measuredBy}`;
  return (
    <Callout compact icon="media" className="measured-bone-level" data-testid={`measured-bone-${fdi}`}>
      Measured bone level <strong>{offer.boneLevelMm} mm</strong> (mesial {offer.mesialMm.toFixed(2)} mm, distal{' '}
      {offer.distalMm.toFixed(2)} mm; {source}).{' '}
      {accepted ? (
        <span data-testid={`bone-source-${fdi}`}>In use as this exam&apos;s bone level.</span>
      ) : (
        <Button size="small" icon="tick" onClick={() => onAccept(offer)} data-testid={`use-measured-bone-${fdi}`}>
          Use {offer.boneLevelMm} mm
        </Button>
      )}
    </Callout>
  );
}
