// Which scan bodies the impression form offers at a site, and the planner's own scan-body rule
// (`checkScanBodies`) run on the form's body before it is sent, so a scan body of another platform
// is named beside its site. The API runs the same rule on the same body.
import type { CatalogueReply, RestorationSiteDetail } from '@torquetrail/contracts';
import {
  checkScanBodies,
  type CopingLevel,
  type Finding,
  impressionLevelFindings,
  impressionLevelFor,
  type Retention,
  SCAN_BODY_FINDING_CODES,
  type ScanBodyEntry,
} from '@torquetrail/domain';

/** A scan body of the practice catalogue, with what the platform rule needs. */
export interface ScanBodyOption {
  id: string;
  name: string;
  referenceCode: string;
  requiresLot: boolean;
  platformName: string;
  /** "system · platform": how a restoration's site names its implant's platform. */
  platformKey: string;
  /** Implant level or on a multi-unit abutment, as the catalogue states it (null: not stated). */
  copingLevel: CopingLevel | null;
}

type Site = Pick<RestorationSiteDetail, 'siteId' | 'fdi' | 'systemName' | 'platformName'>;

export const platformKeyOf = (site: Pick<Site, 'systemName' | 'platformName'>) =>
  `${site.systemName ?? '?'} · ${site.platformName ?? '?'}`;

/** Every scan body of the catalogue, each with its platform. */
export function scanBodyOptions(catalogue: CatalogueReply): ScanBodyOption[] {
  return catalogue.systems.flatMap((s) =>
    s.platforms.flatMap((p) =>
      p.components
        .filter((c) => c.kind === 'scan-body')
        .map((c) => ({
          id: c.id,
          name: c.name,
          referenceCode: c.referenceCode,
          requiresLot: c.requiresLot,
          platformName: p.name,
          platformKey: platformKeyOf({ systemName: s.name, platformName: p.name }),
          copingLevel: c.copingLevel,
        })),
    ),
  );
}

/**
 * Whether a scan body suits the site: of its platform and, when the restoration's retention is
 * known, of the level the restoration is made on (or of no stated level: the API then warns). The
 * form lists these first, under the site's platform.
 */
export const suitsSite = (option: ScanBodyOption, site: Site, retention?: Retention) =>
  option.platformKey === platformKeyOf(site) &&
  (retention === undefined || option.copingLevel === null || option.copingLevel === impressionLevelFor(retention));

/**
 * The Findings of `checkScanBodies` on a digital impression's body (and, when the restoration's
 * retention is given, the errors of the level rule `impressionLevelFindings`, as the API runs it), each at the path of the field
 * it concerns (`scanBodies.<i>.componentId` or `.lot`, i = the entry of that site). A choice not in
 * the list (left empty) is the contract's to report.
 */
export function scanBodyIssues(
  body: { method: string; scanBodies: { siteId: string; componentId: string; lot: string | null }[] },
  sites: readonly Site[],
  options: readonly ScanBodyOption[],
  retention?: Retention,
): { path: (string | number)[]; message: string }[] {
  if (body.method !== 'digital') return [];
  const levels: Finding[] = [];
  const entries: ScanBodyEntry[] = [];
  const indexOfFdi = new Map<number, number>();
  body.scanBodies.forEach((b, i) => {
    const site = sites.find((s) => s.siteId === b.siteId);
    const part = options.find((o) => o.id === b.componentId);
    if (!site) return;
    indexOfFdi.set(site.fdi, i);
    if (!part) return;
    if (retention)
      levels.push(
        ...impressionLevelFindings(retention, site.fdi, 'scan body', part).filter((f) => f.severity === 'error'),
      );
    entries.push({
      fdi: site.fdi,
      lot: b.lot,
      part: {
        name: part.name,
        kind: 'scan-body',
        platformId: part.platformKey,
        platformName: part.platformName,
        requiresLot: part.requiresLot,
      },
    });
  });
  const ruleSites = sites
    // A site whose entry has no part chosen yet: the contract names it; the rule would repeat it.
    .filter((s) => entries.some((e) => e.fdi === s.fdi))
    .map((s) => ({ fdi: s.fdi, platformId: platformKeyOf(s), platformName: s.platformName ?? 'unknown' }));
  const seen = new Set<string>();
  const issues: { path: (string | number)[]; message: string }[] = [];
  for (const f of [...checkScanBodies('digital', ruleSites, entries), ...levels]) {
    const i = f.fdi === undefined ? undefined : indexOfFdi.get(f.fdi);
    if (i === undefined) continue;
    const field = f.code === SCAN_BODY_FINDING_CODES.LOT_MISSING ? 'lot' : 'componentId';
    if (seen.has(`${i}.${field}`)) continue;
    seen.add(`${i}.${field}`);
    issues.push({ path: ['scanBodies', i, field], message: f.message });
  }
  return issues;
}
