import { markRaw, type Component } from 'vue';
import {
  Bottom,
  Calendar,
  CircleCloseFilled,
  Delete,
  Edit,
  Finished,
  RefreshLeft,
  Top,
  Van,
} from '@element-plus/icons-vue';
import { formatQuantity } from '@/format';
import type { StockItem, StockMovement, StockMovementKind } from '@shared/schemas/stock';

/** Every kind of stock movement in plain words. */
export const MOVEMENT_KIND_WORDS: Record<StockMovementKind, { word: string; icon: Component }> = {
  opening: { word: 'Opening stock', icon: markRaw(Top) },
  receipt: { word: 'Received', icon: markRaw(Van) },
  backflush: { word: 'Used in a build', icon: markRaw(Finished) },
  'build-reversal': { word: 'Build undone', icon: markRaw(RefreshLeft) },
  scrap: { word: 'Scrapped', icon: markRaw(Delete) },
  count: { word: 'Count adjustment', icon: markRaw(Edit) },
  return: { word: 'Returned to supplier', icon: markRaw(Bottom) },
};

/** A reason to count a part, in words with an icon, for the stock list and the part page. */
export interface StockFlag {
  key: 'negative' | 'count-due';
  word: string;
  hint: string;
  icon: Component;
  tone: 'danger' | 'warning';
}

const NEGATIVE: StockFlag = {
  key: 'negative',
  word: 'Count it',
  hint: 'On hand is below zero: builds used more than was booked in. Count the part to set it right.',
  icon: markRaw(CircleCloseFilled),
  tone: 'danger',
};

const COUNT_DUE: StockFlag = {
  key: 'count-due',
  word: 'Count due',
  hint: 'Not counted within the plant’s count interval.',
  icon: markRaw(Calendar),
  tone: 'warning',
};

/** The flags a part carries, most urgent first. */
export function stockFlags(item: Pick<StockItem, 'negative' | 'countDue'>): StockFlag[] {
  return [...(item.negative ? [NEGATIVE] : []), ...(item.countDue ? [COUNT_DUE] : [])];
}

/** What a movement belongs to, in words: the unit, the release, the count or the receipt. */
export function movementReference(movement: Pick<StockMovement, 'refType' | 'ref'>): string {
  if (!movement.ref) return '';
  if (movement.refType === 'serial') return `Unit ${movement.ref}`;
  if (movement.refType === 'release') return `Release ${movement.ref}`;
  if (movement.refType === 'count') return `Counted ${movement.ref}`;
  if (movement.refType === 'receipt') return `Receipt ${movement.ref}`;
  return movement.ref;
}

/** A movement's quantity with its sign and unit: `+24 pcs`, `−3 pcs` (a true minus sign), `0 pcs`. */
export function signedQuantity(qty: number, uom: string): string {
  const text = formatQuantity(Math.abs(qty), uom);
  if (qty > 0) return `+${text}`;
  if (qty < 0) return `−${text}`;
  return text;
}

/** The ledger's default window: the last 30 days up to today. */
export const LEDGER_DEFAULT_DAYS = 30;
