import { defineStore } from 'pinia';
import { ref } from 'vue';
import * as suppliersApi from '@/api/suppliers';
import type { SupplierSummary } from '@/api/suppliers';
import { useLatestRequest } from './latest-request';

export const useSuppliersStore = defineStore('suppliers', () => {
  const suppliers = ref<SupplierSummary[]>([]);
  const { loading, error, run } = useLatestRequest();

  /** Loads the supplier list; a failure is kept in `error` and leaves the previous list. */
  function fetchAll(): Promise<void> {
    return run(suppliersApi.listSuppliers, (answer) => {
      suppliers.value = answer;
    });
  }

  return { suppliers, loading, error, fetchAll };
});
