import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import dayjs from 'dayjs';
import {
  DOCK_COLUMNS,
  RECEIVABLE_STATUSES,
  type DockAttachment,
  type DockColumn,
  type DockItem,
  type DockLine,
} from '@shared/schemas/dock';
import type { Discrepancy } from '@shared/schemas/receipts';
import { UNIT_WORDS } from '@shared/schemas/master-data';
import * as dockApi from '@/api/dock';
import { ApiError } from '@/api/http';

/** Our words for the board's columns, with what each means on the floor. */
export const COLUMN_WORDS: Record<DockColumn, { title: string; hint: string }> = {
  expected: { title: 'Expected', hint: 'On its way to us' },
  at_dock: { title: 'At dock', hint: 'Unloaded, not counted' },
  counted: { title: 'Counted', hint: 'Checked in, in stock' },
  to_line: { title: 'To line', hint: 'At the point of use' },
};

export const DISCREPANCY_WORDS: Record<Discrepancy, string> = {
  short: 'Short',
  over: 'Over',
  damaged: 'Damaged',
  wrong_part: 'Wrong part',
};

/** What a line is ordered for: the supplier's confirmed quantity once given, else the request. */
export function orderedQty(line: DockLine): number {
  return line.confirmedQty ?? line.qty;
}

/** What is still to come on a line (never negative). */
export function remainingQty(line: DockLine): number {
  return Math.max(0, orderedQty(line) - line.receivedQty);
}

/** The discrepancy a count suggests against what is still to come; null when it matches. */
export function suggestDiscrepancy(counted: number, remaining: number): Discrepancy | null {
  if (counted < remaining) return 'short';
  if (counted > remaining) return 'over';
  return null;
}

/**
 * A counted quantity as typed on a tablet: digits with a decimal point or comma; null when the
 * box is empty or holds anything else.
 */
export function parseCount(typed: string): number | null {
  const text = typed.trim().replace(',', '.');
  if (!/^\d+(\.\d+)?$/.test(text)) return null;
  return Number(text);
}

/**
 * A fresh Idempotency-Key. `crypto.randomUUID` exists only on secure pages (https or localhost);
 * a plant tablet on plain http still has `getRandomValues`, so build the version-4 UUID from
 * that (RFC 9562, section 5.4: version bits 0100, variant bits 10).
 */
export function newIdempotencyKey(): string {
  if (typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  bytes[6] = (bytes[6]! & 0x0f) | 0x40;
  bytes[8] = (bytes[8]! & 0x3f) | 0x80;
  const hex = [...bytes].map((byte) => byte.toString(16).padStart(2, '0')).join('');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

/** Short word for a UN/ECE Recommendation 20 unit code (pcs, kg …). */
export function unitWord(uom: string): string {
  return UNIT_WORDS[uom] ?? uom;
}

/** A plant date as the dock reads it: "Wed 2 Dec". */
export function dockDate(date: string): string {
  return dayjs(date).format('ddd D MMM');
}

/** Whether a release still takes receipts: open lines on a sent, confirmed, exception, shipped or partial release. */
export function isReceivable(item: DockItem): boolean {
  return RECEIVABLE_STATUSES.includes(item.status) && item.lines.some((line) => line.open);
}

/** What a scan found: a release, and the line when a kanban card was scanned. */
export interface ScanMatch {
  item: DockItem;
  line: DockLine | null;
}

export const useDockStore = defineStore('dock', () => {
  const items = ref<DockItem[]>([]);
  const loading = ref(false);
  const loaded = ref(false);
  const error = ref<ApiError | null>(null);
  // Only the newest load may fill the board: a live refresh must not be overwritten by an older answer.
  let newestLoad = 0;

  const columns = computed(() =>
    DOCK_COLUMNS.map((column) => ({
      column,
      items: items.value
        .filter((item) => item.column === column)
        .sort((a, b) => a.needDate.localeCompare(b.needDate) || a.number.localeCompare(b.number)),
    })),
  );
  const expectedTodayCount = computed(
    () => items.value.filter((item) => item.expectedToday && isReceivable(item)).length,
  );

  /** Loads the board; a failure is kept in `error` and the previous board stays. */
  async function fetch(): Promise<void> {
    const order = (newestLoad += 1);
    loading.value = true;
    error.value = null;
    try {
      const board = await dockApi.listDock();
      if (order !== newestLoad) return;
      items.value = board;
      loaded.value = true;
    } catch (cause) {
      if (order !== newestLoad) return;
      error.value = cause instanceof ApiError ? cause : new ApiError(0, 'client_error', String(cause));
    } finally {
      if (order === newestLoad) loading.value = false;
    }
  }

  function replace(updated: DockItem): void {
    items.value = items.value.map((item) => (item.id === updated.id ? updated : item));
  }

  /**
   * Moves a card at once and tells the server; on refusal the card goes back where it was and
   * the ApiError is rethrown for the view to explain.
   */
  async function move(id: number, column: DockColumn): Promise<void> {
    const current = items.value.find((item) => item.id === id);
    if (!current || current.column === column) return;
    const from = current.column;
    replace({ ...current, column });
    try {
      replace(await dockApi.moveDockItem(id, column));
    } catch (cause) {
      const now = items.value.find((item) => item.id === id);
      if (now && now.column === column) replace({ ...now, column: from });
      throw cause;
    }
  }

  /** Adds an uploaded packing slip to its card without waiting for the next load. */
  function addAttachment(id: number, attachment: DockAttachment): void {
    const current = items.value.find((item) => item.id === id);
    if (current && !current.attachments.some((known) => known.id === attachment.id)) {
      replace({ ...current, attachments: [...current.attachments, attachment] });
    }
  }

  /**
   * A scanned release number opens that release; a scanned kanban card number opens the release
   * whose open line carries the card. Release numbers compare without regard to case.
   */
  function findByScan(scanned: string): ScanMatch | null {
    const code = scanned.trim();
    if (!code) return null;
    const release = items.value.find((item) => item.number.toLowerCase() === code.toLowerCase());
    if (release) return { item: release, line: null };
    for (const item of items.value) {
      const line = item.lines.find((candidate) => candidate.open && candidate.cardNumber === code);
      if (line) return { item, line };
    }
    return null;
  }

  function byId(id: number): DockItem | undefined {
    return items.value.find((item) => item.id === id);
  }

  return { items, loading, loaded, error, columns, expectedTodayCount, fetch, move, addAttachment, findByScan, byId };
});
