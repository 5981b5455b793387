import type { EntityManager } from 'typeorm';

/**
 * Runs plain SQL written once for both engines: `?` placeholders (PostgreSQL gets them numbered
 * `$1, $2…`), quoted camelCase aliases (`AS "partNumber"`: PostgreSQL folds unquoted names to
 * lower case), `NOT flag` or `flag = TRUE` for booleans. The text must hold no literal `?`.
 */
export function runSql<T = unknown>(manager: EntityManager, sql: string, params: readonly unknown[] = []): Promise<T> {
  const text = manager.connection.options.type === 'postgres' ? numberPlaceholders(sql) : sql;
  return manager.query(text, [...params]) as Promise<T>;
}

function numberPlaceholders(sql: string): string {
  let next = 0;
  return sql.replace(/\?/g, () => `$${(next += 1)}`);
}

/** ` FOR UPDATE` on PostgreSQL, so a read-then-write waits for the row; SQLite's single writer needs none. */
export function forUpdate(manager: EntityManager): string {
  return manager.connection.options.type === 'postgres' ? ' FOR UPDATE' : '';
}
