import { onHandRowSchema } from '../../shared/schemas/imports';
import type { CsvTable } from './csv';
import { isComplete, KeyRegister, parseRows, RowProblems } from './import-rows';

export interface OnHandCount {
  partNumber: string;
  onHand: number;
}

/** Checks a stock-count file: every part must exist and be counted once. */
export function checkOnHandRows(
  table: CsvTable,
  partNumbers: ReadonlySet<string>,
): { counts: OnHandCount[]; problems: RowProblems } {
  const problems = new RowProblems(table.problems);
  const counted = new KeyRegister(problems, 'part_number', (partNumber) => `part '${partNumber}'`);
  const counts: OnHandCount[] = [];

  for (const row of parseRows(table.records, table.columns, onHandRowSchema, problems)) {
    const partNumber = row.values.part_number;
    let sound = true;
    if (partNumber !== undefined && !partNumbers.has(partNumber)) {
      problems.add(row.line, 'part_number', `unknown part '${partNumber}'`);
      sound = false;
    } else if (partNumber !== undefined) {
      sound = counted.claim(partNumber, row.line);
    }
    if (sound && isComplete(row)) counts.push({ partNumber: row.values.part_number, onHand: row.values.on_hand });
  }
  return { counts, problems };
}
