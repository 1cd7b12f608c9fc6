import { Column, getTableName, is, SQL, Subquery } from 'drizzle-orm';

/** What Drizzle keeps on a prepared select (node-postgres session): its columns in order and its joins. */
interface PreparedSelect {
  fields?: readonly { path: string[]; field: unknown }[];
  joinsNotNullableMap?: Record<string, boolean>;
  customResultMapper?: (rows: unknown[][]) => unknown;
}

interface Decoder {
  mapFromDriverValue(value: unknown): unknown;
}

/**
 * Drizzle's `mapResultRow`, with the work that depends only on the query done once: which decoder
 * each column has and which table a column of a join belongs to. Drizzle works both out again
 * for every cell of every row (an `is()` chain per cell, an iterator per path, `getTableName` per
 * joined column), about a tenth of the API's JavaScript on the Site file's reads (docs/performance.md,
 * session 10). The result is the same object, key for key and in the same order: a left join whose
 * columns are all null becomes null, as Drizzle does.
 */
export function compileRowMapper(
  fields: NonNullable<PreparedSelect['fields']>,
  joinsNotNullableMap: Record<string, boolean> | undefined,
): (row: unknown[]) => Record<string, unknown> {
  const columns = fields.map(({ path, field }) => {
    const f = field as { decoder?: Decoder; sql?: { decoder: Decoder }; _?: { sql: { decoder: Decoder } } };
    const isColumn = is(field, Column);
    const decoder = isColumn
      ? (field as Decoder)
      : is(field, SQL)
        ? f.decoder!
        : is(field, Subquery)
          ? f._!.sql.decoder
          : f.sql!.decoder;
    return {
      parents: path.slice(0, -1),
      key: path[path.length - 1],
      decoder,
      // Only a table's own column, two levels deep, says whether its join found a row (Drizzle's rule).
      joined: joinsNotNullableMap && isColumn && path.length === 2 ? getTableName(field.table) : null,
      objectName: path[0],
    };
  });
  return (row) => {
    const result: Record<string, unknown> = {};
    const nullify: Record<string, string | false> = {};
    let anyJoined = false;
    for (let i = 0; i < columns.length; i += 1) {
      const column = columns[i];
      let node = result;
      for (const chunk of column.parents) {
        if (!(chunk in node)) node[chunk] = {};
        node = node[chunk] as Record<string, unknown>;
      }
      const raw = row[i];
      const value = (node[column.key] = raw === null ? null : column.decoder.mapFromDriverValue(raw));
      if (column.joined !== null) {
        anyJoined = true;
        const seen = nullify[column.objectName];
        if (seen === undefined) nullify[column.objectName] = value === null ? column.joined : false;
        else if (typeof seen === 'string' && seen !== column.joined) nullify[column.objectName] = false;
      }
    }
    if (anyJoined && joinsNotNullableMap) {
      for (const [objectName, tableName] of Object.entries(nullify)) {
        if (typeof tableName === 'string' && !joinsNotNullableMap[tableName]) result[objectName] = null;
      }
    }
    return result;
  };
}

/**
 * Gives a prepared select the compiled mapper (Drizzle calls `customResultMapper` with the rows
 * instead of mapping each through `mapResultRow`). Leaves any other prepared query as it is.
 */
export function withCompiledRowMapper<T>(query: T): T {
  const prepared = query as PreparedSelect;
  if (!prepared.fields || prepared.customResultMapper) return query;
  const map = compileRowMapper(prepared.fields, prepared.joinsNotNullableMap);
  prepared.customResultMapper = (rows) => rows.map(map);
  return query;
}
