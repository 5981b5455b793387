import { isDeepStrictEqual } from 'node:util';

/**
 * Which rows of `after` differ from those of `before` at the same place, when both are lists of the
 * same length; null when they cannot be compared row by row (other lengths, or not lists). Rows
 * read from the database are flat, so most are compared field by field without recursion.
 */
export function changedRows(before: unknown, after: unknown): number[] | null {
  if (!Array.isArray(before) || !Array.isArray(after) || before.length !== after.length) return null;
  const changed: number[] = [];
  for (let index = 0; index < after.length; index += 1) {
    if (!sameRow(before[index], after[index])) changed.push(index);
  }
  return changed;
}

/** Equal content, for the input pieces of the line risk (lists of rows, maps, plain objects). */
export function samePiece(before: unknown, after: unknown): boolean {
  if (before === after) return true;
  const changed = changedRows(before, after);
  return changed ? changed.length === 0 : isDeepStrictEqual(before, after);
}

/**
 * `after`, with every row equal to `before`'s at the same place replaced by `before`'s own row (or
 * `before` itself when nothing differs): later comparisons then find the rows that stood at once.
 */
export function keepEqualRows<T>(before: T, after: T): T {
  const changed = changedRows(before, after);
  if (!changed) return samePiece(before, after) ? before : after;
  if (changed.length === 0) return before;
  const rows = (before as unknown[]).slice();
  for (const index of changed) rows[index] = (after as unknown[])[index];
  return rows as T;
}

function sameRow(before: unknown, after: unknown): boolean {
  if (before === after) return true;
  if (typeof before !== 'object' || typeof after !== 'object' || before === null || after === null) return false;
  const a = before as Record<string, unknown>;
  const b = after as Record<string, unknown>;
  const keys = Object.keys(b);
  if (Object.keys(a).length !== keys.length) return false;
  for (const key of keys) {
    const value = b[key];
    if (a[key] === value) continue;
    if (typeof value !== 'object' || value === null || !isDeepStrictEqual(a[key], value)) return false;
  }
  return true;
}
