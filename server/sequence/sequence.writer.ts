import type { EntityManager } from 'typeorm';
import type { SequenceEntry } from '../../shared/schemas/master-data';
import { upsertBy } from '../db/upsert';
import { bumpPlanningVersion } from '../settings/versions';
import { SequenceEntryEntity } from './sequence-entry.entity';

/** Sequence rows are keyed by serial: an existing serial moves to its new date and position. */
export async function upsertSequenceEntries(manager: EntityManager, entries: SequenceEntry[]): Promise<void> {
  await upsertBy(manager, SequenceEntryEntity, entries as SequenceEntryEntity[], 'serial');
  await bumpPlanningVersion(manager, 'sequence');
}
