const COUNT_FORMAT = new Intl.NumberFormat('en-GB');
const FIGURE_FORMAT = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 2 });

/** A whole count with grouped thousands: `1,250`. */
export function formatCount(count: number): string {
  return COUNT_FORMAT.format(count);
}

/** A count with its noun: `1 row`, `1,250 rows`. */
export function countOf(count: number, one: string, many: string): string {
  return `${formatCount(count)} ${count === 1 ? one : many}`;
}

/** A computed figure such as an average or a number of days: at most two decimals, no trailing zeros. */
export function formatFigure(value: number): string {
  return FIGURE_FORMAT.format(value);
}

/** `12.5 h`; an em dash when there is nothing to show. */
export function formatHours(hours: number | null): string {
  return hours === null ? '—' : `${(Math.round(hours * 10) / 10).toFixed(1)} h`;
}

const KIB = 1024;
const MIB = 1024 * 1024;
const SIZE_FORMAT = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1 });

/** A file size: `820 B`, `14.2 KB`, `5 MB` (binary multiples, as file managers count). */
export function formatFileSize(bytes: number): string {
  if (bytes < KIB) return `${bytes} B`;
  if (bytes < MIB) return `${SIZE_FORMAT.format(bytes / KIB)} KB`;
  return `${SIZE_FORMAT.format(bytes / MIB)} MB`;
}
