import type { Role } from '../../shared/schemas/user';

/** Everyone signed in except suppliers, who reach only their own releases and forecast. */
export const READ_ROLES: readonly Role[] = ['admin', 'planner', 'buyer', 'receiving', 'line', 'viewer'];
export const MASTER_DATA_ROLES: readonly Role[] = ['admin', 'buyer'];
export const SEQUENCE_ROLES: readonly Role[] = ['admin', 'planner'];
export const RECEIVING_ROLES: readonly Role[] = ['admin', 'receiving'];
/**
 * Reporting units built at the end of the line: the line's own role (operators and line leads,
 * who should not book goods in at the dock), the planner who owns the sequence, and the admin.
 */
export const BUILD_ROLES: readonly Role[] = ['admin', 'planner', 'line'];
/** Closing a whole day at once, and reversing any build, is the planner's call. */
export const CLOSE_DAY_ROLES: readonly Role[] = ['admin', 'planner'];
/** Counting stock: inventory control (buyer) and the stores people at receiving. */
export const COUNT_ROLES: readonly Role[] = ['admin', 'buyer', 'receiving'];
/** Scrap is reported where it happens: at the line, the dock, or by whoever owns the part. */
export const SCRAP_ROLES: readonly Role[] = ['admin', 'planner', 'buyer', 'receiving', 'line'];
