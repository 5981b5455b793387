import { z } from 'zod';

const nonNegative = z.number().nonnegative();

/** A supplier delivery cycle written days–deliveries–delay. */
export const deliveryCycleSchema = z
  .object({
    days: nonNegative,
    deliveries: z.number().int().min(1),
    delay: nonNegative,
  })
  .meta({
    description:
      'Delivery cycle days–deliveries–delay: `deliveries` deliveries every `days` days, each bringing the cards ' +
      'collected `delay` deliveries earlier; T = days × (1 + delay) / deliveries.',
  });

/** Body of POST /api/kanban/size. */
export const kanbanSizeRequestSchema = z
  .object({
    dailyDemand: nonNegative.meta({
      description: 'Average demand per day (or per hour, with times in hours).',
    }),
    containerQty: z.number().positive(),
    leadTimeDays: nonNegative.optional(),
    cycle: deliveryCycleSchema.optional(),
    safetyFactor: nonNegative.optional().meta({
      description: 'Safety allowance as a fraction of demand over T (0.1 = 10 %).',
    }),
    safetyDays: nonNegative.optional().meta({ description: 'Safety allowance in days of demand.' }),
    safetyStock: nonNegative.optional().meta({ description: 'Safety allowance in units.' }),
  })
  .superRefine((body, ctx) => {
    const hasLeadTime = body.leadTimeDays !== undefined;
    const hasCycle = body.cycle !== undefined;
    if (hasLeadTime && hasCycle) {
      ctx.addIssue({
        code: 'custom',
        message: 'Give either leadTimeDays or cycle, not both',
        path: ['cycle'],
      });
    } else if (!hasLeadTime && !hasCycle) {
      ctx.addIssue({
        code: 'custom',
        message: 'Give leadTimeDays or a delivery cycle {days, deliveries, delay}',
        path: ['leadTimeDays'],
      });
    }
  });

/** Response of POST /api/kanban/size. */
export const kanbanSizeResponseSchema = z.object({
  exact: z.number(),
  cards: z.number().int().nonnegative(),
  replenishmentTime: z.number().nonnegative(),
  formula: z.string().meta({ description: 'The sizing formula with the numbers filled in.' }),
});

export type KanbanSizeRequest = z.infer<typeof kanbanSizeRequestSchema>;
export type KanbanSizeResponse = z.infer<typeof kanbanSizeResponseSchema>;
