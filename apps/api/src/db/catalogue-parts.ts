import { components } from './schema/index.js';

/** What a catalogue part is, as every feature that shows or checks parts selects it (catalogue, restorations). */
export const componentSpecColumns = {
  id: components.id,
  platformId: components.platformId,
  kind: components.kind,
  name: components.name,
  referenceCode: components.referenceCode,
  engaging: components.engaging,
  angleDeg: components.angleDeg,
  collarHeightMm: components.collarHeightMm,
  tray: components.tray,
  torqueSpecNcm: components.torqueSpecNcm,
  tolerancePct: components.tolerancePct,
  requiresLot: components.requiresLot,
};
