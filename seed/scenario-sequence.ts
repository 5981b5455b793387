import type { IsoDate } from '../shared/domain/types';
import type { DemoSequenceSlot } from './scenario-types';

/** Units of one model to build in a day. */
export interface ModelQuota {
  model: string;
  qty: number;
}

/**
 * Level sequence of one day by goal chasing: each position goes to the model furthest behind
 * its even share (k · dᵢ / D − units already placed), ties to the larger daily quantity and then
 * to the earlier model. Compared in integers (k · dᵢ − xᵢ · D) so no rounding decides a tie.
 */
export function levelSequence(quotas: ModelQuota[]): string[] {
  const total = quotas.reduce((sum, quota) => sum + quota.qty, 0);
  const placed = quotas.map(() => 0);
  const order: string[] = [];
  for (let position = 1; position <= total; position += 1) {
    let best = -1;
    let bestLag = 0;
    quotas.forEach((quota, index) => {
      if (placed[index] >= quota.qty) return;
      const lag = position * quota.qty - placed[index] * total;
      if (best < 0 || lag > bestLag || (lag === bestLag && quota.qty > quotas[best].qty)) {
        best = index;
        bestLag = lag;
      }
    });
    placed[best] += 1;
    order.push(quotas[best].model);
  }
  return order;
}

/** Serial number `SN` + yymmdd + two-digit position, unique per day and slot. */
export function serialFor(date: IsoDate, position: number): string {
  return `SN${date.slice(2, 4)}${date.slice(5, 7)}${date.slice(8, 10)}${String(position).padStart(2, '0')}`;
}

/** Build sequence of every day: `quotasForDay(index)` gives that working day's model mix. */
export function buildSequence(days: IsoDate[], quotasForDay: (dayIndex: number) => ModelQuota[]): DemoSequenceSlot[] {
  return days.flatMap((date, dayIndex) =>
    levelSequence(quotasForDay(dayIndex)).map((model, index): DemoSequenceSlot => ({
      date,
      sequence: index + 1,
      model,
      serial: serialFor(date, index + 1),
      qty: 1,
    })),
  );
}
