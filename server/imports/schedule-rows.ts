import { isoWeekday, WorkingCalendar } from '../../shared/domain/calendar';
import { fromDayNumber, toDayNumber } from '../../shared/domain/date';
import type { IsoDate, PlantCalendar } from '../../shared/domain/types';
import { IMPORT_DEFAULTS, scheduleRowSchema } from '../../shared/schemas/imports';
import { unitChangeProblem } from '../../shared/domain/sequence';
import type { UnitStatus } from '../../shared/schemas/builds';
import { sequenceEntrySchema, type Part, type SequenceEntry } from '../../shared/schemas/master-data';
import type { CsvTable } from './csv';
import { isComplete, KeyRegister, parseRows, RowProblems } from './import-rows';

const DEFAULTS = IMPORT_DEFAULTS.schedule;
const WEEKDAY_NAMES = ['', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'];
/** How far back and ahead a build date may lie; wider is almost always a typo in the year. */
export const SCHEDULE_YEARS_BACK = 1;
export const SCHEDULE_YEARS_AHEAD = 2;

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

/** The same month and day `years` years away (29 February becomes 1 March in a common year). */
function shiftYears(date: IsoDate, years: number): IsoDate {
  const [year, month, day] = date.split('-').map(Number);
  return fromDayNumber(Date.UTC(year + years, month - 1, day) / 86_400_000);
}

function dateProblem(
  date: IsoDate,
  context: ScheduleContext,
  working: WorkingCalendar,
  holidays: ReadonlySet<string>,
): string | null {
  if (date < shiftYears(context.today, -SCHEDULE_YEARS_BACK))
    return `${date} is more than ${SCHEDULE_YEARS_BACK} year in the past`;
  if (date > shiftYears(context.today, SCHEDULE_YEARS_AHEAD))
    return `${date} is more than ${SCHEDULE_YEARS_AHEAD} years ahead`;
  if (working.isWorking(toDayNumber(date))) return null;
  return holidays.has(date)
    ? `${date} is a plant holiday`
    : `${date} is a ${WEEKDAY_NAMES[isoWeekday(date)]}, not a working day of the plant calendar`;
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
    const dateIssue = date === undefined ? null : dateProblem(date, context, working, holidays);
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
