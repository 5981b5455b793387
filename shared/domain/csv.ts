import Papa from 'papaparse';
import type { ImportLayout } from '../schemas/imports';

/*
 * How Cardloop reads a CSV file, in the browser (preview before upload) and on the server (the
 * import itself), so the line numbers a person sees before sending match the server's report:
 * byte-order mark dropped, CR LF and CR read as LF, fully empty lines skipped, cells trimmed, and a
 * quoted cell may span lines (the next row's line number counts every newline consumed).
 */

/** One row as the file holds it: its line number (header = 1), trimmed cells, and a parse error if any. */
export interface CsvRow {
  line: number;
  cells: string[];
  broken: string | null;
}

export type HeaderProblemKind = 'unknown' | 'missing' | 'duplicate';

/** A header cell the import refuses: a column the format does not know, a required one absent, a repeat. */
export interface HeaderProblem {
  column: string;
  kind: HeaderProblemKind;
}

/** The text without a byte-order mark and with LF line ends. */
export function normaliseCsvText(text: string): string {
  return text.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
}

/** Every non-empty row of normalised CSV text, with its line number; `onRow` may stop early by returning false. */
export function readCsvRows(text: string, onRow: (row: CsvRow) => boolean | void): void {
  let line = 1;
  let consumed = 0;
  let stopped = false;
  Papa.parse<string[]>(text, {
    delimiter: ',',
    newline: '\n',
    step: (result, parser) => {
      if (stopped) return;
      const start = line;
      const cursor = result.meta.cursor;
      for (
        let index = text.indexOf('\n', consumed);
        index !== -1 && index < cursor;
        index = text.indexOf('\n', index + 1)
      )
        line += 1;
      consumed = cursor;
      const cells = result.data.map((cell) => cell.trim());
      if (cells.every((cell) => cell === '')) return;
      const broken = result.errors.length > 0 ? result.errors[0].message : null;
      if (onRow({ line: start, cells, broken }) === false) {
        stopped = true;
        parser.abort();
      }
    },
  });
}

/** Header cells the layout does not know, required columns it lacks, and repeated names, in that order of finding. */
export function checkCsvHeader(header: readonly string[], layout: ImportLayout): HeaderProblem[] {
  const problems: HeaderProblem[] = [];
  const seen = new Set<string>();
  for (const name of header) {
    if (name === '') continue;
    if (!layout.columns.includes(name)) problems.push({ column: name, kind: 'unknown' });
    else if (seen.has(name)) problems.push({ column: name, kind: 'duplicate' });
    seen.add(name);
  }
  for (const name of layout.required) {
    if (!seen.has(name)) problems.push({ column: name, kind: 'missing' });
  }
  return problems;
}

/** What is wrong with one header cell, in the words of the import's error report. */
export function headerProblemMessage(problem: HeaderProblem, layout: ImportLayout): string {
  switch (problem.kind) {
    case 'unknown':
      return `unknown column '${problem.column}'; the columns are ${layout.columns.join(', ')}`;
    case 'duplicate':
      return `column '${problem.column}' appears twice in the header`;
    case 'missing':
      return `required column '${problem.column}' is missing from the header`;
  }
}

/** Optional columns of the layout that the header leaves out (existing values are kept). */
export function leftOutColumns(header: readonly string[], layout: ImportLayout): string[] {
  return layout.columns.filter((name) => !layout.required.includes(name) && !header.includes(name));
}

/**
 * Rows as CSV text for download or attachment: CRLF line ends (RFC 4180), and a text cell that a
 * spreadsheet would run as a formula — one starting with =, +, -, @, tab or carriage return — is
 * prefixed with an apostrophe (OWASP, "CSV Injection"). Numbers stay numbers.
 */
export function toCsv(fields: readonly string[], rows: readonly (readonly (string | number)[])[]): string {
  return Papa.unparse(
    { fields: [...fields], data: rows.map((row) => [...row]) },
    { newline: '\r\n', escapeFormulae: true },
  );
}
