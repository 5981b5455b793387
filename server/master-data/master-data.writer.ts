import { In, type EntityManager } from 'typeorm';
import { chunks, upsertBy } from '../db/upsert';
import type { BomLine, Part, Supplier } from '../../shared/schemas/master-data';
import { BomLineEntity } from './bom-line.entity';
import { PartEntity } from './part.entity';
import { bumpPlanningVersion } from '../settings/versions';
import { SupplierEntity } from './supplier.entity';

// Writers take rows that are already validated (schemas and references) and run inside the
// caller's transaction; imports and the demo seed share them.

export async function upsertSuppliers(manager: EntityManager, suppliers: Supplier[]): Promise<void> {
  await upsertBy(manager, SupplierEntity, suppliers as SupplierEntity[], 'code');
  // Supplier names join into the part read.
  await bumpPlanningVersion(manager, 'parts');
}

/**
 * Upserts the part master. On-hand is not master data: it is left out here (a new part starts at
 * 0, an existing one keeps its stock) and the stock ledger posts what a file says is on hand.
 */
export async function upsertParts(manager: EntityManager, parts: Part[]): Promise<void> {
  const master = parts.map(({ onHand: _onHand, ...part }) => part);
  await upsertBy(manager, PartEntity, master as PartEntity[], 'partNumber');
  await bumpPlanningVersion(manager, 'parts');
}

/** A BOM upload replaces every line of each parent it names and leaves other parents alone. */
export async function replaceBomLines(manager: EntityManager, lines: BomLine[]): Promise<void> {
  const parents = [...new Set(lines.map((line) => line.parent))];
  for (const chunk of chunks(parents)) await manager.delete(BomLineEntity, { parent: In(chunk) });
  for (const chunk of chunks(lines)) await manager.insert(BomLineEntity, chunk);
  await bumpPlanningVersion(manager, 'bom');
}
