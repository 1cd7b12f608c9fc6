// A practice-wide setting is a few columns of `practices`, read by the rules that use it and
// changed by the practice administrator. Every setting is read and changed here, the same way:
// the change is audited with the values before and after, in the transaction that writes it.
import { eq, getTableColumns } from 'drizzle-orm';
import type { PgColumn } from 'drizzle-orm/pg-core';
import { reportChange } from '../common/audit-context.js';
import { auditedTransaction } from './audited-transaction.js';
import type { Database, Db } from './database.js';
import { practices } from './schema/index.js';

type PracticeColumn = (typeof practices)['_']['columns'][keyof (typeof practices)['_']['columns']];
type ValuesOf<C extends Record<string, PgColumn>> = { [K in keyof C]: C[K]['_']['data'] };

const propertyOf = new Map<PgColumn, string>(
  Object.entries(getTableColumns(practices)).map(([property, column]) => [column, property]),
);

/**
 * The setting made of `columns`, named as the API names its fields (`{ cantileverRatioLimit:
 * practices.cantileverRatioLimit }`): `read` for the rules, `change` for the settings page.
 */
function practiceSetting<C extends Record<string, PracticeColumn>>(columns: C) {
  async function read(db: Db, practiceId: string): Promise<ValuesOf<C>> {
    const [row] = await db.select(columns).from(practices).where(eq(practices.id, practiceId));
    return row as ValuesOf<C>;
  }

  /** Writes the values and audits them as a change of the practice; answers what is now stored. */
  function change(db: Database, practiceId: string, values: ValuesOf<C>): Promise<ValuesOf<C>> {
    return auditedTransaction(db, async (tx) => {
      const before = await read(tx, practiceId);
      const set = Object.fromEntries(
        Object.entries(columns).map(([field, column]) => [propertyOf.get(column), values[field]]),
      );
      await tx.update(practices).set(set).where(eq(practices.id, practiceId));
      const after = await read(tx, practiceId);
      reportChange({ type: 'Practice', id: practiceId, before, after });
      return after;
    });
  }

  return { read, change };
}

export const wrenchSettings = practiceSetting({
  calibrationIntervalMonths: practices.wrenchCalibrationIntervalMonths,
});
export const cantileverSettings = practiceSetting({ cantileverRatioLimit: practices.cantileverRatioLimit });
export const impressionSettings = practiceSetting({
  requireScanBodyRadiograph: practices.requireScanBodyRadiograph,
});
export const sessionSettings = practiceSetting({
  idleSignOutMinutes: practices.idleSignOutMinutes,
  dateFormat: practices.dateFormat,
});
export const insertReviewSettings = practiceSetting({
  insertReviewIntervalMonths: practices.insertReviewIntervalMonths,
});
