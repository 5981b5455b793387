import {
  checkCsvHeader,
  headerProblemMessage,
  normaliseCsvText,
  readCsvRows,
  type CsvRow,
} from '../../shared/domain/csv';
import type { ImportLayout, ImportRowError } from '../../shared/schemas/imports';
import { ImportError } from '../errors';

/** One data row: its line in the file and its trimmed cells by header name (only columns in the header). */
export interface CsvRecord {
  line: number;
  cells: Record<string, string>;
}

export interface CsvTable {
  columns: string[];
  records: CsvRecord[];
  /** Row-level problems found while reading (stray cells, broken quotes); checked rows add theirs. */
  problems: ImportRowError[];
}

const FILE_COLUMN = '';

function rejectFile(row: number, column: string, message: string): never {
  throw new ImportError('The file cannot be read; nothing was imported.', [{ row, column, message }]);
}

function lineOfOffset(text: string, offset: number): number {
  let line = 1;
  for (let index = text.indexOf('\n'); index !== -1 && index < offset; index = text.indexOf('\n', index + 1)) line += 1;
  return line;
}

function decodeUtf8(file: Buffer): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(file);
  } catch {
    // Point at the line of the first undecodable byte so the user can find a stray legacy character.
    const lenient = new TextDecoder('utf-8').decode(file);
    return rejectFile(
      lineOfOffset(lenient, lenient.indexOf('\uFFFD')),
      FILE_COLUMN,
      'the file is not UTF-8 text; save it as CSV UTF-8',
    );
  }
}

function readHeader(row: CsvRow, layout: ImportLayout): string[] {
  const problems = checkCsvHeader(row.cells, layout).map((problem) => ({
    row: row.line,
    column: problem.column,
    message: headerProblemMessage(problem, layout),
  }));
  if (problems.length > 0)
    throw new ImportError('The header row does not match the format; nothing was imported.', problems);
  return row.cells;
}

/**
 * Reads an uploaded CSV: UTF-8 with or without a byte-order mark, a header row naming columns of
 * `layout`, fully empty lines skipped, cells trimmed. Header and encoding problems throw an
 * ImportError at once; row-level reading problems are returned with the table.
 */
export function readCsvTable(file: Buffer, layout: ImportLayout): CsvTable {
  const rows: CsvRow[] = [];
  readCsvRows(normaliseCsvText(decodeUtf8(file)), (row) => {
    rows.push(row);
  });
  if (rows.length === 0)
    rejectFile(1, FILE_COLUMN, `the file is empty; the first line must be the header: ${layout.columns.join(',')}`);

  const [headerRow, ...dataRows] = rows;
  const header = readHeader(headerRow, layout);
  const columns = header.filter((name) => name !== '');
  const problems: ImportRowError[] = [];
  const records: CsvRecord[] = [];
  for (const row of dataRows) {
    if (row.broken) {
      problems.push({ row: row.line, column: FILE_COLUMN, message: `the row cannot be read: ${row.broken}` });
      continue;
    }
    const cells: Record<string, string> = {};
    let strayCells = 0;
    row.cells.forEach((cell, index) => {
      const name = header[index];
      if (name) cells[name] = cell;
      else if (cell !== '') strayCells += 1;
    });
    // A short row (trailing cells left off) reads as empty cells; a value outside any column is an error.
    for (const name of columns) cells[name] ??= '';
    if (strayCells > 0) {
      problems.push({
        row: row.line,
        column: FILE_COLUMN,
        message: `${strayCells} cell(s) lie outside the ${columns.length} columns of the header`,
      });
    }
    records.push({ line: row.line, cells });
  }
  return { columns, records, problems };
}
