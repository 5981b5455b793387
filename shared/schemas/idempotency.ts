import { z } from 'zod';

/** The header that makes a request count once, whatever the retries (receipts, builds). */
export const IDEMPOTENCY_HEADER = 'Idempotency-Key';
export const idempotencyKeySchema = z.string().trim().min(1, 'is required').max(100, 'is longer than 100 characters');
