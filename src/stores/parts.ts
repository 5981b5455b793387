import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Part } from '@shared/schemas/master-data';
import type { PartDetail, PartEdit, WhereUsed } from '@shared/schemas/master-data-edit';
import * as masterDataApi from '@/api/master-data';
import { useLatestRequest } from './latest-request';

/** The part master: the list, one part's detail with where-used, and changes from the form. */
export const usePartsStore = defineStore('parts', () => {
  const parts = ref<Part[]>([]);
  const loaded = ref(false);
  const detail = ref<PartDetail | null>(null);
  const whereUsed = ref<WhereUsed | null>(null);
  const list = useLatestRequest();
  const one = useLatestRequest();

  function loadList(): Promise<void> {
    return list.run(masterDataApi.listParts, (answer) => {
      parts.value = answer;
      loaded.value = true;
    });
  }

  function loadPart(partNumber: string): Promise<void> {
    return one.run(
      (signal) =>
        Promise.all([masterDataApi.fetchPart(partNumber, signal), masterDataApi.fetchWhereUsed(partNumber, signal)]),
      ([part, used]) => {
        detail.value = part;
        whereUsed.value = used;
      },
    );
  }

  /** Saves the form; a refusal (ApiError with the fields named) is thrown to the view. */
  async function save(partNumber: string, fields: Partial<PartEdit>): Promise<PartDetail> {
    const saved = await masterDataApi.savePart(partNumber, fields);
    if (detail.value?.part.partNumber === partNumber) detail.value = saved;
    const index = parts.value.findIndex((part) => part.partNumber === partNumber);
    if (index >= 0) parts.value.splice(index, 1, saved.part);
    else if (loaded.value) parts.value.push(saved.part);
    return saved;
  }

  async function remove(partNumber: string): Promise<void> {
    await masterDataApi.deletePart(partNumber);
    parts.value = parts.value.filter((part) => part.partNumber !== partNumber);
    if (detail.value?.part.partNumber === partNumber) detail.value = null;
  }

  return {
    parts,
    loaded,
    detail,
    whereUsed,
    loading: list.loading,
    error: list.error,
    detailLoading: one.loading,
    detailError: one.error,
    loadList,
    loadPart,
    save,
    remove,
  };
});
