import { openOrderRowSchema } from '../../shared/schemas/imports';
import type { Part } from '../../shared/schemas/master-data';
import {
  openOrderLineKey,
  openOrderNumber,
  RELEASE_NUMBER_MAX,
  type OpenOrderLine,
} from '../releases/open-orders.writer';
import type { CsvTable } from './csv';
import { isComplete, KeyRegister, parseRows, RowProblems } from './import-rows';

export interface OpenOrderContext {
  suppliers: ReadonlySet<string>;
  parts: ReadonlyMap<string, Pick<Part, 'source' | 'supplierCode'>>;
  /** Quantity already received on each existing open-order line, by `openOrderLineKey`. */
  received: ReadonlyMap<string, number>;
}

/**
 * Checks an open-orders file: suppliers and parts must exist, and each part must be bought from
 * the supplier named; a line may not ask for less than was already received against it.
 */
export function checkOpenOrderRows(
  table: CsvTable,
  context: OpenOrderContext,
): { lines: OpenOrderLine[]; problems: RowProblems } {
  const problems = new RowProblems(table.problems);
  const keys = new KeyRegister(problems, 'part_number', (key) => {
    const [supplierCode, reference, partNumber, dueDate] = key.split('\u0000');
    return `${partNumber} due ${dueDate} on order ${reference} of ${supplierCode}`;
  });
  const lines: OpenOrderLine[] = [];

  for (const row of parseRows(table.records, table.columns, openOrderRowSchema, problems)) {
    const { supplier_code: supplierCode, part_number: partNumber, reference } = row.values;
    let known = true;
    if (supplierCode !== undefined && !context.suppliers.has(supplierCode)) {
      problems.add(row.line, 'supplier_code', `unknown supplier '${supplierCode}'`);
      known = false;
    }
    const part = partNumber === undefined ? undefined : context.parts.get(partNumber);
    if (partNumber !== undefined && !part) {
      problems.add(row.line, 'part_number', `unknown part '${partNumber}'`);
      known = false;
    } else if (part && part.source !== 'buy') {
      problems.add(row.line, 'part_number', `part '${partNumber}' is not bought`);
      known = false;
    } else if (part && supplierCode !== undefined && part.supplierCode !== supplierCode) {
      problems.add(
        row.line,
        'part_number',
        `part '${partNumber}' is bought from ${part.supplierCode}, not ${supplierCode}`,
      );
      known = false;
    }
    if (
      supplierCode !== undefined &&
      reference !== undefined &&
      openOrderNumber(supplierCode, reference).length > RELEASE_NUMBER_MAX
    ) {
      problems.add(
        row.line,
        'reference',
        `too long for a release number with supplier ${supplierCode} (at most ${RELEASE_NUMBER_MAX} characters in all)`,
      );
      known = false;
    }
    if (!known || !isComplete(row)) continue;

    const line: OpenOrderLine = {
      supplierCode: row.values.supplier_code,
      partNumber: row.values.part_number,
      qty: row.values.qty,
      dueDate: row.values.due_date,
      reference: row.values.reference,
    };
    const key = openOrderLineKey(line);
    if (!keys.claim(key, row.line)) continue;
    const received = context.received.get(key) ?? 0;
    if (received > line.qty) {
      problems.add(row.line, 'qty', `${received} already received on this order line`);
      continue;
    }
    lines.push(line);
  }
  return { lines, problems };
}
