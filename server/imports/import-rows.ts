import type { z } from 'zod';
import { columnOfField, describeCellIssue, type ImportRowError } from '../../shared/schemas/imports';
import type { CsvRecord } from './csv';

/** Collects every problem of an upload so the user fixes the file in one pass. */
export class RowProblems {
  private readonly list: ImportRowError[];

  constructor(initial: ImportRowError[] = []) {
    this.list = [...initial];
  }

  add(row: number, column: string, message: string): void {
    this.list.push({ row, column, message });
  }

  /** Domain-schema issues of a whole record, reported under the CSV column of each field. */
  addDomainIssues(row: number, issues: z.core.$ZodIssue[], record: Record<string, unknown>): void {
    for (const issue of issues) {
      const field = String(issue.path[0] ?? '');
      this.add(row, columnOfField(field), describeCellIssue(issue, record[field]));
    }
  }

  get count(): number {
    return this.list.length;
  }

  /** Problems in file order, so the report reads top to bottom. */
  sorted(): ImportRowError[] {
    return [...this.list].sort((a, b) => a.row - b.row);
  }

  /** Number of distinct rows with at least one problem. */
  rowCount(): number {
    return new Set(this.list.map((problem) => problem.row)).size;
  }
}

/** A data row after its cells were parsed one column at a time. */
export interface ParsedRow<T> {
  line: number;
  /** Columns present in the file's header (an absent column keeps existing values). */
  present: ReadonlySet<string>;
  /** Every cell that parsed, so key and reference checks run even when another cell is bad. */
  values: Partial<T>;
  /** True when every cell parsed; only then is the row built into a record. */
  complete: boolean;
}

/**
 * Parses each cell of each record with its column's schema, reporting every bad cell; cells are
 * parsed one by one rather than as an object so one bad number does not hide the rest of the row.
 */
export function parseRows<S extends z.ZodObject>(
  records: CsvRecord[],
  columns: string[],
  schema: S,
  problems: RowProblems,
): ParsedRow<z.output<S>>[] {
  const present = new Set(columns);
  const shape = schema.shape as Record<string, z.ZodType>;
  return records.map((record) => {
    const values: Record<string, unknown> = {};
    let complete = true;
    for (const [column, cellSchema] of Object.entries(shape)) {
      const result = cellSchema.safeParse(record.cells[column]);
      if (result.success) {
        values[column] = result.data;
      } else {
        complete = false;
        for (const issue of result.error.issues) problems.add(record.line, column, issue.message);
      }
    }
    return { line: record.line, present, values: values as Partial<z.output<S>>, complete };
  });
}

/** Narrows a parsed row to one whose every cell is valid. */
export function isComplete<T>(row: ParsedRow<T>): row is ParsedRow<T> & { values: T } {
  return row.complete;
}

/**
 * Value of one field of an upserted record: the cell when filled; the existing record's value when
 * the column is absent from the header; otherwise the default for an empty cell.
 */
export function cellOrKept<T>(
  row: ParsedRow<unknown>,
  column: string,
  cell: T | undefined,
  kept: T | undefined,
  fallback: T,
): T {
  if (cell !== undefined) return cell;
  if (!row.present.has(column) && kept !== undefined) return kept;
  return fallback;
}

/** Remembers the first row of each key and reports a repeat, naming the first row. */
export class KeyRegister {
  private readonly firstRow = new Map<string, number>();

  constructor(
    private readonly problems: RowProblems,
    private readonly column: string,
    private readonly describe: (key: string) => string,
  ) {}

  /** True when the key is new; otherwise reports the row as a duplicate. */
  claim(key: string, line: number): boolean {
    const first = this.firstRow.get(key);
    if (first !== undefined) {
      this.problems.add(line, this.column, `${this.describe(key)} is already on row ${first}`);
      return false;
    }
    this.firstRow.set(key, line);
    return true;
  }
}
