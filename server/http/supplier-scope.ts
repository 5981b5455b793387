import { NotFoundError } from '../errors';
import type { AuthenticatedUser } from './request-user';

/**
 * Narrows a query to the signed-in supplier's own code. Asking for another supplier answers 404,
 * as if it did not exist, so a supplier account cannot learn which codes the plant buys from.
 */
export function scopeToSupplier<Query extends { supplier?: string }>(query: Query, user: AuthenticatedUser): Query {
  if (user.role !== 'supplier') return query;
  const own = user.supplierCode ?? '';
  if (query.supplier !== undefined && query.supplier !== own) throw new NotFoundError(`No supplier ${query.supplier}.`);
  return { ...query, supplier: own };
}
