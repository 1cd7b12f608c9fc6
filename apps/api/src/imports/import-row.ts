// What the planner's parts share: the lookup key of a file's values and the error a row fails with.

/** A case- and space-insensitive key of a file's values (chart numbers, references, names). */
export const key = (...parts: (string | number)[]) => parts.map((p) => String(p).trim().toLowerCase()).join('|');

/** A row that does not check: reported beside its column, nothing of the row is written. */
export class RowError extends Error {
  constructor(
    readonly column: string | null,
    message: string,
  ) {
    super(message);
  }
}
