import { defineStore } from 'pinia';
import { ref } from 'vue';
import * as masterDataApi from '@/api/master-data';
import type { SupplierSummary } from '@/api/master-data';
import { useLatestRequest } from './latest-request';

export const useMasterDataStore = defineStore('master-data', () => {
  const suppliers = ref<SupplierSummary[]>([]);
  const { loading, error, run } = useLatestRequest();

  /** Loads the supplier list; a failure is kept in `error` and leaves the previous list. */
  function fetchAll(): Promise<void> {
    return run(masterDataApi.listSuppliers, (answer) => {
      suppliers.value = answer;
    });
  }

  return { suppliers, loading, error, fetchAll };
});
