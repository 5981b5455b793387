import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { BomTree, EngineeringChange } from '@shared/schemas/master-data-edit';
import * as masterDataApi from '@/api/master-data';
import type { BomLineInput } from '@/api/master-data';
import { useLatestRequest } from './latest-request';

/** One model's or subassembly's multi-level BOM, on a date or with every line, and its changes. */
export const useBomStore = defineStore('bom', () => {
  const tree = ref<BomTree | null>(null);
  const { loading, error, run } = useLatestRequest();

  function loadTree(parent: string, date: string | null): Promise<void> {
    return run(
      (signal) => masterDataApi.fetchBom(parent, date, signal),
      (answer) => {
        tree.value = answer;
      },
    );
  }

  /** Every single-level line of a parent, whatever its dates, as a form edits them. */
  async function linesOf(parent: string): Promise<BomLineInput[]> {
    const all = await masterDataApi.fetchBom(parent, null);
    return all.lines.map(({ component, qtyPer, scrapPct, effectiveFrom, effectiveTo }) => ({
      component,
      qtyPer,
      scrapPct,
      effectiveFrom,
      effectiveTo,
    }));
  }

  /** Replaces one parent's single-level lines; a refusal is thrown to the view. */
  function saveLines(parent: string, lines: BomLineInput[]): Promise<BomTree> {
    return masterDataApi.saveBomLines(parent, lines);
  }

  function change(parent: string, engineeringChange: EngineeringChange): Promise<BomTree> {
    return masterDataApi.makeEngineeringChange(parent, engineeringChange);
  }

  return { tree, loading, error, loadTree, linesOf, saveLines, change };
});
