import type { SQL } from 'drizzle-orm';
import { PgDialect } from 'drizzle-orm/pg-core';
import type pg from 'pg';

const dialect = new PgDialect();

/**
 * A long read sent in batches through a server-side cursor: PostgreSQL keeps the result and hands
 * over `batchSize` rows per FETCH, so the API holds one batch at a time however many rows the
 * statement has (an export of the whole practice), and the first rows can leave before the last
 * are read. The cursor lives in a read-only transaction on a connection of its own, given back to
 * the pool when the rows end, when the consumer stops early (`return()`), or on an error (then
 * discarded, as its transaction state is unknown). The next FETCH is sent before a batch is handed
 * over, so PostgreSQL reads it while the consumer works on this one (an export's time is then the
 * slower of the two rather than their sum); two batches are held at most.
 */
export async function* cursorBatches<T>(pool: pg.Pool, query: SQL, batchSize: number): AsyncGenerator<T[], void> {
  const { sql: text, params } = dialect.sqlToQuery(query);
  const client = await pool.connect();
  let broken: Error | undefined;
  let open = false;
  const fetchBatch = () => {
    const batch = client.query<T & pg.QueryResultRow>(`fetch ${batchSize} from batch_rows`);
    // Awaited below; a failure while the consumer still holds the previous batch is not unhandled.
    batch.catch(() => {});
    return batch;
  };
  let ahead: ReturnType<typeof fetchBatch> | undefined;
  try {
    await client.query('begin read only');
    open = true;
    await client.query(`declare batch_rows no scroll cursor for ${text}`, params);
    let batch = fetchBatch();
    ahead = batch;
    for (;;) {
      const { rows } = await batch;
      ahead = undefined;
      const more = rows.length === batchSize;
      if (more) {
        batch = fetchBatch();
        ahead = batch;
      }
      if (rows.length > 0) yield rows;
      if (!more) break;
    }
    await client.query('commit');
    open = false;
  } catch (error) {
    broken = error instanceof Error ? error : new Error(String(error));
    throw error;
  } finally {
    // Stopped early: the FETCH sent ahead ends first (the connection answers in order).
    if (ahead) await ahead.catch(() => {});
    if (open && !broken) {
      // Stopped early (the download was cancelled): closing the transaction closes the cursor.
      await client.query('rollback').catch((error: unknown) => {
        broken = error instanceof Error ? error : new Error(String(error));
      });
    }
    client.release(broken);
  }
}
