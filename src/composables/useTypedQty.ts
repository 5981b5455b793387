import { computed, ref, watch, type ComputedRef } from 'vue';
import type { z } from 'zod';
import { typedQtyProblem, type QtyFloor } from '@shared/domain/typed-quantity';
import { zodProblem } from '@/utils/zod-rule';

export interface TypedQtyCheck {
  /** What is wrong with the quantity now (empty, negative, half a piece, too large); null when it may be sent. */
  problem: ComputedRef<string | null>;
  /** The problem once the box was left or the form sent, for the form item's `error`. */
  message: ComputedRef<string | undefined>;
  /** Shows the problem: the box was left or the form is being sent. */
  show: () => void;
  /** Hides it again (the dialog closed). */
  reset: () => void;
}

/**
 * The check of a box where a person types a quantity of a part: the rule the server applies
 * (shared/domain/typed-quantity) and the request schema's limits. Nothing is clamped or rounded:
 * the box keeps what was typed and the message beside it says what to fix. It is placed through
 * the form item's `error`, not a form rule, so it is the one message shown for the box.
 */
export function useTypedQty(options: {
  qty: () => number | null | undefined;
  uom: () => string;
  floor?: QtyFloor;
  /** The request schema's field, for the limits the server holds (the largest quantity). */
  schema: z.ZodType;
  /** What to say while the box is empty. */
  required: string;
}): TypedQtyCheck {
  const shown = ref(false);
  const problem = computed(() => {
    const qty = options.qty();
    if (qty === null || qty === undefined) return options.required;
    return typedQtyProblem(qty, options.uom(), options.floor) ?? zodProblem(options.schema, qty);
  });
  // A message belongs to the value it judged; it shows again when the box is left. Synchronous,
  // because leaving the box fires its change and then its blur in one go.
  watch(
    options.qty,
    () => {
      shown.value = false;
    },
    { flush: 'sync' },
  );
  return {
    problem,
    message: computed(() => (shown.value ? (problem.value ?? undefined) : undefined)),
    show: () => {
      shown.value = true;
    },
    reset: () => {
      shown.value = false;
    },
  };
}
