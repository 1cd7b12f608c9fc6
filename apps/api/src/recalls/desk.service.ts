import { Inject, Injectable } from '@nestjs/common';
import type { RecallDeskCsvQuery, RecallDeskQuery, RecallDeskReply } from '@torquetrail/contracts';
import type { Scope } from '../authz/scope.js';
import { DB, type Database } from '../db/database.js';
import { queryDesk } from './desk.repository.js';
import { csvLine } from '@torquetrail/contracts';
import { RecallClock } from './recall-clock.js';

/** Most rows one CSV export carries (a whole practice of 10 000 patients fits). */
const CSV_MAX_ROWS = 50_000;

@Injectable()
export class DeskService {
  constructor(
    @Inject(DB) private readonly db: Database,
    private readonly clock: RecallClock,
  ) {}

  async page(scope: Scope, q: RecallDeskQuery): Promise<RecallDeskReply> {
    const today = this.clock.today();
    const { rows, total } = await queryDesk(this.db, scope, today, q, {
      limit: q.pageSize,
      offset: (q.page - 1) * q.pageSize,
    });
    return { items: rows, total, page: q.page, pageSize: q.pageSize, today };
  }

  async csv(scope: Scope, q: RecallDeskCsvQuery): Promise<string> {
    const today = this.clock.today();
    const { rows } = await queryDesk(this.db, scope, today, q, { limit: CSV_MAX_ROWS, offset: 0 });
    const risk = (r: (typeof rows)[number]['riskFactors']) =>
      [
        r.smoker && 'smoker',
        r.diabetesPoorlyControlled && 'diabetes (poorly controlled)',
        r.periodontitisHistory && 'periodontitis history',
        r.priorPeriImplantitis && 'prior peri-implantitis',
      ]
        .filter(Boolean)
        .join('; ');
    let out = csvLine([
      'chart number',
      'patient',
      'next recall',
      'overdue days',
      'last exam',
      'last status per implant',
      'risk factors',
    ]);
    for (const r of rows) {
      out += csvLine([
        r.chartNumber,
        r.name,
        r.nextDueOn,
        r.overdueDays,
        r.lastExamOn,
        r.sites.map((s) => `${s.fdi}: ${s.status}`).join('; '),
        risk(r.riskFactors),
      ]);
    }
    return out;
  }
}
