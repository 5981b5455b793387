import type { EntityManager, EntityTarget, ObjectLiteral } from 'typeorm';

/** Rows per statement: well under SQLite's limit on bound variables for any of our tables. */
export const WRITE_CHUNK = 200;

/** The rows in slices of WRITE_CHUNK, for statements that take many rows at once. */
export function chunks<T>(rows: readonly T[], size = WRITE_CHUNK): T[][] {
  const out: T[][] = [];
  for (let start = 0; start < rows.length; start += size) out.push(rows.slice(start, start + size));
  return out;
}

/**
 * Inserts the rows, or updates the existing row with the same key. A row overwrites only the
 * columns it carries, so a cell left empty on purpose (on-hand in a parts file) keeps what the
 * database holds; rows are grouped by the columns they carry for that. The query builder is told
 * not to read generated ids back: on SQLite TypeORM's own upsert tries to, and fails with "entity
 * id is not set" as soon as a chunk holds more than one existing row.
 */
export async function upsertBy<T extends ObjectLiteral>(
  manager: EntityManager,
  target: EntityTarget<T>,
  rows: T[],
  key: keyof T & string,
): Promise<void> {
  const metadata = manager.connection.getMetadata(target);
  const keyColumn = metadata.findColumnWithPropertyName(key)!.databaseName;
  const updatable = metadata.columns.filter((column) => !column.isPrimary && column.propertyName !== key);
  const groups = new Map<string, T[]>();
  for (const row of rows) {
    const carried = updatable.map((column) => (column.getEntityValue(row) === undefined ? '0' : '1')).join('');
    const group = groups.get(carried);
    if (group) group.push(row);
    else groups.set(carried, [row]);
  }
  for (const [carried, group] of groups) {
    const overwrite = updatable.filter((_, index) => carried[index] === '1').map((column) => column.databaseName);
    for (const chunk of chunks(group)) {
      await manager
        .createQueryBuilder()
        .insert()
        .into(target)
        .values(chunk)
        .orUpdate(overwrite, [keyColumn])
        .updateEntity(false)
        .execute();
    }
  }
}
