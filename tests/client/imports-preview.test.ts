import { createAppContext, demoUsers, mountInApp } from './helpers';
import { afterEach, describe, expect, it } from 'vitest';
import { IMPORT_LAYOUTS, IMPORT_MAX_BYTES } from '@shared/schemas/imports';
import ImportsPreview from '@/components/ImportsPreview.vue';
import { checkCsvHeader } from '@shared/domain/csv';
import { checkCsvFile, readCsvPreview, type CsvPreview } from '@/stores/imports';

// Layouts as published in PRODUCT.md, "CSV formats (header names exactly)":
// on-hand is `part_number,on_hand`; bom is `parent,component,qty_per,scrap_pct,effective_from,effective_to`.
const ON_HAND = IMPORT_LAYOUTS['on-hand'];
const BOM = IMPORT_LAYOUTS.bom;

function previewOf(text: string, fileName = 'counts.csv'): CsvPreview {
  return { fileName, size: text.length, ...readCsvPreview(text) };
}

async function mountPreview(
  preview: CsvPreview,
  layout: typeof ON_HAND | typeof BOM,
  problems = [] as { row: number; column: string; message: string }[],
) {
  const context = await createAppContext({ user: demoUsers.buyer, path: '/' });
  return mountInApp(ImportsPreview, context, {
    props: { preview, layout, layoutName: 'On-hand counts', problems },
  });
}

describe('readCsvPreview', () => {
  it('numbers rows by file line, skipping blank lines and counting line breaks inside quoted cells', () => {
    // RFC 4180 (Common Format and MIME Type for CSV Files), section 2, rule 6: a field in double
    // quotes may contain line breaks, so the record after it starts further down the file.
    const text = 'part_number,description\r\nA-1,"two\r\nlines"\r\n\r\nB-2,plain\r\n';

    const preview = readCsvPreview(text);

    expect(preview.header).toEqual(['part_number', 'description']);
    expect(preview.rows).toEqual([
      { line: 2, cells: ['A-1', 'two\nlines'] },
      { line: 5, cells: ['B-2', 'plain'] },
    ]);
    expect(preview.rowCount).toBe(2);
  });

  it('drops a UTF-8 byte-order mark so the first header name is read as written', () => {
    // The Unicode Standard, chapter 23.8 (U+FEFF as a signature): spreadsheet programs write it
    // at the start of "CSV UTF-8" files; it is not part of the first column's name.
    const preview = readCsvPreview('\uFEFFpart_number,on_hand\nA-1,4\n');

    expect(preview.header).toEqual(['part_number', 'on_hand']);
  });

  it('keeps only the first rows for display but counts them all', () => {
    const lines = ['part_number,on_hand', ...Array.from({ length: 25 }, (_, index) => `P-${index},${index}`)];

    const preview = readCsvPreview(lines.join('\n'), 10);

    expect(preview.rows).toHaveLength(10);
    expect(preview.rows[9]).toEqual({ line: 11, cells: ['P-9', '9'] });
    expect(preview.rowCount).toBe(25);
  });
});

describe('checkCsvHeader', () => {
  it('reports an unknown name, a repeated name and each required column left out', () => {
    const problems = checkCsvHeader(['parent', 'qty', 'parent'], BOM);

    expect(problems).toEqual([
      { column: 'qty', kind: 'unknown' },
      { column: 'parent', kind: 'duplicate' },
      { column: 'component', kind: 'missing' },
      { column: 'qty_per', kind: 'missing' },
    ]);
  });
});

describe('checkCsvFile', () => {
  it('refuses a file over the 5 MB import limit before sending it', () => {
    const message = checkCsvFile({ name: 'big.csv', size: IMPORT_MAX_BYTES + 1 });

    expect(message).toContain('at most 5 MB');
  });

  it('accepts a file of exactly the limit and refuses one that is not .csv', () => {
    expect(checkCsvFile({ name: 'counts.CSV', size: IMPORT_MAX_BYTES })).toBeNull();
    expect(checkCsvFile({ name: 'counts.xlsx', size: 10 })).toContain('not a .csv file');
  });
});

describe('ImportsPreview', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
  });

  it('flags an unknown header name and the missing required column of the on-hand layout', async () => {
    const preview = previewOf('part_number,qty\nBAT-12-105,16\n');

    const wrapper = await mountPreview(preview, ON_HAND);

    const alert = wrapper.get('[role="alert"]');
    expect(alert.text()).toContain('does not match the On-hand counts layout');
    expect(alert.text()).toContain('“qty” is not a column of this layout.');
    expect(alert.text()).toContain('“on_hand” is required and not in the header.');
    const headers = wrapper.findAll('.imports-preview__header.is-flagged').map((cell) => cell.text());
    expect(headers).toEqual([expect.stringContaining('qty')]);
  });

  it('names the column meant when a spreadsheet title differs only in case and spacing', async () => {
    const preview = previewOf('Part Number,on_hand\nBAT-12-105,16\n');

    const wrapper = await mountPreview(preview, ON_HAND);

    expect(wrapper.text()).toContain('“Part Number” is not a column name; write it as “part_number”.');
  });

  it('shows no warning when the header matches, with the row count and the rows by file line', async () => {
    const preview = previewOf('part_number,on_hand\nBAT-12-105,16\n\nFK-FIN,75\n');

    const wrapper = await mountPreview(preview, ON_HAND);

    expect(wrapper.find('[role="alert"]').exists()).toBe(false);
    expect(wrapper.text()).toContain('counts.csv: all 2 rows');
    const rows = wrapper.findAll('.el-table__body tr').map((row) => row.findAll('td').map((cell) => cell.text()));
    expect(rows).toEqual([
      ['2', 'BAT-12-105', '16'],
      ['4', 'FK-FIN', '75'],
    ]);
  });

  it('highlights the row and the cell the server reported', async () => {
    const preview = previewOf('part_number,on_hand\nBAT-12-105,16\nNO-SUCH,3\n');

    const wrapper = await mountPreview(preview, ON_HAND, [
      { row: 3, column: 'part_number', message: "unknown part 'NO-SUCH'" },
    ]);

    const rows = wrapper.findAll('.el-table__body tr');
    expect(rows.map((row) => row.classes().includes('has-problem'))).toEqual([false, true]);
    const flagged = rows[1]!.findAll('td.is-problem-cell').map((cell) => cell.text());
    expect(flagged).toEqual(['NO-SUCH']);
  });
});
