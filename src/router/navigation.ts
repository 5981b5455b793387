import { markRaw, type Component } from 'vue';
import {
  Aim,
  Box,
  Calendar,
  Document,
  Finished,
  Goods,
  House,
  Medal,
  Message,
  Refresh,
  Shop,
  Sort,
  Tickets,
  TrendCharts,
  Upload,
  User,
  Van,
  Warning,
} from '@element-plus/icons-vue';
import { ROLES, type Role } from '@shared/schemas/user';
import type { PlainRouteName } from './route-map';
import { LINE_END_ROLES, READ_ROLES, READ_ROLES_AND_SUPPLIER } from './routes';

export interface NavigationEntry {
  routeName: PlainRouteName;
  label: string;
  icon: Component;
  roles: readonly Role[];
  /** Plain words of what the role does there, for the landing page. */
  summary: string;
  /** The same for roles that do something else there (a viewer only looks, a supplier sees its own). */
  summaryFor?: Partial<Record<Role, string>>;
}

/** The rail, in order. Keep `roles` equal to the route's `meta.roles` (a test checks it). */
export const navigation: readonly NavigationEntry[] = [
  {
    routeName: 'home',
    label: 'Overview',
    icon: markRaw(House),
    roles: ROLES,
    summary: 'Start here: the areas your role works in.',
  },
  {
    routeName: 'sequence',
    label: 'Build sequence',
    icon: markRaw(Sort),
    roles: READ_ROLES,
    summary:
      'Units by day and position, planned, started or built, with capacity, the model mix and the frozen window.',
    summaryFor: {
      admin:
        'Units by day and position, planned, started or built: drag to resequence, watch capacity and the model mix, keep the frozen window.',
      planner:
        'Units by day and position, planned, started or built: drag to resequence, watch capacity and the model mix, keep the frozen window.',
    },
  },
  {
    routeName: 'line-end',
    label: 'Line end',
    icon: markRaw(Finished),
    roles: LINE_END_ROLES,
    summary:
      'Scan each unit as it comes off the line so its parts come off stock; see the day tick off, undo a mistake, print kits.',
  },
  {
    routeName: 'stock',
    label: 'Stock',
    icon: markRaw(Goods),
    roles: READ_ROLES,
    summary: 'On-hand of every part with its ledger of receipts, builds, counts and scrap; parts to count are flagged.',
  },
  {
    routeName: 'line-risk',
    label: 'Line risk',
    icon: markRaw(Warning),
    roles: READ_ROLES,
    summary:
      'Units of the sequence that cannot be built for want of a bought part, days before it happens, with a rescue for each.',
  },
  {
    routeName: 'horizon',
    label: 'Horizon',
    icon: markRaw(TrendCharts),
    roles: READ_ROLES,
    summary: 'Gross demand per part and supplier, by day or ISO week, with each part’s gross-to-net record.',
  },
  {
    routeName: 'loops',
    label: 'Loops',
    icon: markRaw(Refresh),
    roles: READ_ROLES,
    summary: 'Kanban loops: cards recommended for the demand ahead versus cards in circulation, labels to print.',
  },
  {
    routeName: 'releases',
    label: 'Releases',
    icon: markRaw(Tickets),
    roles: READ_ROLES_AND_SUPPLIER,
    summary: 'What each supplier was asked to ship and when, their answers, and the exceptions waiting for a decision.',
    summaryFor: { supplier: 'What the plant asked you to ship and when, and your answers.' },
  },
  {
    routeName: 'supplier-account',
    label: 'Your business',
    icon: markRaw(TrendCharts),
    roles: ['supplier'],
    summary:
      'Demand for your parts by day (firm, planned, forecast; CSV too), releases to ship, and the dock’s claims.',
  },
  {
    routeName: 'supplier-performance',
    label: 'Supplier performance',
    icon: markRaw(Medal),
    roles: READ_ROLES_AND_SUPPLIER,
    summary:
      'Each supplier month by month: on time and filled against what was first asked, promises kept, and how fast releases are answered.',
    summaryFor: {
      supplier:
        'Your deliveries month by month: on time and filled against what was first asked, promises kept, and how fast you answered.',
    },
  },
  {
    routeName: 'card-scan',
    label: 'Scan cards',
    icon: markRaw(Aim),
    roles: ['admin', 'buyer', 'planner', 'receiving'],
    summary: 'Scan a kanban card when its container is emptied at the line: the next release orders it.',
  },
  {
    routeName: 'dock',
    label: 'Dock',
    icon: markRaw(Van),
    roles: READ_ROLES,
    summary: 'Deliveries on their way in: move them across the dock, count them in, attach the packing slip.',
    summaryFor: { viewer: 'Deliveries on their way in, at the dock and counted in.' },
  },
  {
    routeName: 'parts',
    label: 'Parts',
    icon: markRaw(Box),
    roles: READ_ROLES,
    summary: 'Each part’s master data, stock, loop, supplier and where it is used; BOMs with engineering changes.',
  },
  {
    routeName: 'suppliers',
    label: 'Suppliers',
    icon: markRaw(Shop),
    roles: READ_ROLES,
    summary: 'Who the plant buys from: order e-mail, lead time and delivery cycle.',
  },
  {
    routeName: 'imports',
    label: 'Imports',
    icon: markRaw(Upload),
    roles: ['admin', 'buyer', 'planner'],
    summary:
      'Load suppliers, parts, BOMs, the build sequence or stock counts from CSV; a bad row stops the whole file.',
    summaryFor: {
      planner: 'Load the build sequence from CSV; a bad row stops the whole file.',
      buyer: 'Load suppliers, parts, BOMs, stock counts or open orders from CSV; a bad row stops the whole file.',
    },
  },
  {
    routeName: 'calendar',
    label: 'Calendar',
    icon: markRaw(Calendar),
    roles: READ_ROLES,
    summary: 'Working weekdays and plant holidays, which every lead-time offset counts in.',
  },
  {
    routeName: 'audit',
    label: 'Audit trail',
    icon: markRaw(Document),
    roles: ['admin', 'planner'],
    summary: 'Who changed what and when, from what to what; filter and export as CSV.',
  },
  {
    routeName: 'admin-users',
    label: 'Users',
    icon: markRaw(User),
    roles: ['admin'],
    summary: 'Add people, give each the role for their job, and switch off accounts no longer used.',
  },
  {
    routeName: 'admin-outbox',
    label: 'Outbox',
    icon: markRaw(Message),
    roles: ['admin'],
    summary: 'Every notice the plant sent or is still trying to send, and what the demo mail server caught.',
  },
];

/** What `role` does in an area, in plain words. */
export function summaryOf(entry: NavigationEntry, role: Role): string {
  return entry.summaryFor?.[role] ?? entry.summary;
}

/** The entries a role may open, in rail order; nobody signed in gets none. */
export function navigationFor(role: Role | null): NavigationEntry[] {
  if (role === null) return [];
  return navigation.filter((entry) => entry.roles.includes(role));
}
