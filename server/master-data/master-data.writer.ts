import { In, type EntityManager, type EntityTarget, type ObjectLiteral } from 'typeorm';
import type { BomLine, Part, SequenceEntry, Supplier } from '../../shared/schemas/master-data';
import { BomLineEntity } from './bom-line.entity';
import { PartEntity } from './part.entity';
import { SequenceEntryEntity } from '../sequence/sequence-entry.entity';
import { bumpPlanningVersion } from '../settings/versions';
import { SupplierEntity } from './supplier.entity';

// Writers take rows that are already validated (schemas and references) and run inside the
// caller's transaction; imports and the demo seed share them.
const CHUNK = 200;

function chunks<T>(rows: T[]): T[][] {
  const out: T[][] = [];
  for (let start = 0; start < rows.length; start += CHUNK) out.push(rows.slice(start, start + CHUNK));
  return out;
}

/**
 * Inserts the rows, or updates the existing row with the same key. A row overwrites only the
 * columns it carries, so a cell left empty on purpose (on-hand in a parts file) keeps what the
 * database holds; rows are grouped by the columns they carry for that. The query builder is told
 * not to read generated ids back: on SQLite TypeORM's own upsert tries to, and fails with "entity
 * id is not set" as soon as a chunk holds more than one existing row.
 */
async function upsertBy<T extends ObjectLiteral>(
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
    groups.set(carried, [...(groups.get(carried) ?? []), row]);
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

export async function upsertSuppliers(manager: EntityManager, suppliers: Supplier[]): Promise<void> {
  await upsertBy(manager, SupplierEntity, suppliers as SupplierEntity[], 'code');
  await bumpPlanningVersion(manager);
}

export async function upsertParts(manager: EntityManager, parts: Part[]): Promise<void> {
  await upsertBy(manager, PartEntity, parts as PartEntity[], 'partNumber');
  await bumpPlanningVersion(manager);
}

/** A BOM upload replaces every line of each parent it names and leaves other parents alone. */
export async function replaceBomLines(manager: EntityManager, lines: BomLine[]): Promise<void> {
  const parents = [...new Set(lines.map((line) => line.parent))];
  for (const chunk of chunks(parents)) await manager.delete(BomLineEntity, { parent: In(chunk) });
  for (const chunk of chunks(lines)) await manager.insert(BomLineEntity, chunk);
  await bumpPlanningVersion(manager);
}

/** Sequence rows are keyed by serial: an existing serial moves to its new date and position. */
export async function upsertSequenceEntries(manager: EntityManager, entries: SequenceEntry[]): Promise<void> {
  await upsertBy(manager, SequenceEntryEntity, entries as SequenceEntryEntity[], 'serial');
  await bumpPlanningVersion(manager);
}

export async function setOnHand(
  manager: EntityManager,
  counts: { partNumber: string; onHand: number }[],
): Promise<void> {
  for (const count of counts)
    await manager.update(PartEntity, { partNumber: count.partNumber }, { onHand: count.onHand });
  await bumpPlanningVersion(manager);
}
