import type { Role } from '@shared/schemas/user';
import type { PlainRouteName } from '@/router/route-map';

/** One step of the first-run guide: where to go and what the demo shows there. */
export interface GuideStep {
  routeName: PlainRouteName;
  /** Opens the screen as the text describes it (a horizon, a filter). */
  query?: Record<string, string>;
  title: string;
  text: string;
}

/**
 * "Start here" for each role on a fresh demo: the README's tour of the demo, a few steps each, in
 * the order a newcomer in that job would look. Every step opens a screen the role may open.
 */
export const GUIDE_STEPS: Record<Role, readonly GuideStep[]> = {
  planner: [
    {
      routeName: 'line-risk',
      // The loop and the count fall due in the third and fourth weeks.
      query: { weeks: '4' },
      title: 'Line risk',
      text: 'Over four weeks three parts need action: a battery to expedite, a kanban loop short of cards and a part to count.',
    },
    {
      routeName: 'sequence',
      title: 'Build sequence',
      text: 'Units at risk carry a mark; drag one and see what the move would do before you save it.',
    },
    {
      routeName: 'horizon',
      title: 'Horizon',
      text: 'Demand ahead per part and supplier, up to where the build sequence ends.',
    },
    {
      routeName: 'calendar',
      title: 'Calendar',
      text: 'The plant’s shutdown days, which every lead time counts around.',
    },
  ],
  buyer: [
    {
      routeName: 'releases',
      title: 'Releases',
      text: 'A supplier offered a later date: accept it, resend the release or cancel it.',
    },
    {
      routeName: 'line-risk',
      title: 'Line risk',
      text: 'The battery must be expedited: its rescue says how many by which day.',
    },
    {
      routeName: 'loops',
      title: 'Loops',
      text: 'Two loops to resize: one lost cards on the floor, one holds more than its demand needs.',
    },
    {
      routeName: 'supplier-performance',
      title: 'Supplier performance',
      text: 'Three weeks of deliveries: one supplier late week after week, one short delivery, one early.',
    },
  ],
  receiving: [
    {
      routeName: 'dock',
      title: 'Dock',
      text: 'Deliveries due today and one that is late: move one to At dock and count it in.',
    },
    {
      routeName: 'stock',
      title: 'Stock',
      text: 'Each part’s ledger shows the receipts counted in over the past weeks.',
    },
    {
      routeName: 'card-scan',
      title: 'Scan cards',
      text: 'Scan a kanban card when its container is emptied at the line.',
    },
  ],
  line: [
    {
      routeName: 'line-end',
      title: 'Line end',
      text: 'Today’s units in build order: scan or choose a serial to report it built.',
    },
    {
      routeName: 'sequence',
      title: 'Build sequence',
      text: 'The days ahead, and which units are at risk for want of a part.',
    },
    {
      routeName: 'stock',
      title: 'Stock',
      text: 'On-hand of every part; report parts scrapped at the line from a part’s page.',
    },
  ],
  supplier: [
    {
      routeName: 'supplier-account',
      title: 'Your business',
      text: 'Demand for your parts by day, firm, planned or forecast, as a table and a CSV.',
    },
    {
      routeName: 'releases',
      title: 'Releases',
      text: 'What the plant asked you to ship and when, and how you answered.',
    },
    {
      routeName: 'supplier-performance',
      title: 'Supplier performance',
      text: 'Your own scorecard: on time and filled against what was first asked.',
    },
  ],
  admin: [
    {
      routeName: 'admin-users',
      title: 'Users',
      text: 'One account per demo role and one per supplier contact; add people and set their roles.',
    },
    {
      routeName: 'admin-outbox',
      title: 'Outbox',
      text: 'The release e-mails already sent to suppliers, shown as the supplier received them.',
    },
    {
      routeName: 'calendar',
      title: 'Calendar',
      text: 'Working weekdays and the plant’s shutdown days.',
    },
    {
      routeName: 'releases',
      title: 'Releases',
      text: 'The time the daily release job runs, and every release it sent.',
    },
  ],
  viewer: [
    {
      routeName: 'line-risk',
      title: 'Line risk',
      text: 'Which units cannot be built for want of a part, and what is being done about it.',
    },
    {
      routeName: 'dock',
      title: 'Dock',
      text: 'Deliveries on their way in, due today and late.',
    },
    {
      routeName: 'supplier-performance',
      title: 'Supplier performance',
      text: 'How each supplier delivered, month by month.',
    },
  ],
};
