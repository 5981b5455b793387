import type { EntityManager } from 'typeorm';
import type { PlanningBomLine } from '../../shared/domain/types';
import { runSql } from '../db/sql';
import { BOM_COLUMNS } from '../planning/plan-inputs';

/**
 * How far the BOM was read: the last line revision (every insert or change of a line gives it a
 * new, higher revision; database triggers keep them, see the planning-revisions migration) and the
 * id of each line, in the order of the list. Revisions follow the order writers commit in, as the
 * part revisions do (see PartsMark).
 */
export interface BomMark {
  lastRevision: number;
  /** Ascending, as the lines are listed. */
  ids: readonly number[];
}

export interface BomRead {
  bom: PlanningBomLine[];
  mark: BomMark;
}

type BomRow = PlanningBomLine & { id: number };

const COLUMNS = `id, ${BOM_COLUMNS}`;
const MARK_SQL = `SELECT COUNT(*) AS "lineCount", COALESCE(MAX(revision), 0) AS "lastRevision" FROM bom_line`;

/** Every line, in the order the plan reads them (by id). */
export async function readBom(manager: EntityManager): Promise<BomRead> {
  const { lastRevision } = await readMark(manager);
  return split(await runSql<BomRow[]>(manager, `SELECT ${COLUMNS} FROM bom_line ORDER BY id`), lastRevision);
}

/**
 * The BOM of `before` read again where it changed: the lines revised since, and (when lines went)
 * which lines are left. A line that stands is `before`'s own object. Equal to readBom.
 */
export async function readBomAgain(manager: EntityManager, before: BomRead): Promise<BomRead> {
  const { lineCount, lastRevision } = await readMark(manager);
  if (lastRevision < before.mark.lastRevision) return readBom(manager);
  const revised =
    lastRevision === before.mark.lastRevision
      ? []
      : await runSql<BomRow[]>(manager, `SELECT ${COLUMNS} FROM bom_line WHERE revision > ? ORDER BY id`, [
          before.mark.lastRevision,
        ]);
  const { ids } = before.mark;
  const placeOf = (id: number) => binarySearch(ids, id);
  const added = revised.filter((row) => placeOf(row.id) < 0).map((row) => row.id);
  // No line went when the count is what the lines before and the new ones make.
  const present =
    lineCount === ids.length + added.length
      ? mergeAscending(ids, added)
      : (await runSql<{ id: number }[]>(manager, 'SELECT id FROM bom_line ORDER BY id')).map((row) => Number(row.id));
  if (revised.length === 0 && present.length === ids.length) return before;
  const revisedById = new Map(revised.map((row) => [Number(row.id), row]));
  const bom = present.map((id) => {
    const row = revisedById.get(id);
    return row ? lineOf(row) : before.bom[placeOf(id)];
  });
  return { bom, mark: { lastRevision, ids: present } };
}

async function readMark(manager: EntityManager): Promise<{ lineCount: number; lastRevision: number }> {
  const [row] = await runSql<{ lineCount: number | string; lastRevision: number | string }[]>(manager, MARK_SQL);
  return { lineCount: Number(row.lineCount), lastRevision: Number(row.lastRevision) };
}

function split(rows: BomRow[], lastRevision: number): BomRead {
  return { bom: rows.map(lineOf), mark: { lastRevision, ids: rows.map((row) => Number(row.id)) } };
}

function lineOf({ id: _id, ...line }: BomRow): PlanningBomLine {
  return line;
}

/** The place of `value` in ascending `list`, or a negative number when it is not there. */
function binarySearch(list: readonly number[], value: number): number {
  let low = 0;
  let high = list.length - 1;
  while (low <= high) {
    const middle = (low + high) >>> 1;
    if (list[middle] < value) low = middle + 1;
    else if (list[middle] > value) high = middle - 1;
    else return middle;
  }
  return -1;
}

function mergeAscending(a: readonly number[], b: readonly number[]): number[] {
  if (b.length === 0) return a.slice();
  const merged: number[] = [];
  let i = 0;
  let j = 0;
  while (i < a.length || j < b.length) {
    if (j >= b.length || (i < a.length && a[i] < b[j])) merged.push(a[i++]);
    else merged.push(b[j++]);
  }
  return merged;
}
