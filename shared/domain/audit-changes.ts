/*
 * An audit event's `changes` as one line a person reads: "field: from → to" for each changed
 * field when the event holds before and after, the recorded facts otherwise. Fields are recorded
 * under their code names (`leadTimeDays`) and read as words ("lead time days").
 */

const MAX_VALUE_LENGTH = 120;

/** `leadTimeDays` → `lead time days`, `unit_weight_kg` → `unit weight kg`; acronyms stay whole (`SKU`). */
function fieldWords(field: string): string {
  return field
    .replace(/_/g, ' ')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/([A-Z]+)([A-Z][a-z])/g, '$1 $2')
    .split(' ')
    .map((word) => (/^[A-Z][a-z]/.test(word) ? word.toLowerCase() : word))
    .join(' ');
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** A list is named item by item, the first few of a long one with its count. */
const MAX_LIST_ITEMS = 8;

function shown(value: unknown): string {
  if (value === undefined || value === null || value === '') return '—';
  const text = typeof value === 'string' ? value : inWords(value);
  return text.length > MAX_VALUE_LENGTH ? `${text.slice(0, MAX_VALUE_LENGTH - 1)}…` : text;
}

/** A recorded value as a person reads it: `A, B, C … (12 in all)`, `field value, field value`. */
function inWords(value: unknown): string {
  if (Array.isArray(value)) {
    const items = value.slice(0, MAX_LIST_ITEMS).map(shown).join(', ');
    return value.length > MAX_LIST_ITEMS ? `${items} … (${value.length} in all)` : items || '—';
  }
  if (isRecord(value)) {
    return Object.entries(value)
      .map(([field, item]) => `${fieldWords(field)} ${shown(item)}`)
      .join(', ');
  }
  return String(value);
}

/** One line describing what an audit event changed, from → to where both are recorded. */
export function describeAuditChanges(changes: Record<string, unknown> | null): string {
  if (!changes) return '';
  const { before, after, ...rest } = changes;
  const parts: string[] = [];
  if (isRecord(after) || isRecord(before)) {
    const from = isRecord(before) ? before : {};
    const to = isRecord(after) ? after : {};
    const fields = [...new Set([...Object.keys(from), ...Object.keys(to)])];
    for (const field of fields) parts.push(`${fieldWords(field)}: ${shown(from[field])} → ${shown(to[field])}`);
  } else if (before !== undefined || after !== undefined) {
    parts.push(`${shown(before)} → ${shown(after)}`);
  }
  for (const [field, value] of Object.entries(rest)) parts.push(`${fieldWords(field)}: ${shown(value)}`);
  return parts.join('; ');
}
