import { finished } from 'node:stream';
import type { SQL } from 'drizzle-orm';
import { PgDialect } from 'drizzle-orm/pg-core';
import pg from 'pg';
import { to as copyTo } from 'pg-copy-streams';

const dialect = new PgDialect();

/**
 * A statement's bytes as PostgreSQL writes them with `COPY (…) TO STDOUT WITH (<options>)`, e.g. a
 * whole export as CSV: PostgreSQL formats every row, the API only passes the bytes on
 * (pg-copy-streams reads the COPY data straight off the socket, without pg's row parsing). The
 * connection's socket is paused while the consumer is behind, so PostgreSQL waits too: memory stays
 * at a chunk or two (about 64 kB each) however long the export.
 *
 * The first chunk is read before this resolves, so a statement that fails (PostgreSQL away, a
 * planning error) rejects here and the caller can still answer with an error status. The
 * connection goes back to the pool when the bytes end; a consumer that stops early (`return()`,
 * a cancelled download) or an error discards it, which ends the statement on the server too.
 */
export async function copyOut(pool: pg.Pool, query: SQL, options: string): Promise<AsyncGenerator<Buffer, void>> {
  const { sql: text, params } = dialect.sqlToQuery(query);
  const statement = `copy (${inlineParams(text, params)}) to stdout with (${options})`;
  const client = await pool.connect();
  let released = false;
  const release = (error?: Error) => {
    if (released) return;
    released = true;
    client.release(error);
  };
  let copy: ReturnType<typeof copyTo>;
  try {
    copy = client.query(copyTo(statement));
  } catch (error) {
    release(error instanceof Error ? error : new Error(String(error)));
    throw error;
  }
  // Ended (the connection is reusable: the COPY's last messages are read by pg before its next
  // statement), failed, or destroyed before its end (the connection is then mid-COPY: discarded).
  finished(copy, (error) => release(error ?? undefined));
  const chunks = copy[Symbol.asyncIterator]() as AsyncIterator<Buffer>;
  let first: IteratorResult<Buffer>;
  try {
    first = await chunks.next();
  } catch (error) {
    copy.destroy();
    throw error;
  }
  async function* rest(): AsyncGenerator<Buffer, void> {
    try {
      if (first.done) return;
      yield first.value;
      for (;;) {
        const next = await chunks.next();
        if (next.done) return;
        yield next.value;
      }
    } finally {
      // Stopped early: destroying the stream reports it to `finished` above, which discards the connection.
      if (!copy.readableEnded) copy.destroy();
    }
  }
  const out = rest();
  // A generator that never started runs no `finally` on return(): end the COPY here as well.
  const stop = out.return.bind(out);
  out.return = (value) => {
    if (!copy.readableEnded) copy.destroy();
    return stop(value);
  };
  return out;
}

/**
 * The statement with its parameters written in as literals: COPY takes no parameters. Each `$n` of
 * Drizzle's text becomes a quoted literal of unknown type, which PostgreSQL resolves as it resolves
 * a parameter sent untyped (pg sends every parameter so): `'…'::date`, `rs.practice_id = '…'`.
 * Strings are escaped by pg's `escapeLiteral`; anything but a string, a finite number, a boolean or
 * null is refused rather than guessed at.
 */
export function inlineParams(text: string, params: readonly unknown[]): string {
  const used = new Set<number>();
  const inlined = text.replace(/\$(\d+)/g, (_match, n: string) => {
    const index = Number(n) - 1;
    if (index >= params.length) throw new Error(`COPY statement: no value for $${n}`);
    used.add(index);
    return literal(params[index]);
  });
  // A `$` that is not one of Drizzle's placeholders (in a literal of the text) would have been taken for one.
  if (used.size !== params.length) throw new Error('COPY statement: its placeholders do not match its values');
  return inlined;
}

function literal(value: unknown): string {
  if (value === null || value === undefined) return 'null';
  if (typeof value === 'string') return pg.escapeLiteral(value);
  if ((typeof value === 'number' && Number.isFinite(value)) || typeof value === 'boolean') {
    return pg.escapeLiteral(String(value));
  }
  throw new Error(`COPY statement: a ${typeof value} value cannot be written as a literal`);
}
