import { Inject, Injectable } from '@nestjs/common';
import type {
  ImplantOutcome,
  OutcomeImplant,
  OutcomesQuery,
  OutcomesReply,
  SurvivalCurve,
} from '@torquetrail/contracts';
import {
  type BoneLevelReading,
  eventsPer100ImplantYears,
  followUpYears,
  kaplanMeier,
  numberAtRisk,
  type SurvivalObservation,
} from '@torquetrail/domain';
import type { Scope } from '../authz/scope.js';
import { DB, type Database } from '../db/database.js';
import { boneChangeSinceLoading } from './bone-change.js';
import { boneLevelsOfSites, type ImplantRow, latestExamsOfSites, listImplants } from './outcomes.repository.js';

function boneChange(readings: BoneLevelReading[], loadedOn: string | null) {
  const change = boneChangeSinceLoading(readings, loadedOn);
  return { boneChangeMm: change?.mm ?? null, boneChangeSince: change?.since ?? null };
}

const round = (n: number, places: number) => Math.round(n * 10 ** places) / 10 ** places;

function pushTo<K, V>(map: Map<K, V[]>, key: K, value: V) {
  const list = map.get(key);
  if (list) list.push(value);
  else map.set(key, [value]);
}

const outcomeOf = (row: ImplantRow): ImplantOutcome =>
  row.status === 'failed' ? 'failed' : row.status === 'removed' ? 'removed' : 'in-function';

@Injectable()
export class OutcomesService {
  constructor(@Inject(DB) private readonly db: Database) {}

  /**
   * How the implants in scope do, as of today (UTC): a practice audit, not evidence for treatment
   * choices. The curves and the rate count every implant; the exam and bone change are read for the
   * listed page only (session 12: a 25 000-implant practice listed and computed them all, 10 MB in 2.5 s).
   */
  async report(scope: Scope, q: OutcomesQuery): Promise<OutcomesReply> {
    const asOf = new Date().toISOString().slice(0, 10);
    const rows = await listImplants(this.db, scope);
    const followUps = rows.map((r) => {
      const outcome = outcomeOf(r);
      const end = outcome === 'in-function' ? asOf : r.endedOn;
      return {
        row: r,
        outcome,
        followUpYears: end && end >= r.placedOn ? round(followUpYears(r.placedOn, end), 2) : null,
      };
    });

    const page = followUps.slice((q.page - 1) * q.pageSize, q.page * q.pageSize);
    const pageSiteIds = page.map((p) => p.row.siteId);
    const [exams, boneLevels] = await Promise.all([
      latestExamsOfSites(this.db, pageSiteIds),
      boneLevelsOfSites(this.db, pageSiteIds),
    ]);
    const examOf = new Map(exams.map((e) => [e.siteId, e]));
    const bone = new Map<string, BoneLevelReading[]>();
    for (const b of boneLevels) pushTo(bone, b.siteId, { date: b.date, boneLevelMm: b.boneLevelMm });
    const implants: OutcomeImplant[] = page.map(({ row: r, outcome, followUpYears: years }) => {
      const exam = outcome === 'in-function' ? examOf.get(r.siteId) : undefined;
      return {
        siteId: r.siteId,
        patientId: r.patientId,
        chartNumber: r.chartNumber,
        fdi: r.fdi,
        placedOn: r.placedOn,
        system: r.system,
        retention: r.retention,
        outcome,
        endedOn: r.endedOn,
        followUpYears: years,
        periImplantStatus: exam?.status ?? null,
        periImplantOn: exam?.examinedOn ?? null,
        ...boneChange(bone.get(r.siteId) ?? [], r.deliveredOn),
        complications: r.complications,
      };
    });

    // An implant out of the mouth without a date cannot be placed on the time axis.
    const timed = followUps.filter((f) => f.followUpYears !== null);
    const groups = new Map<string | null, typeof timed>();
    for (const f of timed) pushTo(groups, q.groupBy === 'system' ? f.row.system : f.row.retention, f);
    const curves: SurvivalCurve[] = [...groups.entries()]
      .sort(([a], [b]) => (a ?? '~').localeCompare(b ?? '~'))
      .map(([group, members]) => {
        const observations: SurvivalObservation[] = members.map((m) => ({
          time: m.followUpYears!,
          event: m.outcome !== 'in-function',
        }));
        const km = kaplanMeier(observations);
        const longest = Math.max(...observations.map((o) => o.time));
        return {
          group,
          subjects: km.subjects,
          events: km.events,
          steps: km.steps.map((s) => ({
            years: round(s.time, 4),
            atRisk: s.atRisk,
            events: s.events,
            censored: s.censored,
            survival: round(s.survival, 4),
            standardError: s.standardError === null ? null : round(s.standardError, 4),
          })),
          atRiskByYear: Array.from({ length: Math.floor(longest) + 1 }, (_, year) => numberAtRisk(observations, year)),
        };
      });

    const implantYears = timed.reduce((sum, i) => sum + i.followUpYears!, 0);
    const events = timed.reduce((sum, f) => sum + f.row.complications, 0);
    return {
      asOf,
      groupBy: q.groupBy,
      implants,
      total: rows.length,
      page: q.page,
      pageSize: q.pageSize,
      curves,
      withoutEndDate: rows.length - timed.length,
      complications: {
        events,
        implantYears: round(implantYears, 2),
        per100ImplantYears: implantYears > 0 ? round(eventsPer100ImplantYears(events, implantYears), 2) : null,
      },
    };
  }
}
