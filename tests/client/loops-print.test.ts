import { createAppContext, demoUsers, jsonResponse, mountInApp } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { gs1CheckDigit } from '@shared/domain/gs1';
import type { CardLabel, KanbanLoop } from '@shared/schemas/loops';
import LoopsPrintQr from '@/components/LoopsPrintQr.vue';
import LoopsPrintView from '@/views/LoopsPrintView.vue';

// The shape the server's QR library writes: a white square and one path of dark modules.
const QR_SVG =
  '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 23 23" shape-rendering="crispEdges">' +
  '<path fill="#ffffff" d="M0 0h23v23H0z"/><path stroke="#000000" d="M1 1.5h7m1 0h1"/></svg>\n';

describe('LoopsPrintQr', () => {
  it('shows the QR drawing as an image, where markup cannot run', () => {
    const wrapper = mount(LoopsPrintQr, { props: { svg: QR_SVG, cardNumber: '000004500018' } });

    const image = wrapper.get('img');
    expect(image.attributes('alt')).toBe('QR code of card 000004500018');
    expect(decodeURIComponent(image.attributes('src')!.split(',')[1])).toBe(QR_SVG);
  });

  it('shows words instead of a drawing that is not SVG', () => {
    const wrapper = mount(LoopsPrintQr, { props: { svg: '<b>not a code</b>', cardNumber: '000004500018' } });

    expect(wrapper.text()).toBe('QR code unavailable');
    expect(wrapper.find('b').exists()).toBe(false);
  });
});

/** Card numbers as the server prints them: loop id to 7 digits, index to 4, GS1 check digit. */
function cardNumberOf(loopId: number, index: number): string {
  const data = `${String(loopId).padStart(7, '0')}${String(index).padStart(4, '0')}`;
  return `${data}${gs1CheckDigit(data)}`;
}

function labelOf(index: number, count: number, hazardous = false): CardLabel {
  return {
    loopId: 52,
    kind: 'supplier',
    cardNumber: cardNumberOf(52, index),
    cardIndex: index,
    position: index,
    count,
    retired: false,
    partNumber: 'BAT-12-105',
    description: 'Battery 12 V 105 Ah, AGM',
    pointOfUse: 'L1-ST08',
    supplierCode: 'FBS',
    supplierName: 'Ferncombe Battery Supply',
    containerQty: 4,
    uom: 'H87',
    hazardous,
    qrSvg: QR_SVG,
  };
}

const loop = { id: 52, partNumber: 'BAT-12-105', description: 'Battery 12 V 105 Ah, AGM' } as KanbanLoop;

describe('LoopsPrintView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    document.documentElement.className = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('lays nine labels out eight to an A4 sheet, with QR code, card number and “card k of n”', async () => {
    const labels = Array.from({ length: 9 }, (_, offset) => labelOf(offset + 1, 9, true));
    vi.stubGlobal(
      'fetch',
      vi.fn<typeof fetch>((input) =>
        Promise.resolve(jsonResponse(200, String(input).includes('/labels') ? labels : loop)),
      ),
    );
    const context = await createAppContext({ user: demoUsers.buyer, path: '/loops/52/print' });

    const wrapper = await mountInApp(LoopsPrintView, context);
    await flushPromises();

    const sheets = wrapper.findAll('.loop-print-view__sheet');
    expect(sheets.map((sheet) => sheet.findAll('[data-test="card-label"]').length)).toEqual([8, 1]);
    const first = sheets[0]!.find('[data-test="card-label"]');
    expect(first.find('[data-test="card-number"]').text().replace(/\s/g, '')).toBe(cardNumberOf(52, 1));
    expect(first.text()).toContain('card 1 of 9');
    expect(first.get('img').attributes('src')).toMatch(/^data:image\/svg\+xml/);
    expect(first.text()).toContain('Hazardous material — follow the plant’s handling rules');
    expect(document.documentElement.classList.contains('is-printing-card-labels')).toBe(true);
  });

  it('asks for every issued card when “All issued” is chosen', async () => {
    const fetchMock = vi.fn<typeof fetch>((input) =>
      Promise.resolve(jsonResponse(200, String(input).includes('/labels') ? [labelOf(1, 1)] : loop)),
    );
    vi.stubGlobal('fetch', fetchMock);
    const context = await createAppContext({ user: demoUsers.buyer, path: '/loops/52/print' });
    const wrapper = await mountInApp(LoopsPrintView, context);

    wrapper.findComponent({ name: 'ElRadioGroup' }).vm.$emit('update:modelValue', 'all');
    await flushPromises();

    const labelUrls = fetchMock.mock.calls.map(([input]) => String(input)).filter((url) => url.includes('/labels'));
    expect(labelUrls).toEqual(['/api/kanban/loops/52/labels?cards=active', '/api/kanban/loops/52/labels?cards=all']);
  });
});
