import { Inject, Injectable } from '@nestjs/common';
import type { AppAbility } from '@torquetrail/authz';
import type { DateFormat, SiteBoneLevel, SiteBoneLevels } from '@torquetrail/contracts';
import { boneLevelSummary, examBoneLevelMm } from '@torquetrail/domain';
import { asSiteRow, assertCan, type Scope } from '../authz/scope.js';
import { datePrinter } from '../common/printed-dates.js';
import { DB, type Database } from '../db/database.js';
import * as repo from './bone-levels.repository.js';

const toBoneLevel = (m: repo.SiteMeasurementRow): SiteBoneLevel => ({
  measurementId: m.measurementId,
  radiographId: m.radiographId,
  takenOn: m.takenOn,
  mesialMm: m.mesialMm,
  distalMm: m.distalMm,
  examBoneLevelMm: examBoneLevelMm(m),
  implantTrueMm: m.implantTrueMm,
  measuredBy: m.measuredBy,
  measuredAt: m.measuredAt.toISOString(),
  amended: m.amended,
});

/**
 * Measured bone levels as the clinical record uses them: the Site file's chart (with the
 * Albrektsson and ICOI views of the series) and the value offered to the recall exam.
 */
@Injectable()
export class BoneLevelsService {
  constructor(@Inject(DB) private readonly db: Database) {}

  /** The site's bone levels and their summary, the reasons' dates in the reader's practice's order. */
  async forSite(ability: AppAbility, scope: Scope, siteId: string, dateFormat: DateFormat): Promise<SiteBoneLevels> {
    const site = assertCan(
      ability,
      'read',
      'Radiograph',
      asSiteRow(await repo.findVisibleSite(this.db, scope, siteId)),
      'implant site',
    );
    const rows = await repo.currentSiteMeasurements(this.db, [site.id]);
    const exams = await repo.examFindings(this.db, site.id);
    const [latestExam, ...earlier] = exams;
    const implantLengthMm = site.implantLengthMm ?? rows[0]?.implantTrueMm ?? null;
    const dated = rows.flatMap((r) =>
      r.takenOn ? [{ date: r.takenOn, mesialMm: r.mesialMm, distalMm: r.distalMm }] : [],
    );
    const summary =
      implantLengthMm === null
        ? null
        : boneLevelSummary({
            readings: dated,
            loadedOn: site.loadedOn,
            implantLengthMm,
            latestExam: latestExam
              ? {
                  mobility: latestExam.mobility,
                  maxProbingDepthMm: latestExam.maxProbingDepthMm,
                  suppurationNow: latestExam.suppuration,
                  suppurationBefore: earlier.some((e) => e.suppuration),
                }
              : null,
            writeDate: (iso) => datePrinter(dateFormat).date(iso),
          });
    return {
      siteId: site.id,
      loadedOn: site.loadedOn,
      implantLengthMm,
      items: rows.map(toBoneLevel),
      albrektsson: summary?.albrektsson ?? null,
      icoi: summary?.icoi ?? null,
    };
  }

  /**
   * The current measured bone levels of each site, latest first (the exam form offers the one for
   * its date). The caller has checked that the user may read the sites' patient.
   */
  async bySite(siteIds: readonly string[]) {
    const bySite = new Map<string, SiteBoneLevel[]>();
    for (const row of await repo.currentSiteMeasurements(this.db, siteIds)) {
      const list = bySite.get(row.siteId) ?? [];
      list.push(toBoneLevel(row));
      bySite.set(row.siteId, list);
    }
    return bySite;
  }

  /** The named measurement when it is a current one of the site on a radiograph not entered in error. */
  async currentOfSite(measurementId: string, siteId: string) {
    const row = await repo.findCurrentSiteMeasurement(this.db, measurementId, siteId);
    return row ? toBoneLevel(row) : null;
  }
}
