import { createAppContext, demoUsers, getButton, jsonResponse, mountInApp } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { Confirmation } from '@shared/schemas/releases';
import type { SessionUser } from '@shared/schemas/user';
import App from '@/App.vue';
import ConfirmView from '@/views/ConfirmView.vue';

const TOKEN = 'k3vY0m3pQmU5s2Lr9xW1aZ7bC4dE6fG8hJ0kL2nP4qS';
const supplier: SessionUser = {
  email: 'orders@rotomould.example.com',
  name: 'Sam Seller',
  role: 'supplier',
  supplierCode: 'SRM',
};
const SHIP_TOKEN = 'Zs8mQ2vL0pK4rT6wY1xC3bN5dF7gH9jA2eU4iO6aS8u';

const confirmation: Confirmation = {
  release: {
    number: 'R261201-SRM',
    supplierCode: 'SRM',
    supplierName: 'Rotomould Co',
    plantName: 'Cardloop demo plant',
    releaseDate: '2026-12-01',
    transitDays: 0,
    lines: [
      {
        id: 11,
        partNumber: 'TNK-R60',
        qty: 6,
        needDate: '2026-12-04',
        description: 'Recovery tank 60 L',
        uom: 'H87',
        hazardous: false,
        expedite: false,
        earliestShipDate: '2026-12-03',
        latestShipDate: '2026-12-04',
      },
      {
        id: 12,
        partNumber: 'BAT-06-312',
        qty: 12,
        needDate: '2026-12-07',
        description: 'Battery 6 V',
        uom: 'H87',
        hazardous: true,
        expedite: false,
        earliestShipDate: '2026-12-04',
        latestShipDate: '2026-12-07',
      },
    ],
  },
  today: '2026-12-01',
  expiresAt: '2026-12-08T06:00:00.000Z',
};

