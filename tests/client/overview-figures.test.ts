import { createAppContext, demoUsers, jsonResponse, mountInApp, stubFetch } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { Overview } from '@shared/schemas/overview';
import OverviewFigures from '@/components/OverviewFigures.vue';

const buyerOverview: Overview = {
  role: 'buyer',
  today: '2026-12-02',
  firstRunGuide: false,
  figures: [
    {
      key: 'exceptionsWaiting',
      label: 'Supplier answers waiting',
      value: 2,
      unit: 'count',
      hint: 'Releases whose supplier offered another quantity or date.',
      to: '/releases',
      attention: true,
    },
    {
      key: 'daysToFirstStop',
      label: 'Working days to the first stop',
      value: null,
      unit: 'workingDays',
      hint: 'No unit lacks a part.',
      to: '/line-risk',
      attention: false,
    },
    {
      key: 'capacityUse',
      label: 'Capacity used',
      value: 0.925,
      unit: 'share',
      hint: 'Units against capacity.',
      to: '/sequence',
      attention: false,
    },
  ],
};

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

describe('OverviewFigures', () => {
  it('shows each figure with its link, and says in words which need attention', async () => {
    stubFetch(jsonResponse(200, buyerOverview));
    const context = await createAppContext({ user: demoUsers.buyer });

    const wrapper = await mountInApp(OverviewFigures, context);

    const waiting = wrapper.get('[data-test="figure-exceptionsWaiting"]');
    expect(waiting.text()).toContain('2');
    expect(waiting.text()).toContain('needs attention');
    expect(waiting.get('a').attributes('href')).toBe('/releases');
    expect(wrapper.get('[data-test="figure-daysToFirstStop"]').text()).toContain('—');
    expect(wrapper.get('[data-test="figure-daysToFirstStop"]').text()).not.toContain('needs attention');
    expect(wrapper.get('[data-test="figure-capacityUse"]').text()).toContain('92.5 %');
  });

  it('says when the figures could not be loaded', async () => {
    stubFetch(jsonResponse(500, { error: { code: 'internal', message: 'Something broke.' } }));
    const context = await createAppContext({ user: demoUsers.buyer });

    const wrapper = await mountInApp(OverviewFigures, context);

    expect(wrapper.text()).toContain('The figures could not be loaded');
  });
});
