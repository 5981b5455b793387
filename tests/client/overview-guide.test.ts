import { flushPromises } from '@vue/test-utils';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { Overview } from '@shared/schemas/overview';
import { ROLES } from '@shared/schemas/user';
import { GUIDE_STEPS } from '@/components/overview-guide';
import { navigationFor } from '@/router/navigation';
import OverviewView from '@/views/OverviewView.vue';
import { createAppContext, demoUsers, jsonResponse, mountInApp, stubFetch } from './helpers';

const buyerOverview: Overview = { role: 'buyer', today: '2026-12-02', figures: [], firstRunGuide: true };

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

describe('the first-run guide', () => {
  it('gives every role three to five steps, each to a screen that role may open', () => {
    for (const role of ROLES) {
      const steps = GUIDE_STEPS[role];
      const open = new Set(navigationFor(role).map((entry) => entry.routeName));
      expect(steps.length, role).toBeGreaterThanOrEqual(3);
      expect(steps.length, role).toBeLessThanOrEqual(5);
      for (const step of steps) expect(open.has(step.routeName), `${role}: ${step.routeName}`).toBe(true);
    }
  });

  it('opens the planner’s line risk on the four weeks its words are about', async () => {
    stubFetch(jsonResponse(200, { ...buyerOverview, role: 'planner' }));
    const context = await createAppContext({
      user: { email: 'planner@example.com', name: 'Pat Planner', role: 'planner', supplierCode: null },
    });
    const wrapper = await mountInApp(OverviewView, context);

    const first = wrapper.get('[data-test="first-run-guide"] ol > li');
    expect(first.text()).toContain('Over four weeks three parts need action');
    expect(first.get('a').attributes('href')).toBe('/line-risk?weeks=4');
  });

  it('lists the buyer’s steps as links in order, and goes away for good when hidden', async () => {
    const fetchMock = stubFetch(jsonResponse(200, buyerOverview), new Response(null, { status: 204 }));
    const context = await createAppContext({ user: demoUsers.buyer });
    const wrapper = await mountInApp(OverviewView, context);

    const guide = wrapper.get('[data-test="first-run-guide"]');
    expect(guide.get('h2').text()).toBe('Start here');
    const links = guide.findAll('ol > li a');
    expect(links.map((link) => link.attributes('href'))).toEqual([
      '/releases',
      '/line-risk',
      '/loops',
      '/suppliers/performance',
    ]);

    await guide.get('button').trigger('click');
    await flushPromises();

    const [url, init] = fetchMock.mock.calls[1]!;
    expect(String(url)).toMatch(/\/api\/overview\/first-run-guide\/dismiss$/);
    expect(init?.method).toBe('POST');
    expect(wrapper.find('[data-test="first-run-guide"]').exists()).toBe(false);
    expect(document.activeElement?.id).toBe('overview-figures-heading');
  });

  it('stays, saying why, when hiding it fails', async () => {
    stubFetch(
      jsonResponse(200, buyerOverview),
      jsonResponse(500, { error: { code: 'internal', message: 'Something broke.' } }),
    );
    const context = await createAppContext({ user: demoUsers.buyer });
    const wrapper = await mountInApp(OverviewView, context);

    await wrapper.get('[data-test="first-run-guide"] button').trigger('click');
    await flushPromises();

    expect(wrapper.get('[data-test="first-run-guide"]').text()).toContain('The guide could not be hidden');
  });

  it('is not shown when the Overview says so', async () => {
    stubFetch(jsonResponse(200, { ...buyerOverview, firstRunGuide: false }));
    const context = await createAppContext({ user: demoUsers.buyer });

    const wrapper = await mountInApp(OverviewView, context);

    expect(wrapper.find('[data-test="first-run-guide"]').exists()).toBe(false);
    expect(wrapper.text()).toContain('Needs doing now');
  });
});
