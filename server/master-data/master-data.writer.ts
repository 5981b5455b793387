import { In, type EntityManager } from 'typeorm';
import type { BomLine, Part, SequenceEntry, Supplier } from '../../shared/schemas/master-data';
import { BomLineEntity } from '../bom/bom-line.entity';
import { PartEntity } from '../parts/part.entity';
import { SequenceEntryEntity } from '../sequence/sequence-entry.entity';
import { bumpPlanningVersion } from '../settings/settings.service';
import { SupplierEntity } from '../suppliers/supplier.entity';

// Writers take rows that are already validated (schemas and references) and run inside the
// caller's transaction; imports and the demo seed share them.
const CHUNK = 200;

function chunks<T>(rows: T[]): T[][] {
  const out: T[][] = [];
  for (let start = 0; start < rows.length; start += CHUNK) out.push(rows.slice(start, start + CHUNK));
  return out;
}

export async function upsertSuppliers(manager: EntityManager, suppliers: Supplier[]): Promise<void> {
  for (const chunk of chunks(suppliers)) await manager.upsert(SupplierEntity, chunk, ['code']);
  await bumpPlanningVersion(manager);
}

export async function upsertParts(manager: EntityManager, parts: Part[]): Promise<void> {
  for (const chunk of chunks(parts)) await manager.upsert(PartEntity, chunk, ['partNumber']);
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
  for (const chunk of chunks(entries)) await manager.upsert(SequenceEntryEntity, chunk, ['serial']);
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
