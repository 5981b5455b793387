import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Supplier } from '@shared/schemas/master-data';
import * as masterDataApi from '@/api/master-data';
import { useLatestRequest } from './latest-request';

/** Suppliers with all their terms: the list, one supplier, and changes from the form. */
export const useSuppliersStore = defineStore('suppliers', () => {
  const suppliers = ref<Supplier[]>([]);
  const loaded = ref(false);
  const detail = ref<Supplier | null>(null);
  const list = useLatestRequest();
  const one = useLatestRequest();

  function loadList(): Promise<void> {
    return list.run(masterDataApi.listSupplierRecords, (answer) => {
      suppliers.value = answer;
      loaded.value = true;
    });
  }

  function loadSupplier(code: string): Promise<void> {
    return one.run(
      (signal) => masterDataApi.fetchSupplier(code, signal),
      (answer) => {
        detail.value = answer;
      },
    );
  }

  /** Saves the form; a refusal (ApiError with the fields named) is thrown to the view. */
  async function save(code: string, fields: Record<string, unknown>): Promise<Supplier> {
    const saved = await masterDataApi.saveSupplier(code, fields);
    if (detail.value?.code === code) detail.value = saved;
    const index = suppliers.value.findIndex((supplier) => supplier.code === code);
    if (index >= 0) suppliers.value.splice(index, 1, saved);
    else if (loaded.value) suppliers.value.push(saved);
    return saved;
  }

  return {
    suppliers,
    loaded,
    detail,
    loading: list.loading,
    error: list.error,
    detailLoading: one.loading,
    detailError: one.error,
    loadList,
    loadSupplier,
    save,
  };
});
