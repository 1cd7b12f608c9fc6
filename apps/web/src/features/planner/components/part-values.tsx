import { type CatalogueComponent, MANUFACTURER_CAUTION } from '@torquetrail/contracts';
import { catalogueValuesRead } from '@torquetrail/domain';
import { formatNumber } from '../../../lib/clinical-labels';

/**
 * The values the catalogue states for a chosen part (angle, collar height), as the rules read them,
 * with the manufacturer's caution beside them; a value a rule reads but the catalogue lacks is said.
 */
export function PartValues({ part }: { part: CatalogueComponent | undefined }) {
  if (!part) return null;
  const facts: string[] = [];
  if (part.angleDeg !== null) facts.push(`angle ${formatNumber(part.angleDeg)}°`);
  else if (catalogueValuesRead(part.kind).includes('angleDeg')) facts.push('angle not stated');
  facts.push(
    part.collarHeightMm === null ? 'collar height not stated' : `collar ${formatNumber(part.collarHeightMm)} mm`,
  );
  return (
    <p className="planner-part-values" data-testid="planner-part-values">
      Catalogue: {facts.join(', ')}. <small>{MANUFACTURER_CAUTION}</small>
    </p>
  );
}
