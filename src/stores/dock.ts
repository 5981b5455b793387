import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import {
  DOCK_COLUMNS,
  RECEIVABLE_STATUSES,
  type DockAttachment,
  type DockColumn,
  type DockItem,
  type DockLine,
} from '@shared/schemas/dock';
import * as dockApi from '@/api/dock';
import { useLatestRequest } from './latest-request';

/** Whether a card still takes receipts: open lines of a sent, confirmed, exception, shipped or partial release. */
export function isReceivable(item: DockItem): boolean {
  return RECEIVABLE_STATUSES.includes(item.status) && item.lines.some((line) => line.open);
}

/** What a scan found: a card, and the line when a kanban card was scanned. */
export interface ScanMatch {
  item: DockItem;
  line: DockLine | null;
}

export const useDockStore = defineStore('dock', () => {
  const items = ref<DockItem[]>([]);
  const loaded = ref(false);
  // Only the newest load may fill the board: a live refresh must not be overwritten by an older answer.
  const { loading, error, run } = useLatestRequest();

  const columns = computed(() =>
    DOCK_COLUMNS.map((column) => ({
      column,
      items: items.value
        .filter((item) => item.column === column)
        .sort((a, b) => a.arrivalDate.localeCompare(b.arrivalDate) || a.number.localeCompare(b.number)),
    })),
  );
  const expectedTodayCount = computed(
    () => items.value.filter((item) => item.expectedToday && isReceivable(item)).length,
  );

  /** Loads the board; a failure is kept in `error` and the previous board stays. */
  function loadBoard(): Promise<void> {
    return run(dockApi.listDock, (board) => {
      items.value = board;
      loaded.value = true;
    });
  }

  function replace(updated: DockItem): void {
    items.value = items.value.map((item) => (item.id === updated.id ? updated : item));
  }

  /**
   * Moves a card at once and tells the server; on refusal the card goes back where it was and
   * the ApiError is rethrown for the view to explain.
   */
  async function move(id: string, column: DockColumn): Promise<void> {
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

  /** Adds an uploaded packing slip to every card of its release without waiting for the next load. */
  function addAttachment(releaseId: number, attachment: DockAttachment): void {
    for (const current of items.value.filter((item) => item.releaseId === releaseId)) {
      if (!current.attachments.some((known) => known.id === attachment.id)) {
        replace({ ...current, attachments: [...current.attachments, attachment] });
      }
    }
  }

  /**
   * A scanned release number opens a card of that release; a scanned kanban card number opens the
   * card whose open line carries the kanban card. A release may have several cards: the one
   * already off the truck comes first, then shipments, then the earliest expected.
   * Release numbers compare without regard to case.
   */
  function findByScan(scanned: string): ScanMatch | null {
    const code = scanned.trim();
    if (!code) return null;
    const candidates = [...items.value].sort(
      (a, b) =>
        Number(a.column === 'expected') - Number(b.column === 'expected') ||
        Number(a.kind !== 'shipment') - Number(b.kind !== 'shipment') ||
        a.arrivalDate.localeCompare(b.arrivalDate),
    );
    const releaseCards = candidates.filter((item) => item.number.toLowerCase() === code.toLowerCase());
    const release = releaseCards.find(isReceivable) ?? releaseCards[0];
    if (release) return { item: release, line: null };
    for (const item of candidates) {
      const line = item.lines.find((candidate) => candidate.open && candidate.cardNumber === code);
      if (line) return { item, line };
    }
    return null;
  }

  function byId(id: string): DockItem | undefined {
    return items.value.find((item) => item.id === id);
  }

  return {
    items,
    loading,
    loaded,
    error,
    columns,
    expectedTodayCount,
    loadBoard,
    move,
    addAttachment,
    findByScan,
    byId,
    uploadPackingSlip: dockApi.uploadPackingSlip,
    openPackingSlip: dockApi.fetchPackingSlip,
  };
});
