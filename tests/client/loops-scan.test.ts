import { createAppContext, demoUsers, jsonResponse, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { CardScanResponse } from '@shared/schemas/loops';
import LoopsScanView from '@/views/LoopsScanView.vue';

/**
 * Card 1 of loop 45: data digits 0000045 0001, check digit by the GS1 mod-10 rule (GS1 General
 * Specifications, section 7.9): weights 3,1,3… from the right give 1×3 + 5×3 + 4×1 = 22, and
 * 10 − 2 = 8, so the printed number is 000004500018.
 */
const CARD = '000004500018';

function scanned(fromState: 'full', toState: 'empty', event: 'consume'): CardScanResponse {
  return {
    card: {
      id: 2,
      loopId: 45,
      partNumber: 'ACT-DK36',
      cardNumber: CARD,
      cardIndex: 1,
      state: toState,
      stateChangedAt: '2026-12-01T08:00:00.000Z',
      retired: false,
      retiredAt: null,
      releaseLineId: null,
    },
    scan: { id: 7, event, fromState, toState, userEmail: 'buyer@example.com', scannedAt: '2026-12-01T08:00:00.000Z' },
  };
}

function stubScans(...answers: Response[]) {
  const fetchMock = vi.fn<typeof fetch>();
  for (const answer of answers) fetchMock.mockResolvedValueOnce(answer);
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

async function openScan() {
  const context = await createAppContext({ user: demoUsers.buyer, path: '/scan' });
  const wrapper = await mountInApp(LoopsScanView, context);
  const input = document.getElementById('card-scan-input') as HTMLInputElement;
  return { wrapper, input };
}

// A keyboard-wedge scanner types the digits, then Enter.
async function wedgeScan(input: HTMLInputElement, digits: string): Promise<void> {
  input.value = digits;
  input.dispatchEvent(new Event('input'));
  await flushPromises();
  input.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', code: 'Enter', bubbles: true }));
  await flushPromises();
  await flushPromises();
}

function feedback(): string {
  return document.querySelector('[data-test="scan-feedback"]')?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
}

describe('LoopsScanView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('puts the cursor in the card box on arrival', async () => {
    const { input } = await openScan();

    expect(document.activeElement).toBe(input);
  });

  it('sends the number on Enter without an event, clears the box, keeps focus and reports full → empty', async () => {
    const fetchMock = stubScans(jsonResponse(201, scanned('full', 'empty', 'consume')));
    const { input } = await openScan();

    await wedgeScan(input, CARD);

    expect(fetchMock).toHaveBeenCalledTimes(1);
    const [url, init] = fetchMock.mock.calls[0]!;
    expect(String(url)).toBe('/api/kanban/scans');
    expect(JSON.parse(String(init?.body))).toEqual({ cardNumber: CARD });
    expect(input.value).toBe('');
    expect(document.activeElement).toBe(input);
    expect(feedback()).toContain('Full → Empty');
    expect(feedback()).toContain(`${CARD} · ACT-DK36 · Signal empty`);
    expect(document.querySelector('[data-test="scan-history"]')?.textContent).toContain('ACT-DK36: Full → Empty');
  });

  it('sends the chosen “Signal empty” with the number', async () => {
    const fetchMock = stubScans(jsonResponse(201, scanned('full', 'empty', 'consume')));
    const { wrapper, input } = await openScan();
    wrapper.findComponent({ name: 'ElRadioGroup' }).vm.$emit('update:modelValue', 'consume');
    await flushPromises();

    await wedgeScan(input, CARD);

    expect(JSON.parse(String(fetchMock.mock.calls[0]![1]?.body))).toEqual({ cardNumber: CARD, event: 'consume' });
    expect(feedback()).toContain('Full → Empty');
  });

  it('offers no scan that orders or ships a card, and sends a card to be received to its dock check-in', async () => {
    const fetchMock = stubScans();
    const context = await createAppContext({ user: demoUsers.buyer, path: '/scan' });
    const wrapper = await mountInApp(LoopsScanView, context);
    const input = document.getElementById('card-scan-input') as HTMLInputElement;
    const choices = [...document.querySelectorAll('.el-radio-button')].map((choice) => choice.textContent?.trim());
    wrapper.findComponent({ name: 'ElRadioGroup' }).vm.$emit('update:modelValue', 'receive');
    await flushPromises();

    await wedgeScan(input, CARD);
    // The dock screen is loaded on demand before the route changes.
    await waitFor(() => expect(context.router.currentRoute.value.name).toBe('dock'));

    expect(choices).toEqual(['By card state', 'Signal empty', 'Count in at the dock']);
    expect(fetchMock.mock.calls.some(([url]) => String(url) === '/api/kanban/scans')).toBe(false);
    expect(context.router.currentRoute.value.query).toEqual({ card: CARD });
  });

  it('explains a wrong check digit in words and stays ready for the next card', async () => {
    const message =
      'The check digit of 000004500017 is wrong: a digit was misread or mistyped. Scan or type the number again.';
    stubScans(
      jsonResponse(400, {
        error: { code: 'invalid_input', message, details: [{ path: ['cardNumber'], message }] },
      }),
    );
    const { input } = await openScan();

    await wedgeScan(input, '000004500017');

    expect(feedback()).toContain('Not a valid card number');
    expect(feedback()).toContain(message);
    expect(input.value).toBe('');
    expect(document.activeElement).toBe(input);
  });

  it('names the card’s current state once when the move is not allowed', async () => {
    const message = `Card ${CARD} is ordered; a scan only empties a full card. Count its delivery in at the dock to make it full again.`;
    stubScans(
      jsonResponse(409, {
        error: { code: 'conflict', message, details: [{ currentState: 'ordered', event: null }] },
      }),
    );
    const { input } = await openScan();

    await wedgeScan(input, CARD);

    expect(feedback()).toContain('Not allowed in this state');
    expect(feedback()).toContain(message);
    // Said once, in the server's sentence, not repeated above it.
    expect(feedback().match(/is ordered/g)).toHaveLength(1);
  });

  it('ignores Enter on an empty box', async () => {
    const fetchMock = stubScans();
    const { input } = await openScan();

    await wedgeScan(input, '   ');

    expect(fetchMock).not.toHaveBeenCalled();
    expect(feedback()).toContain('Ready to scan');
  });
});
