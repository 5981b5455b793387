import { findBomCycle, findEffectivityOverlaps, type BomLink } from '../../shared/domain/bom';
import { bomRowSchema, IMPORT_DEFAULTS } from '../../shared/schemas/imports';
import { bomLineSchema, type BomLine } from '../../shared/schemas/master-data';
import type { CsvTable } from './csv';
import { isComplete, KeyRegister, parseRows, RowProblems } from './import-rows';

const DEFAULTS = IMPORT_DEFAULTS.bom;

interface FileLine {
  line: number;
  bomLine: BomLine;
}

interface TracedLink extends BomLink {
  /** File line of the link, absent for a line kept from the database. */
  line?: number;
}

/**
 * Reports every file line that closes a cycle in the BOM as it would stand after the upload:
 * after each cycle found, the file's links on it are set aside and the search runs again, so
 * independent cycles are all reported. A cycle made only of kept lines cannot be pinned on a row.
 */
function reportCycles(links: TracedLink[], problems: RowProblems): void {
  let remaining = links;
  for (;;) {
    const cycle = findBomCycle(remaining);
    if (!cycle) return;
    const steps = new Set(cycle.slice(1).map((component, index) => `${cycle[index]}\u0000${component}`));
    const closing = remaining.filter(
      (link) => link.line !== undefined && steps.has(`${link.parent}\u0000${link.component}`),
    );
    if (closing.length === 0) return;
    for (const link of closing)
      problems.add(link.line as number, 'component', `closes a BOM cycle: ${cycle.join(' → ')}`);
    remaining = remaining.filter((link) => !closing.includes(link));
  }
}

function reportOverlaps(lines: FileLine[], problems: RowProblems): void {
  const reported = new Set<number>();
  for (const overlap of findEffectivityOverlaps(lines.map((entry) => entry.bomLine))) {
    if (reported.has(overlap.secondIndex)) continue;
    reported.add(overlap.secondIndex);
    const first = lines[overlap.firstIndex];
    const second = lines[overlap.secondIndex];
    problems.add(
      second.line,
      'effective_from',
      `effective dates of ${overlap.parent} → ${overlap.component} overlap row ${first.line} (both ends count)`,
    );
  }
}

/**
 * Checks a BOM file: parents and components must be existing parts (a BOM file cannot create
 * them). The upload replaces every line of each parent it names, so cycles are looked for in the
 * file's lines plus the kept lines of all other parents.
 */
export function checkBomRows(
  table: CsvTable,
  partNumbers: ReadonlySet<string>,
  existingLines: readonly BomLink[],
): { lines: BomLine[]; problems: RowProblems } {
  const problems = new RowProblems(table.problems);
  const keys = new KeyRegister(problems, 'component', (key) => key);
  const fileLines: FileLine[] = [];
  const parsed = parseRows(table.records, table.columns, bomRowSchema, problems);

  for (const row of parsed) {
    const { parent, component } = row.values;
    let known = true;
    for (const [column, partNumber] of [
      ['parent', parent],
      ['component', component],
    ] as const) {
      if (partNumber !== undefined && !partNumbers.has(partNumber)) {
        problems.add(row.line, column, `unknown part '${partNumber}'`);
        known = false;
      }
    }
    if (!known || !isComplete(row)) continue;
    const cells = row.values;
    const record: BomLine = {
      parent: cells.parent,
      component: cells.component,
      qtyPer: cells.qty_per,
      scrapPct: cells.scrap_pct ?? DEFAULTS.scrap_pct,
      effectiveFrom: cells.effective_from ?? DEFAULTS.effective_from,
      effectiveTo: cells.effective_to ?? DEFAULTS.effective_to,
    };
    const checked = bomLineSchema.safeParse(record);
    if (!checked.success) {
      problems.addDomainIssues(row.line, checked.error.issues, record);
      continue;
    }
    // The stored key is parent, component and start of effectivity.
    const start = record.effectiveFrom ?? 'an open start';
    if (keys.claim(`${record.parent} → ${record.component} effective from ${start}`, row.line)) {
      fileLines.push({ line: row.line, bomLine: checked.data });
    }
  }

  reportOverlaps(fileLines, problems);
  const replacedParents = new Set(parsed.map((row) => row.values.parent).filter((parent) => parent !== undefined));
  const kept: TracedLink[] = existingLines.filter((link) => !replacedParents.has(link.parent));
  reportCycles(
    [
      ...kept,
      ...fileLines.map(({ line, bomLine }) => ({ parent: bomLine.parent, component: bomLine.component, line })),
    ],
    problems,
  );

  return { lines: fileLines.map((entry) => entry.bomLine), problems };
}
