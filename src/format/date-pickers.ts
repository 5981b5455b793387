import dayjs, { type PluginFunc } from 'dayjs';
import customParseFormat from 'dayjs/plugin/customParseFormat';
import updateLocale from 'dayjs/plugin/updateLocale';
import { DATE_PICKER_FORMAT, ISO_DATE_FORMAT } from './dates';

interface ParseConfig {
  date: unknown;
  args: unknown[];
}

// What a person may type into a date picker: the day as shown without its weekday, or ISO.
const TYPED_FORMATS = ['D MMM YYYY', 'D MMMM YYYY', ISO_DATE_FORMAT];

/** The ISO date a typed "Wed 2 Dec 2026", "2 Dec 2026" or "2026-12-02" means; '' when none or a wrong weekday. */
function readTypedDate(typed: string): string {
  const [, weekday, rest] = /^\s*(?:([A-Za-z]{3,})\.?,?\s+)?(.*?)\s*$/.exec(typed)!;
  const day = dayjs(rest, TYPED_FORMATS, true);
  if (!day.isValid()) return '';
  if (weekday && day.format('ddd').toLowerCase() !== weekday.slice(0, 3).toLowerCase()) return '';
  return day.format(ISO_DATE_FORMAT);
}

/*
 * Element Plus reads a typed date with its display format, and dayjs cannot read a weekday back
 * ("ddd" has no parser), so a date typed into a picker that shows "Wed 2 Dec 2026" was lost.
 * This plugin sits over customParseFormat and reads such input itself.
 */
const readPickerInput: PluginFunc = (_option, dayjsClass) => {
  const proto = dayjsClass.prototype as unknown as { parse(cfg: ParseConfig): void };
  const parse = proto.parse;
  proto.parse = function (this: unknown, cfg: ParseConfig) {
    if (cfg.args[1] === DATE_PICKER_FORMAT && typeof cfg.date === 'string') {
      const iso = readTypedDate(cfg.date);
      return parse.call(this, { ...cfg, date: iso, args: [iso, ISO_DATE_FORMAT, true] });
    }
    return parse.call(this, cfg);
  };
};

/**
 * Date pickers in the screen style: weeks start on Monday (plant weeks are ISO 8601 weeks), and
 * a date typed as shown, without its weekday or as ISO is understood. Call once at start-up.
 */
export function setUpDatePickers(): void {
  dayjs.extend(updateLocale);
  dayjs.updateLocale('en', { weekStart: 1 });
  // customParseFormat first, so that the picker's own later extend is a no-op under ours.
  dayjs.extend(customParseFormat);
  dayjs.extend(readPickerInput);
}
