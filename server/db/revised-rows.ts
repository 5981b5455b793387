import type { EntityManager } from 'typeorm';
import { runSql } from './sql';

/**
 * How far a list of rows was read: the last revision of its table (every insert or change of a
 * row gives it a new, higher revision; database triggers keep them, see the planning-revisions
 * migration) and the id of each row, in the order of the list. Revisions follow the order writers
 * commit in, as the part revisions do (see PartsMark).
 */
export interface RowsMark {
  lastRevision: number;
  ids: readonly number[];
}

export interface RowsRead<T> {
  rows: T[];
  mark: RowsMark;
}

/** A list read from a table with revisions: which rows, their columns, and their order. */
export interface RevisedList<T> {
  table: string;
  /** The row's columns, as selected (without the id). */
  columns: string;
  /** Which rows are in the list (an SQL condition). */
  where: string;
  /** The list's order in SQL, ending with the id so it is total… */
  orderBy: string;
  /** …and the same order in code. */
  compare: (a: T, aId: number, b: T, bId: number) => number;
}

type Row<T> = T & { rowId: number | string; listed?: number | boolean | string };

/** Every row of the list. */
export async function readRows<T>(manager: EntityManager, list: RevisedList<T>): Promise<RowsRead<T>> {
  const { lastRevision } = await readMark(manager, list);
  const rows = await runSql<Row<T>[]>(
    manager,
    `SELECT id AS "rowId", ${list.columns} FROM ${list.table} WHERE ${list.where} ORDER BY ${list.orderBy}`,
  );
  return { rows: rows.map(rowOf), mark: { lastRevision, ids: rows.map((row) => Number(row.rowId)) } };
}

/**
 * The list of `before` read again where it changed: the rows revised since (which may have joined
 * or left the list, or moved in it), and, when rows went, which are left. A row that stands is
 * `before`'s own object; `before` itself when nothing changed. Equal to readRows.
 */
export async function readRowsAgain<T>(
  manager: EntityManager,
  list: RevisedList<T>,
  before: RowsRead<T>,
): Promise<RowsRead<T>> {
  const { listed, lastRevision } = await readMark(manager, list);
  if (lastRevision < before.mark.lastRevision) return readRows(manager, list);
  const revised =
    lastRevision === before.mark.lastRevision
      ? []
      : await runSql<Row<T>[]>(
          manager,
          `SELECT id AS "rowId", CASE WHEN ${list.where} THEN 1 ELSE 0 END AS listed, ${list.columns}
            FROM ${list.table} WHERE revision > ? ORDER BY ${list.orderBy}`,
          [before.mark.lastRevision],
        );
  const revisedIds = new Set(revised.map((row) => Number(row.rowId)));
  const joined = revised.filter((row) => Number(row.listed) === 1);
  const joinedRows = joined.map(rowOf);
  let kept: number[] = [];
  before.mark.ids.forEach((id, place) => revisedIds.has(id) || kept.push(place));
  // Rows went when the list is shorter than the rows that stood and those revised into it make.
  if (listed !== kept.length + joined.length) {
    const present = new Set(
      (await runSql<{ id: number | string }[]>(manager, `SELECT id FROM ${list.table} WHERE ${list.where}`)).map(
        (row) => Number(row.id),
      ),
    );
    kept = kept.filter((place) => present.has(before.mark.ids[place]));
  }
  if (revised.length === 0 && kept.length === before.rows.length) return before;
  // Both in the list's order: merged, they are the list.
  const rows: T[] = [];
  const ids: number[] = [];
  let next = 0;
  for (const place of kept) {
    const row = before.rows[place];
    const id = before.mark.ids[place];
    while (next < joined.length && list.compare(joinedRows[next], Number(joined[next].rowId), row, id) < 0) {
      rows.push(joinedRows[next]);
      ids.push(Number(joined[next].rowId));
      next += 1;
    }
    rows.push(row);
    ids.push(id);
  }
  for (; next < joined.length; next += 1) {
    rows.push(joinedRows[next]);
    ids.push(Number(joined[next].rowId));
  }
  return { rows, mark: { lastRevision, ids } };
}

async function readMark(manager: EntityManager, list: Pick<RevisedList<unknown>, 'table' | 'where'>) {
  const [row] = await runSql<{ listed: number | string; lastRevision: number | string }[]>(
    manager,
    `SELECT (SELECT COUNT(*) FROM ${list.table} WHERE ${list.where}) AS listed,
      (SELECT COALESCE(MAX(revision), 0) FROM ${list.table}) AS "lastRevision"`,
  );
  return { listed: Number(row.listed), lastRevision: Number(row.lastRevision) };
}

function rowOf<T>({ rowId: _rowId, listed: _listed, ...row }: Row<T>): T {
  return row as T;
}
