import { z } from 'zod';

/** Body of every error response: `{ error: { code, message, details? } }`. */
export const errorBodySchema = z
  .object({
    error: z.object({
      code: z.string(),
      message: z.string(),
      details: z.array(z.unknown()).optional(),
    }),
  })
  .meta({ id: 'ErrorBody' });
