import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { StockChange, StockCountRequest, StockItem, StockLedger, StockScrapRequest } from '@shared/schemas/stock';
import * as stockApi from '@/api/stock';
import { useLatestRequest } from './latest-request';

/** A ledger's part and the days it covers, both inclusive. */
export interface LedgerQuery {
  partNumber: string;
  from: string;
  to: string;
}

/** Stock on hand of every part, one part's ledger, and the counts and scrap that change it. */
export const useStockStore = defineStore('stock', () => {
  const items = ref<StockItem[]>([]);
  const loaded = ref(false);
  const listRequest = useLatestRequest();
  const ledger = ref<StockLedger | null>(null);
  const ledgerQuery = ref<LedgerQuery | null>(null);
  const ledgerRequest = useLatestRequest();
  const saving = ref(false);

  const negativeCount = computed(() => items.value.filter((item) => item.negative).length);
  const countDueCount = computed(() => items.value.filter((item) => item.countDue).length);

  /** Loads every part's stock; `quiet` keeps the list on screen during a live refresh. */
  function loadList(options: { quiet?: boolean } = {}): Promise<void> {
    return listRequest.run(
      stockApi.listStock,
      (answer) => {
        items.value = answer;
        loaded.value = true;
      },
      options,
    );
  }

  /** Loads a part's movements between two days. */
  function loadLedger(query: LedgerQuery, options: { quiet?: boolean } = {}): Promise<void> {
    if (ledgerQuery.value?.partNumber !== query.partNumber) ledger.value = null;
    ledgerQuery.value = { ...query };
    return ledgerRequest.run(
      (signal) => stockApi.fetchLedger(query.partNumber, { from: query.from, to: query.to }, signal),
      (answer) => {
        ledger.value = answer;
      },
      options,
    );
  }

  function reloadLedger(): Promise<void> {
    return ledgerQuery.value ? loadLedger(ledgerQuery.value, { quiet: true }) : Promise.resolve();
  }

  async function change(send: () => Promise<StockChange>): Promise<StockChange> {
    saving.value = true;
    try {
      const result = await send();
      items.value = items.value.map((item) =>
        item.partNumber === result.partNumber ? { ...item, onHand: result.onHand, negative: result.onHand < 0 } : item,
      );
      // A count also clears "count due", which only the server's list knows how to judge.
      await Promise.all([reloadLedger(), loaded.value ? loadList({ quiet: true }) : undefined]);
      return result;
    } finally {
      saving.value = false;
    }
  }

  /** Records a count; rethrows the ApiError so the form can place field messages. */
  function recordCount(count: StockCountRequest): Promise<StockChange> {
    return change(() => stockApi.recordCount(count));
  }

  /** Records scrap; rethrows the ApiError so the form can place field messages. */
  function recordScrap(scrap: StockScrapRequest): Promise<StockChange> {
    return change(() => stockApi.recordScrap(scrap));
  }

  return {
    items,
    loaded,
    loading: listRequest.loading,
    error: listRequest.error,
    negativeCount,
    countDueCount,
    ledger,
    ledgerQuery,
    ledgerLoading: ledgerRequest.loading,
    ledgerError: ledgerRequest.error,
    saving,
    loadList,
    loadLedger,
    reloadLedger,
    recordCount,
    recordScrap,
  };
});
