import type { RouteRecordRaw } from 'vue-router';
import type { Role } from '@shared/schemas/user';

/** Reporting units built at the end of the line (the server's rule for builds). */
export const LINE_END_ROLES: readonly Role[] = ['admin', 'planner', 'line'];
/** Every screen that shows the plant's data is open to everyone signed in except suppliers (the server's rule). */
export const READ_ROLES: readonly Role[] = ['admin', 'planner', 'buyer', 'receiving', 'line', 'viewer'];
/** Releases and supplier performance: also a supplier, who sees its own. */
export const READ_ROLES_AND_SUPPLIER: readonly Role[] = [...READ_ROLES, 'supplier'];

export const routes: RouteRecordRaw[] = [
  {
    path: '/login',
    name: 'login',
    component: () => import('@/views/LoginView.vue'),
    meta: { title: 'Sign in', public: true },
  },
  {
    path: '/confirm/:token',
    name: 'confirm',
    component: () => import('@/views/ConfirmView.vue'),
    meta: { title: 'Confirm release', public: true, bare: true },
  },
  {
    path: '/ship/:token',
    name: 'ship-notice-link',
    component: () => import('@/views/ShipNoticeView.vue'),
    meta: { title: 'Ship notice', public: true, bare: true },
  },
  {
    path: '/reset-password/:token',
    name: 'reset-password',
    component: () => import('@/views/PasswordResetView.vue'),
    meta: { title: 'Set a new password', public: true, bare: true },
  },
  {
    path: '/',
    name: 'home',
    component: () => import('@/views/OverviewView.vue'),
    meta: { title: 'Overview' },
  },
  {
    path: '/line-risk',
    name: 'line-risk',
    component: () => import('@/views/LineRiskView.vue'),
    meta: { title: 'Line risk', roles: READ_ROLES },
  },
  {
    path: '/sequence',
    name: 'sequence',
    component: () => import('@/views/SequenceView.vue'),
    meta: { title: 'Build sequence', roles: READ_ROLES },
  },
  {
    path: '/line-end',
    name: 'line-end',
    component: () => import('@/views/BuildsView.vue'),
    meta: { title: 'Line end', roles: LINE_END_ROLES },
  },
  {
    path: '/line-end/kits',
    name: 'line-end-kits',
    component: () => import('@/views/BuildsKitsView.vue'),
    meta: { title: 'Kit sheets', roles: READ_ROLES },
  },
  {
    path: '/stock',
    name: 'stock',
    component: () => import('@/views/StockView.vue'),
    meta: { title: 'Stock', roles: READ_ROLES },
  },
  {
    path: '/stock/:partNumber',
    name: 'stock-part',
    component: () => import('@/views/StockPartView.vue'),
    meta: { title: 'Part stock', roles: READ_ROLES },
  },
  {
    path: '/horizon',
    name: 'horizon',
    component: () => import('@/views/HorizonView.vue'),
    meta: { title: 'Horizon', roles: READ_ROLES },
  },
  {
    path: '/loops',
    name: 'loops',
    component: () => import('@/views/LoopsView.vue'),
    meta: { title: 'Loops', roles: READ_ROLES },
  },
  {
    path: '/releases',
    name: 'releases',
    component: () => import('@/views/ReleasesView.vue'),
    meta: { title: 'Releases', roles: READ_ROLES_AND_SUPPLIER },
  },
  {
    path: '/releases/:number/confirm',
    name: 'release-confirm',
    component: () => import('@/views/ConfirmView.vue'),
    meta: { title: 'Answer release', roles: ['supplier'] },
  },
  {
    path: '/releases/:number/ship-notice',
    name: 'ship-notice',
    component: () => import('@/views/ShipNoticeView.vue'),
    meta: { title: 'Ship notice', roles: ['supplier'] },
  },
  {
    path: '/suppliers/performance',
    name: 'supplier-performance',
    component: () => import('@/views/SupplierPerformanceView.vue'),
    meta: { title: 'Supplier performance', roles: READ_ROLES_AND_SUPPLIER },
  },
  {
    path: '/supplier',
    name: 'supplier-account',
    component: () => import('@/views/SupplierAccountView.vue'),
    meta: { title: 'Your business', roles: ['supplier'] },
  },
  {
    path: '/loops/:id/print',
    name: 'loop-print',
    component: () => import('@/views/LoopsPrintView.vue'),
    meta: { title: 'Card labels', roles: READ_ROLES },
  },
  {
    path: '/scan',
    name: 'card-scan',
    component: () => import('@/views/LoopsScanView.vue'),
    meta: { title: 'Scan cards', roles: ['admin', 'buyer', 'planner', 'receiving'] },
  },
  {
    path: '/dock',
    name: 'dock',
    component: () => import('@/views/DockView.vue'),
    meta: { title: 'Dock', roles: READ_ROLES },
  },
  {
    path: '/admin/users',
    name: 'admin-users',
    component: () => import('@/views/UsersView.vue'),
    meta: { title: 'Users', roles: ['admin'] },
  },
  {
    path: '/imports',
    name: 'imports',
    component: () => import('@/views/ImportsView.vue'),
    meta: { title: 'Imports', roles: ['admin', 'buyer', 'planner'] },
  },
  {
    path: '/calendar',
    name: 'calendar',
    component: () => import('@/views/CalendarView.vue'),
    meta: { title: 'Plant calendar', roles: READ_ROLES },
  },
  {
    path: '/admin/outbox',
    name: 'admin-outbox',
    component: () => import('@/views/OutboxView.vue'),
    meta: { title: 'Outbox', roles: ['admin'] },
  },
  {
    path: '/parts',
    name: 'parts',
    component: () => import('@/views/PartsView.vue'),
    meta: { title: 'Parts', roles: READ_ROLES },
  },
  {
    path: '/parts/:partNumber',
    name: 'part',
    component: () => import('@/views/PartView.vue'),
    meta: { title: 'Part', roles: READ_ROLES },
  },
  {
    path: '/suppliers',
    name: 'suppliers',
    component: () => import('@/views/SuppliersView.vue'),
    meta: { title: 'Suppliers', roles: READ_ROLES },
  },
  {
    path: '/suppliers/:code',
    name: 'supplier',
    component: () => import('@/views/SupplierView.vue'),
    meta: { title: 'Supplier', roles: READ_ROLES },
  },
  {
    path: '/bom/:parent',
    name: 'bom',
    component: () => import('@/views/BomView.vue'),
    meta: { title: 'BOM', roles: READ_ROLES },
  },
  {
    path: '/admin/audit',
    name: 'audit',
    component: () => import('@/views/AuditView.vue'),
    meta: { title: 'Audit trail', roles: ['admin', 'planner'] },
  },
  {
    path: '/forbidden',
    name: 'forbidden',
    component: () => import('@/views/ForbiddenView.vue'),
    meta: { title: 'Not open to your role' },
  },
  {
    path: '/:pathMatch(.*)*',
    name: 'not-found',
    component: () => import('@/views/NotFoundView.vue'),
    meta: { title: 'Page not found', public: true },
  },
];
