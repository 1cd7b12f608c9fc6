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
import { boneLevelsOfSites, type ImplantRow, listImplants } from './outcomes.repository.js';

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

  /** How the implants in scope do, as of today (UTC): a practice audit, not evidence for treatment choices. */
  async report(scope: Scope, q: OutcomesQuery): Promise<OutcomesReply> {
    const asOf = new Date().toISOString().slice(0, 10);
    const rows = await listImplants(this.db, scope);
    // Grouped by pushing, not by copying a group's list for each member: a practice of 25 000
    // implants took seconds when every added member copied its group (size sweep, session 12).
    const bone = new Map<string, BoneLevelReading[]>();
    for (const b of await boneLevelsOfSites(
      this.db,
      rows.map((r) => r.siteId),
    ))
      pushTo(bone, b.siteId, { date: b.date, boneLevelMm: b.boneLevelMm });

    const implants: OutcomeImplant[] = rows.map((r) => {
      const outcome = outcomeOf(r);
      const end = outcome === 'in-function' ? asOf : r.endedOn;
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
        followUpYears: end && end >= r.placedOn ? round(followUpYears(r.placedOn, end), 2) : null,
        periImplantStatus: outcome === 'in-function' ? r.examStatus : null,
        periImplantOn: outcome === 'in-function' ? r.examinedOn : null,
        ...boneChange(bone.get(r.siteId) ?? [], r.deliveredOn),
        complications: r.complications,
      };
    });

    // An implant out of the mouth without a date cannot be placed on the time axis.
    const timed = implants.filter((i) => i.followUpYears !== null);
    const groups = new Map<string | null, OutcomeImplant[]>();
    for (const i of timed) {
      const key = q.groupBy === 'system' ? i.system : i.retention;
      pushTo(groups, key, i);
    }
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
    const events = timed.reduce((sum, i) => sum + i.complications, 0);
    return {
      asOf,
      groupBy: q.groupBy,
      implants,
      curves,
      withoutEndDate: implants.length - timed.length,
      complications: {
        events,
        implantYears: round(implantYears, 2),
        per100ImplantYears: implantYears > 0 ? round(eventsPer100ImplantYears(events, implantYears), 2) : null,
      },
    };
  }
}
