import { WorkingCalendar } from '../../shared/domain/calendar';
import type { IsoDate, PlantCalendar } from '../../shared/domain/types';
import { IMPORT_DEFAULTS, scheduleRowSchema } from '../../shared/schemas/imports';
import { unitChangeProblem } from '../../shared/domain/sequence';
import type { UnitStatus } from '../../shared/schemas/builds';
import { sequenceEntrySchema, type Part, type SequenceEntry } from '../../shared/schemas/master-data';
import { buildDateProblem } from '../sequence/sequence-window';
import type { CsvTable } from './csv';
import { isComplete, KeyRegister, parseRows, RowProblems } from './import-rows';

const DEFAULTS = IMPORT_DEFAULTS.schedule;

export interface ScheduleContext {
  /** Part number → source of every part on file; a model must be an end item. */
  parts: ReadonlyMap<string, Pick<Part, 'source'>>;
  /**
   * The sequence as it stands, to find positions a row would take from a unit not in the file and
   * units already at the line (started or built) that a row would change.
   */
  existing: readonly (SequenceEntry & { status: UnitStatus })[];
  calendar: PlantCalendar;
  today: IsoDate;
}

function modelProblem(model: string, parts: ScheduleContext['parts']): string | null {
  const part = parts.get(model);
  if (!part) return `unknown model '${model}'`;
  return part.source === 'end_item' ? null : `'${model}' is a ${part.source} part, not an end item`;
}

/**
 * Checks a schedule file: dates are working days within the planning range, models are existing
 * end items, serials appear once, and no date and position is used twice once the upload is in
 * (units named by serial move; every other unit keeps its slot).
 */
export function checkScheduleRows(
  table: CsvTable,
  context: ScheduleContext,
): { entries: SequenceEntry[]; problems: RowProblems } {
  const problems = new RowProblems(table.problems);
  const working = new WorkingCalendar(context.calendar);
  const holidays = new Set(context.calendar.holidays);
  const serials = new KeyRegister(problems, 'serial', (serial) => `serial '${serial}'`);
  const positions = new KeyRegister(problems, 'sequence', (key) => `position ${key}`);
  const parsed = parseRows(table.records, table.columns, scheduleRowSchema, problems);

  const movingSerials = new Set(parsed.map((row) => row.values.serial).filter((serial) => serial !== undefined));
  const staying = new Map<string, string>();
  const bySerial = new Map(context.existing.map((entry) => [entry.serial, entry]));
  for (const entry of context.existing) {
    if (!movingSerials.has(entry.serial)) staying.set(`${entry.sequence} on ${entry.date}`, entry.serial);
  }

  const entries: SequenceEntry[] = [];
  for (const row of parsed) {
    const { date, model, serial, sequence } = row.values;
    let sound = serial === undefined || serials.claim(serial, row.line);
    const dateIssue = date === undefined ? null : buildDateProblem(date, context.today, working, holidays);
    if (dateIssue) problems.add(row.line, 'date', dateIssue);
    const modelIssue = model === undefined ? null : modelProblem(model, context.parts);
    if (modelIssue) problems.add(row.line, 'model', modelIssue);
    sound = sound && !dateIssue && !modelIssue;
    if (date !== undefined && sequence !== undefined) {
      const position = `${sequence} on ${date}`;
      const holder = staying.get(position);
      if (holder !== undefined) {
        problems.add(row.line, 'sequence', `position ${position} is already taken by serial '${holder}'`);
        sound = false;
      } else if (!positions.claim(position, row.line)) {
        sound = false;
      }
    }
    if (!sound || !isComplete(row)) continue;
    const cells = row.values;
    const record: SequenceEntry = {
      date: cells.date,
      sequence: cells.sequence,
      model: cells.model,
      serial: cells.serial,
      qty: cells.qty ?? DEFAULTS.qty,
    };
    const current = bySerial.get(record.serial);
    const locked = current ? unitChangeProblem(current, record) : null;
    if (locked) {
      problems.add(row.line, 'serial', locked);
      continue;
    }
    const checked = sequenceEntrySchema.safeParse(record);
    if (checked.success) entries.push(checked.data);
    else problems.addDomainIssues(row.line, checked.error.issues, record);
  }
  return { entries, problems };
}
