// The catalogue page's search: which systems, platforms and parts a typed search keeps. A part is
// kept when every word of the search is found in its own words or in its platform's and system's
// (so "NobelX 4.3 screw" narrows to the screws of that platform); a system or platform whose own
// words match keeps all its parts.
import type { CatalogueSystem } from '@torquetrail/contracts';
import { COMPONENT_KIND_LABEL, CONNECTION_LABEL } from '../../../lib/clinical-labels';

/** The catalogue narrowed to a search, grouped by system and platform, with the counts shown. */
export interface FilteredCatalogue {
  systems: CatalogueSystem[];
  /** Parts kept, over all systems. */
  parts: number;
}

const words = (search: string) => search.toLocaleLowerCase().split(/\s+/).filter(Boolean);

export function filterCatalogue(systems: readonly CatalogueSystem[], search: string): FilteredCatalogue {
  const wanted = words(search);
  const kept: CatalogueSystem[] = [];
  let parts = 0;
  for (const system of systems) {
    const systemText = `${system.name} ${system.manufacturer}`;
    const platforms = system.platforms.flatMap((platform) => {
      const platformText = `${systemText} ${platform.name} ${platform.diameterMm} mm ${CONNECTION_LABEL[platform.connection]}`;
      const components = platform.components.filter((c) => {
        const text = `${platformText} ${c.name} ${c.referenceCode} ${COMPONENT_KIND_LABEL[c.kind]}`.toLocaleLowerCase();
        return wanted.every((w) => text.includes(w));
      });
      // A platform matched by its own words is kept even while it has no parts yet.
      const platformMatches = wanted.every((w) => platformText.toLocaleLowerCase().includes(w));
      if (components.length === 0 && !platformMatches) return [];
      parts += components.length;
      return [{ ...platform, components }];
    });
    // A system matched by its own words is kept even while it has no platforms yet.
    if (platforms.length === 0 && !wanted.every((w) => systemText.toLocaleLowerCase().includes(w))) continue;
    kept.push({ ...system, platforms });
  }
  return { systems: kept, parts };
}
