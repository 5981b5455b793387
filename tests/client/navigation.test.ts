import { createAppContext, demoUsers, mountInApp } from './helpers';
import { afterEach, describe, expect, it } from 'vitest';
import { ROLES } from '@shared/schemas/user';
import AppShellNav from '@/components/AppShellNav.vue';
import { navigation, navigationFor, summaryOf } from '@/router/navigation';
import { routes } from '@/router/routes';

// Role rules from PRODUCT.md, "The people and what each must get done": users and roles are
// the admin's job only.
describe('navigationFor', () => {
  it('offers every area, the user list and the outbox to an admin', () => {
    const names = navigationFor('admin').map((entry) => entry.routeName);

    expect(names).toEqual([
      'home',
      'sequence',
      'line-end',
      'stock',
      'line-risk',
      'horizon',
      'loops',
      'releases',
      'supplier-performance',
      'card-scan',
      'dock',
      'parts',
      'suppliers',
      'imports',
      'calendar',
      'audit',
      'admin-users',
      'admin-outbox',
    ]);
  });

  it.each(ROLES.filter((role) => role !== 'admin'))('keeps the user list and outbox from a %s', (role) => {
    const names = navigationFor(role).map((entry) => entry.routeName);

    expect(names).not.toContain('admin-users');
    expect(names).not.toContain('admin-outbox');
    expect(names).toContain('home');
  });

  it('offers a supplier only the overview and its own releases, business and scorecard', () => {
    const names = navigationFor('supplier').map((entry) => entry.routeName);

    expect(names).toEqual(['home', 'releases', 'supplier-account', 'supplier-performance']);
  });

  // Role rules from PRODUCT.md: everything is readable by every signed-in role except supplier;
  // the line reports units built.
  it('offers the line its end of the line and every screen to read, but no scanning, imports or admin', () => {
    const names = navigationFor('line').map((entry) => entry.routeName);

    expect(names).toEqual([
      'home',
      'sequence',
      'line-end',
      'stock',
      'line-risk',
      'horizon',
      'loops',
      'releases',
      'supplier-performance',
      'dock',
      'parts',
      'suppliers',
      'calendar',
    ]);
  });

  it('offers the receiving clerk every screen to read beside the dock and card scanning', () => {
    const names = navigationFor('receiving').map((entry) => entry.routeName);

    expect(names).toEqual([
      'home',
      'sequence',
      'stock',
      'line-risk',
      'horizon',
      'loops',
      'releases',
      'supplier-performance',
      'card-scan',
      'dock',
      'parts',
      'suppliers',
      'calendar',
    ]);
  });

  it('offers the Line end only to the roles that may report units built', () => {
    const roles = ROLES.filter((role) => navigationFor(role).some((entry) => entry.routeName === 'line-end'));

    expect(roles.sort()).toEqual(['admin', 'line', 'planner']);
  });

  it('offers nothing when nobody is signed in', () => {
    expect(navigationFor(null)).toEqual([]);
  });

  it('lists the same roles as the route it links to, so the rail never offers a forbidden page', () => {
    for (const entry of navigation) {
      const route = routes.find((candidate) => candidate.name === entry.routeName);
      const routeRoles = route?.meta?.roles ?? ROLES;

      expect([...entry.roles].sort(), entry.routeName).toEqual([...routeRoles].sort());
    }
  });
});

describe('summaryOf', () => {
  it('tells each role what it does in an area: only planners and admins are told to drag units', () => {
    const sequence = navigation.find((entry) => entry.routeName === 'sequence')!;
    const releases = navigation.find((entry) => entry.routeName === 'releases')!;

    expect(summaryOf(sequence, 'planner')).toContain('drag to resequence');
    expect(summaryOf(sequence, 'viewer')).not.toContain('drag');
    expect(summaryOf(sequence, 'line')).not.toContain('drag');
    expect(summaryOf(releases, 'supplier')).toBe('What the plant asked you to ship and when, and your answers.');
    expect(summaryOf(releases, 'buyer')).toBe(releases.summary);
  });
});

describe('AppShellNav', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
  });

  it('shows a buyer only the links a buyer may use, inside a labelled nav landmark', async () => {
    const context = await createAppContext({ user: demoUsers.buyer, path: '/' });

    const wrapper = await mountInApp(AppShellNav, context);

    const nav = wrapper.get('nav');
    expect(nav.attributes('aria-label')).toBe('Main');
    expect(nav.findAll('a').map((link) => link.text())).toEqual([
      'Overview',
      'Build sequence',
      'Stock',
      'Line risk',
      'Horizon',
      'Loops',
      'Releases',
      'Supplier performance',
      'Scan cards',
      'Dock',
      'Parts',
      'Suppliers',
      'Imports',
      'Calendar',
    ]);
  });

  it('marks the open page with aria-current for an admin on the user list', async () => {
    const context = await createAppContext({ user: demoUsers.admin, path: '/admin/users' });

    const wrapper = await mountInApp(AppShellNav, context);

    const links = wrapper.findAll('a');
    expect(links.map((link) => link.text())).toEqual([
      'Overview',
      'Build sequence',
      'Line end',
      'Stock',
      'Line risk',
      'Horizon',
      'Loops',
      'Releases',
      'Supplier performance',
      'Scan cards',
      'Dock',
      'Parts',
      'Suppliers',
      'Imports',
      'Calendar',
      'Audit trail',
      'Users',
      'Outbox',
    ]);
    const current = links.filter((link) => link.attributes('aria-current') === 'page');
    expect(current.map((link) => link.text())).toEqual(['Users']);
    expect(current[0]!.classes()).toContain('is-active');
  });
});