function stubConfirm(
  view: () => Response,
  answer: (body: unknown) => Response = () =>
    jsonResponse(200, { status: 'confirmed', number: 'R261201-SRM', changedLines: 0, shippingToken: SHIP_TOKEN }),
) {
  const fetchMock = vi.fn<typeof fetch>((input, init) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname !== `/api/confirm/${TOKEN}` && url.pathname !== '/api/releases/R261201-SRM/confirmation')
      return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
    return Promise.resolve(init?.method === 'POST' ? answer(JSON.parse(String(init.body))) : view());
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function posted(fetchMock: ReturnType<typeof stubConfirm>) {
  return fetchMock.mock.calls
    .filter(([, init]) => init?.method === 'POST')
    .map(([, init]) => JSON.parse(String(init!.body)));
}

async function openConfirm(options: { signedInAs?: typeof demoUsers.buyer } = {}) {
  const context = await createAppContext({ path: `/confirm/${TOKEN}`, user: options.signedInAs });
  const wrapper = await mountInApp(ConfirmView, context);
  await flushPromises();
  return wrapper;
}

function qtyInput(wrapper: Awaited<ReturnType<typeof openConfirm>>, lineId: number): HTMLInputElement {
  return (
    wrapper.get(`#confirm-line-${lineId}-qty`).element.querySelector('input') ??
    (wrapper.get(`#confirm-line-${lineId}-qty`).element as HTMLInputElement)
  );
}

describe('ConfirmView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('shows the release to a supplier without signing in, every line filled in as requested', async () => {
    const fetchMock = stubConfirm(() => jsonResponse(200, confirmation));

    // Someone with a session in this browser: the link still speaks for the supplier, not for them.
    const wrapper = await openConfirm({ signedInAs: demoUsers.buyer });

    expect(fetchMock.mock.calls).toHaveLength(1);
    expect(fetchMock.mock.calls[0]![1]!.headers).not.toHaveProperty('Authorization');
    expect(wrapper.get('h1').text()).toBe('R261201-SRM');
    expect(wrapper.text()).toContain('For Rotomould Co from Cardloop demo plant');
    expect(wrapper.text()).toContain('Fri 4 Dec 2026 to Mon 7 Dec 2026');
    expect(wrapper.text()).toContain('Requested 6 pcs, needed at our dock by Fri 4 Dec 2026');
    expect(wrapper.text()).toContain('Hazardous goods: pack and ship under the applicable dangerous-goods rules.');
    expect(qtyInput(wrapper, 11).value).toBe('6');
    // The picker shows the date in the screen style and hands the ISO date to the answer.
    expect((wrapper.get('#confirm-line-12-ship').element as HTMLInputElement).value).toBe('Mon 7 Dec 2026');
    expect(wrapper.text()).toContain('Every line as requested: the release will be confirmed.');
  });

  it('confirms every line as requested with one button', async () => {
    const fetchMock = stubConfirm(() => jsonResponse(200, confirmation));
    const wrapper = await openConfirm();

    getButton(wrapper.element, 'Confirm all as requested').click();
    await flushPromises();

    expect(posted(fetchMock)).toEqual([
      {
        lines: [
          { id: 11, confirmedQty: 6, shipDate: '2026-12-04' },
          { id: 12, confirmedQty: 12, shipDate: '2026-12-07' },
        ],
      },
    ]);
    expect(wrapper.get('[role="status"]').text()).toContain('Thank you — release confirmed');
    // The receipt carries the reusable link of the ship-notice form.
    expect(wrapper.get('.confirm-outcome__ship a').attributes('href')).toBe(`/ship/${SHIP_TOKEN}`);
  });

  it('sends a changed quantity with the shipment details as a proposal for the buyer', async () => {
    const fetchMock = stubConfirm(
      () => jsonResponse(200, confirmation),
      () =>
        jsonResponse(200, { status: 'exception', number: 'R261201-SRM', changedLines: 1, shippingToken: SHIP_TOKEN }),
    );
    const wrapper = await openConfirm();
    const qty = qtyInput(wrapper, 11);
    qty.value = '4';
    qty.dispatchEvent(new Event('input'));
    qty.dispatchEvent(new Event('change'));
    await flushPromises();
    await wrapper.get('#confirm-carrier').setValue('Road Freight Co');
    await wrapper.get('#confirm-tracking').setValue('RF-1');

    expect(wrapper.text()).toContain('1 line differs from the request: your answer goes to the buyer as a proposal.');
    getButton(wrapper.element, 'Send answer').click();
    await flushPromises();

    expect(posted(fetchMock)[0]).toEqual({
      lines: [
        { id: 11, confirmedQty: 4, shipDate: '2026-12-04' },
        { id: 12, confirmedQty: 12, shipDate: '2026-12-07' },
      ],
      carrier: 'Road Freight Co',
      trackingNumber: 'RF-1',
    });
    expect(wrapper.get('[role="status"]').text()).toContain('sent as a proposal for the buyer');
  });

  it('keeps the answer back when a ship date is missing and says which line', async () => {
    const fetchMock = stubConfirm(() => jsonResponse(200, confirmation));
    const wrapper = await openConfirm();

    // Cleared the way a person clears it: the picker hands back no date.
    const shipPicker = wrapper
      .findAllComponents({ name: 'ElDatePicker' })
      .find((picker) => picker.find('#confirm-line-12-ship').exists());
    shipPicker!.vm.$emit('update:modelValue', null);
    await flushPromises();
    getButton(wrapper.element, 'Send answer').click();
    await flushPromises();

    expect(posted(fetchMock)).toEqual([]);
    expect(wrapper.text()).toContain('Pick the day the goods leave you.');
  });

  it('keeps a negative or half-piece quantity as typed, says so under the line and sends nothing', async () => {
    const fetchMock = stubConfirm(() => jsonResponse(200, confirmation));
    const wrapper = await openConfirm();
    const negative = qtyInput(wrapper, 11);
    const halfPiece = qtyInput(wrapper, 12);
    for (const [input, typed] of [
      [negative, '-2'],
      [halfPiece, '11.5'],
    ] as const) {
      input.value = typed;
      input.dispatchEvent(new Event('input'));
      input.dispatchEvent(new Event('change'));
      input.dispatchEvent(new FocusEvent('blur'));
    }
    await flushPromises();

    getButton(wrapper.element, 'Send answer').click();
    await flushPromises();

    expect(posted(fetchMock)).toEqual([]);
    expect([negative.value, halfPiece.value]).toEqual(['-2', '11.5']);
    expect(wrapper.get('#confirm-line-11-qty').element.closest('.confirm-line-card__field')!.textContent).toContain(
      'Must be 0 or more',
    );
    expect(wrapper.get('#confirm-line-12-qty').element.closest('.confirm-line-card__field')!.textContent).toContain(
      'Must be a whole number of pcs',
    );
  });

  it('fills a quantity in kilograms in as asked, with no padded decimals', async () => {
    const inKilograms = structuredClone(confirmation);
    Object.assign(inKilograms.release.lines[0]!, { qty: 2000, uom: 'KGM' });
    Object.assign(inKilograms.release.lines[1]!, { qty: 180.5, uom: 'KGM' });
    stubConfirm(() => jsonResponse(200, inKilograms));

    const wrapper = await openConfirm();

    expect(wrapper.text()).toContain('Requested 2,000 kg');
    expect([qtyInput(wrapper, 11).value, qtyInput(wrapper, 12).value]).toEqual(['2000', '180.5']);
  });

  it('stands alone without the app shell, even for someone signed in', async () => {
    stubConfirm(() => jsonResponse(200, confirmation));
    const context = await createAppContext({ path: `/confirm/${TOKEN}`, user: demoUsers.buyer });

    const wrapper = await mountInApp(App, context);
    await flushPromises();

    expect(wrapper.text()).toContain('R261201-SRM');
    expect(wrapper.find('nav[aria-label="Main"]').exists()).toBe(false);
  });

  it.each([
    [409, 'conflict', 'This link was already used.', 'This link was already used'],
    [410, 'gone', 'This link has expired or was replaced by a newer one.', 'This link no longer works'],
    [404, 'not_found', 'This confirmation link is not known.', 'This link is not known'],
  ])('explains a link answered with %i', async (status, code, message, title) => {
    stubConfirm(() => jsonResponse(status, { error: { code, message } }));

    const wrapper = await openConfirm();

    expect(wrapper.get('[role="status"] h1').text()).toBe(title);
    expect(wrapper.find('form').exists()).toBe(false);
  });

  it('ends the form when the link was used meanwhile', async () => {
    stubConfirm(
      () => jsonResponse(200, confirmation),
      () => jsonResponse(409, { error: { code: 'conflict', message: 'This link was already used.' } }),
    );
    const wrapper = await openConfirm();

    getButton(wrapper.element, 'Send answer').click();
    await flushPromises();

    expect(wrapper.get('[role="status"] h1').text()).toBe('This link was already used');
  });

  it('lets a signed-in supplier answer its own release inside the app, with its session', async () => {
    const fetchMock = stubConfirm(() => jsonResponse(200, { ...confirmation, expiresAt: null }));
    const context = await createAppContext({ path: '/releases/R261201-SRM/confirm', user: supplier });
    const wrapper = await mountInApp(ConfirmView, context);
    await flushPromises();

    const [input, init] = fetchMock.mock.calls[0]!;
    expect(new URL(String(input), 'http://localhost').pathname).toBe('/api/releases/R261201-SRM/confirmation');
    expect(init!.headers).toHaveProperty('Authorization');
    expect(wrapper.find('.confirm-view__band').exists()).toBe(false);
    expect(wrapper.text()).toContain('You answer once; the link in the release e-mail then stops working.');

    getButton(wrapper.element, 'Confirm all as requested').click();
    await flushPromises();

    expect(posted(fetchMock)).toHaveLength(1);
    expect(wrapper.get('[role="status"]').text()).toContain('Thank you — release confirmed');
    expect(wrapper.get('.confirm-outcome__ship a').attributes('href')).toBe('/releases/R261201-SRM/ship-notice');
  });
});
