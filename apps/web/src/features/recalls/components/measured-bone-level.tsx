import { Button, Callout } from '@blueprintjs/core';
import type { ExamContext } from '@torquetrail/contracts';
import { formatDate } from '../../../lib/dates';

type Offer = ExamContext['sites'][number]['measuredBoneLevels'][number];

/**
 * The bone level measured on the latest radiograph of the exam's day or earlier (worse of mesial
 * and distal; `boneLevelOfferFor`), offered as the exam's: accepted with one click, or typed over
 * (then the exam records no source). The text says which day it is the latest for, since a
 * back-dated exam is offered an older film than the site's newest.
 */
export function MeasuredBoneLevel({
  offer,
  examinedOn,
  fdi,
  accepted,
  onAccept,
}: {
  offer: Offer | null;
  examinedOn: string;
  fdi: number;
  accepted: boolean;
  onAccept: (offer: Offer) => void;
}) {
  if (!offer) return null;
  const taken = offer.takenOn ? formatDate(offer.takenOn) : 'unknown date';
  const source = `radiograph of ${taken}${offer.measuredBy ? `, measured by ${offer.measuredBy}` : ''}`;
  return (
    <Callout compact icon="media" className="measured-bone-level" data-testid={`measured-bone-${fdi}`}>
      Measured bone level <strong>{offer.boneLevelMm} mm</strong> (mesial {offer.mesialMm.toFixed(2)} mm, distal{' '}
      {offer.distalMm.toFixed(2)} mm; {source}; the latest on or before the exam date
      {examinedOn ? ` ${formatDate(examinedOn)}` : ''}).{' '}
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
