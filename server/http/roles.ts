import type { Role } from '../../shared/schemas/user';

/** Everyone signed in except suppliers, who reach only their own releases and forecast. */
export const READ_ROLES: readonly Role[] = ['admin', 'planner', 'buyer', 'receiving', 'viewer'];
export const MASTER_DATA_ROLES: readonly Role[] = ['admin', 'buyer'];
export const SEQUENCE_ROLES: readonly Role[] = ['admin', 'planner'];
export const RECEIVING_ROLES: readonly Role[] = ['admin', 'receiving'];
