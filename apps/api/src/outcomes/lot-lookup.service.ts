import { Inject, Injectable } from '@nestjs/common';
import { describeUdiError, type LotLookupQuery, type LotLookupReply } from '@torquetrail/contracts';
import { isValidGtin, parseUdi, UdiError } from '@torquetrail/domain';
import type { Scope } from '../authz/scope.js';
import { csvLine } from '@torquetrail/contracts';
import { fieldError } from '../common/field-error.js';
import { DB, type Database } from '../db/database.js';
import { type LotCriteria, lookUpLots } from './lot-lookup.repository.js';

/** A GTIN-8/12/13 is written as GTIN-14 in a UDI: left-padded with zeros, as GS1 stores it. */
const asGtin14 = (gtin: string) => gtin.padStart(14, '0');

@Injectable()
export class LotLookupService {
  constructor(@Inject(DB) private readonly db: Database) {}

  /** The practice's implants and parts of a lot, GTIN, catalogue part or UDI (parsed with parseUdi). */
  async find(scope: Scope, q: LotLookupQuery): Promise<LotLookupReply> {
    const criteria = this.criteria(q);
    // Only the practice's own patients: a shared patient's parts belong to the practice that fitted them.
    const rows = await lookUpLots(this.db, scope.practiceId, criteria);
    return { by: q.by, ...criteria, rows };
  }

  async csv(scope: Scope, q: LotLookupQuery): Promise<string> {
    const { rows } = await this.find(scope, q);
    let out = csvLine([
      'chart number',
      'patient',
      'site',
      'item',
      'part',
      'reference',
      'GTIN',
      'lot',
      'installed on',
      'removed on',
      'still in place',
    ]);
    for (const r of rows)
      out += csvLine([
        r.chartNumber,
        r.patientName,
        r.fdi,
        r.item,
        r.part,
        r.referenceCode,
        r.gtin,
        r.lot,
        r.installedOn,
        r.removedOn,
        r.inPlace ? 'yes' : 'no',
      ]);
    return out;
  }

  private criteria(q: LotLookupQuery): LotCriteria {
    if (q.by === 'lot') return { lot: q.q, gtin: null, part: null };
    if (q.by === 'part') return { lot: null, gtin: null, part: q.q };
    if (q.by === 'gtin') {
      if (!isValidGtin(q.q)) throw fieldError({ q: 'Not a GTIN: 8, 12, 13 or 14 digits with a correct check digit' });
      return { lot: null, gtin: asGtin14(q.q), part: null };
    }
    try {
      const udi = parseUdi(q.q);
      return { lot: udi.lot ?? null, gtin: udi.gtin, part: null };
    } catch (e) {
      if (e instanceof UdiError) throw fieldError({ q: describeUdiError(e.code, e.message) });
      throw e;
    }
  }
}
