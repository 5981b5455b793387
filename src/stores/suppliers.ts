import { defineStore } from 'pinia';
import { ref } from 'vue';
import * as suppliersApi from '@/api/suppliers';
import type { SupplierSummary } from '@/api/suppliers';
import { ApiError } from '@/api/http';

export const useSuppliersStore = defineStore('suppliers', () => {
  const suppliers = ref<SupplierSummary[]>([]);
  const loading = ref(false);
  const error = ref<ApiError | null>(null);

  /** Loads the supplier list; a failure is kept in `error` and leaves the previous list. */
  async function fetchAll(): Promise<void> {
    loading.value = true;
    error.value = null;
    try {
      suppliers.value = await suppliersApi.listSuppliers();
    } catch (cause) {
      if (!(cause instanceof ApiError)) throw cause;
      error.value = cause;
    } finally {
      loading.value = false;
    }
  }

  return { suppliers, loading, error, fetchAll };
});
