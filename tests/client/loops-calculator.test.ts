import { createAppContext, demoUsers, getByLabel, jsonResponse, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import LoopsSizingCalculator from '@/components/LoopsSizingCalculator.vue';

async function openCalculator() {
  const context = await createAppContext({ user: demoUsers.buyer, path: '/loops' });
  const wrapper = await mountInApp(LoopsSizingCalculator, context, { props: { modelValue: true, loop: null } });
  const drawer = document.body.querySelector<HTMLElement>('[role="dialog"]')!;
  return { wrapper, drawer };
}

function type(input: HTMLElement, value: string): void {
  (input as HTMLInputElement).value = value;
  input.dispatchEvent(new Event('input'));
  input.dispatchEvent(new Event('change'));
}

function errorUnder(drawer: HTMLElement, label: string): string {
  const item = getByLabel(drawer, label).closest('.el-form-item');
  return item?.querySelector('.el-form-item__error')?.textContent?.trim() ?? '';
}

function bodies(fetchMock: ReturnType<typeof vi.fn<typeof fetch>>): unknown[] {
  return fetchMock.mock.calls.map(([, init]) => JSON.parse(String(init?.body)));
}

describe('LoopsSizingCalculator', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('asks the server with the delivery-cycle form and shows the filled-in formula and card count', async () => {
    // Its starting numbers: D = 100/day, cycle 1–1–1 so T = 1 × (1 + 1) / 1 = 2 days, α = 0.1,
    // C = 25: N = ⌈100 × 2 × 1.1 / 25⌉ = ⌈8.8⌉ = 9 (PRODUCT.md capability 5 formula; the
    // answer below is what the server would send for these numbers).
    const fetchMock = vi.fn<typeof fetch>().mockResolvedValue(
      jsonResponse(200, {
        exact: 8.8,
        cards: 9,
        replenishmentTime: 2,
        formula: 'T = 1 × (1 + 1) / 1 = 2; ⌈(100 × (2 × (1 + 0.1) + 0) + 0) / 25⌉ = ⌈8.8⌉ = 9',
      }),
    );
    vi.stubGlobal('fetch', fetchMock);

    const { drawer } = await openCalculator();
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    await flushPromises();

    expect(bodies(fetchMock)[0]).toEqual({
      dailyDemand: 100,
      containerQty: 25,
      cycle: { days: 1, deliveries: 1, delay: 1 },
      safetyFactor: 0.1,
      safetyDays: 0,
      safetyStock: 0,
    });
    expect(drawer.querySelector('[data-test="sizing-cards"]')?.textContent).toBe('9');
    expect(drawer.querySelector('[data-test="sizing-formula"]')?.textContent).toContain('⌈8.8⌉ = 9');
  });

  it('says by the field what is wrong with a number the server would refuse, and sends nothing until it is fixed', async () => {
    const fetchMock = vi
      .fn<typeof fetch>()
      .mockImplementation(() =>
        Promise.resolve(jsonResponse(200, { exact: 8.8, cards: 9, replenishmentTime: 2, formula: '' })),
      );
    vi.stubGlobal('fetch', fetchMock);
    const { drawer } = await openCalculator();
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));

    type(getByLabel(drawer, 'Container quantity (C)'), '-25');
    type(getByLabel(drawer, 'Daily demand (D)'), '-10');
    await waitFor(() => expect(errorUnder(drawer, 'Container quantity (C)')).toBe('Must be greater than 0'));
    expect(errorUnder(drawer, 'Daily demand (D)')).toBe('Must be at least 0');
    expect(drawer.textContent).toContain('Fix the marked inputs to see the card count.');
    expect(drawer.querySelector('[data-test="sizing-cards"]')?.textContent).not.toBe('9');
    await new Promise((resolve) => setTimeout(resolve, 400));
    expect(fetchMock).toHaveBeenCalledTimes(1);

    type(getByLabel(drawer, 'Container quantity (C)'), '20');
    type(getByLabel(drawer, 'Daily demand (D)'), '10');
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(2));
    expect(bodies(fetchMock)[1]).toMatchObject({ dailyDemand: 10, containerQty: 20 });
    expect(errorUnder(drawer, 'Container quantity (C)')).toBe('');
  });

  it('waits for typing to pause, then puts the server’s message by the field it judged', async () => {
    const message = 'Container quantity is above what a container holds';
    const fetchMock = vi
      .fn<typeof fetch>()
      .mockResolvedValueOnce(jsonResponse(200, { exact: 8.8, cards: 9, replenishmentTime: 2, formula: '' }))
      .mockResolvedValueOnce(
        jsonResponse(400, {
          error: {
            code: 'invalid_input',
            message: `containerQty: ${message}`,
            details: [{ path: ['containerQty'], code: 'custom', message }],
          },
        }),
      );
    vi.stubGlobal('fetch', fetchMock);
    const { drawer } = await openCalculator();
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));

    const container = getByLabel(drawer, 'Container quantity (C)');
    type(container, '2');
    type(container, '25000');
    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(2));
    await flushPromises();

    expect((bodies(fetchMock)[1] as { containerQty: number }).containerQty).toBe(25000);
    await waitFor(() => expect(errorUnder(drawer, 'Container quantity (C)')).toBe(message));
    expect(drawer.textContent).toContain('Fix the marked inputs to see the card count.');
  });
});
