import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { ShippingView } from '@shared/schemas/ship-notices';
import ShipNoticeView from '@/views/ShipNoticeView.vue';
import { createAppContext, getButton, jsonResponse, mountInApp } from './helpers';

const TOKEN = 'Zs8mQ2vL0pK4rT6wY1xC3bN5dF7gH9jA2eU4iO6aS8u';

const form: ShippingView = {
  releaseNumber: 'R261201-SRM',
  supplierName: 'Rotomould Co',
  status: 'confirmed',
  today: '2026-12-01',
  transitDays: 2,
  lines: [
    {
      id: 11,
      partNumber: 'TNK-R60',
      description: 'Recovery tank 60 L',
      uom: 'H87',
      qty: 6,
      shippedQty: 0,
      maxQty: 6,
      needDate: '2026-12-04',
      arrivalDate: '2026-12-04',
    },
    {
      id: 12,
      partNumber: 'CAP-20',
      description: 'Filler cap',
      uom: 'H87',
      qty: 12,
      shippedQty: 4,
      maxQty: 8,
      needDate: '2026-12-07',
      arrivalDate: '2026-12-07',
    },
  ],
  notices: [],
};

const sent = {
  notice: {
    id: 1,
    releaseNumber: 'R261201-SRM',
    shipDate: '2026-12-01',
    arrivalDate: '2026-12-03',
    carrier: 'Road Freight Co',
    trackingNumber: 'RF-1',
    createdAt: '2026-12-01T08:00:00.000Z',
    lines: [{ lineId: 11, partNumber: 'TNK-R60', qty: 6 }],
  },
  releaseStatus: 'partial',
};

function stubShipping(post: (body: unknown) => Response) {
  const fetchMock = vi.fn<typeof fetch>((input, init) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname !== `/api/shipping/${TOKEN}`)
      return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
    return Promise.resolve(init?.method === 'POST' ? post(JSON.parse(String(init.body))) : jsonResponse(200, form));
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

async function openForm() {
  const context = await createAppContext({ path: `/ship/${TOKEN}` });
  const wrapper = await mountInApp(ShipNoticeView, context);
  await flushPromises();
  return wrapper;
}

function setQty(wrapper: Awaited<ReturnType<typeof openForm>>, part: string, value: string): void {
  const input = wrapper.get(`input[aria-label="Quantity of ${part} on this shipment"]`).element as HTMLInputElement;
  input.value = value;
  input.dispatchEvent(new Event('input'));
  input.dispatchEvent(new Event('change'));
}

describe('ShipNoticeView through the link in a confirmation receipt', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    vi.unstubAllGlobals();
  });

  it('sends the quantities on the truck with carrier, tracking and ship date, once per key', async () => {
    const fetchMock = stubShipping(() => jsonResponse(201, sent));
    const wrapper = await openForm();

    expect(wrapper.get('h1').text()).toBe('R261201-SRM');
    expect(wrapper.text()).toContain('already shipped 4 pcs');
    setQty(wrapper, 'CAP-20', '0');
    await wrapper.get('input[aria-label="Carrier"]').setValue('Road Freight Co');
    await wrapper.get('input[aria-label="Tracking number"]').setValue('RF-1');
    getButton(wrapper.element, 'Send ship notice').click();
    await flushPromises();

    const posts = fetchMock.mock.calls.filter(([, init]) => init?.method === 'POST');
    expect(posts).toHaveLength(1);
    expect(JSON.parse(String(posts[0]![1]!.body))).toEqual({
      lines: [{ lineId: 11, qty: 6 }],
      carrier: 'Road Freight Co',
      trackingNumber: 'RF-1',
      shipDate: '2026-12-01',
    });
    const headers = posts[0]![1]!.headers as Record<string, string>;
    expect(headers['Idempotency-Key']).toMatch(/^[0-9a-f-]{36}$/);
    expect(headers).not.toHaveProperty('Authorization');
    expect(wrapper.get('[role="status"]').text()).toContain('expected at the plant on');
  });

  it('shows the server’s refusal beside the line it names', async () => {
    stubShipping(() =>
      jsonResponse(422, {
        error: {
          code: 'refused',
          message: 'The ship notice does not fit release R261201-SRM.',
          details: [{ path: ['lines', 0, 'qty'], message: 'line 11 (TNK-R60): 6 is more than the 5 still open' }],
        },
      }),
    );
    const wrapper = await openForm();
    setQty(wrapper, 'CAP-20', '0');
    await wrapper.get('input[aria-label="Carrier"]').setValue('Road Freight Co');
    await wrapper.get('input[aria-label="Tracking number"]').setValue('RF-1');

    getButton(wrapper.element, 'Send ship notice').click();
    await flushPromises();

    expect(wrapper.get('[role="alert"]').text()).toBe('The ship notice does not fit release R261201-SRM.');
    expect(wrapper.text()).toContain('Line 11 (TNK-R60): 6 is more than the 5 still open');
  });

  it('keeps a negative or more than still open as typed, says so beside the line and sends nothing', async () => {
    const fetchMock = stubShipping(() => jsonResponse(201, sent));
    const wrapper = await openForm();
    setQty(wrapper, 'TNK-R60', '-2');
    setQty(wrapper, 'CAP-20', '9');
    await flushPromises();
    await wrapper.get('input[aria-label="Carrier"]').setValue('Road Freight Co');
    await wrapper.get('input[aria-label="Tracking number"]').setValue('RF-1');

    getButton(wrapper.element, 'Send ship notice').click();
    await flushPromises();

    expect(fetchMock.mock.calls.filter(([, init]) => init?.method === 'POST')).toHaveLength(0);
    const box = (partNumber: string) =>
      wrapper.get<HTMLInputElement>(`input[aria-label="Quantity of ${partNumber} on this shipment"]`).element;
    expect([box('TNK-R60').value, box('CAP-20').value]).toEqual(['-2', '9']);
    expect(wrapper.text()).toContain('Must be 0 or more.');
    expect(wrapper.text()).toContain('At most 8 pcs on this line.');
  });

  it('asks for a carrier before sending anything', async () => {
    const fetchMock = stubShipping(() => jsonResponse(201, sent));
    const wrapper = await openForm();

    getButton(wrapper.element, 'Send ship notice').click();
    await flushPromises();

    expect(fetchMock.mock.calls.filter(([, init]) => init?.method === 'POST')).toHaveLength(0);
    expect(wrapper.text()).toContain('Name the carrier.');
  });
});
