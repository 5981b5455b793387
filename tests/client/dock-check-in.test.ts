import { createAppContext, getButton, jsonResponse, mountInApp } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { DockItem, DockLine } from '@shared/schemas/dock';
import type { OverCheckResponse, ReceiptRequest, ReceiptResponse } from '@shared/schemas/receipts';
import type { SessionUser } from '@shared/schemas/user';
import DockCheckInDialog from '@/components/DockCheckInDialog.vue';
import { newIdempotencyKey } from '@/api/idempotency-key';
import { countProblem, parseCount, suggestDiscrepancy } from '@/components/dock-presentation';

const receiving: SessionUser = {
  email: 'receiving@example.com',
  name: 'Rae Receiving',
  role: 'receiving',
  supplierCode: null,
};

function line(id: number, partNumber: string, qty: number, overrides: Partial<DockLine> = {}): DockLine {
  return {
    id,
    partNumber,
    description: `Part ${partNumber}`,
    uom: 'H87',
    qty,
    receivedQty: 0,
    open: true,
    needDate: '2026-12-07',
    hazardous: false,
    ...overrides,
  };
}

/** A shipment (ship notice 9) of release 3, unless the test says otherwise. */
function itemWith(lines: DockLine[], overrides: Partial<DockItem> = {}): DockItem {
  return {
    id: 'shipment-9',
    kind: 'shipment',
    releaseId: 3,
    shipNoticeId: 9,
    number: 'R261201-FBS',
    supplierCode: 'FBS',
    supplierName: 'Supplier F',
    column: 'at_dock',
    status: 'shipped',
    shipDate: '2026-12-03',
    arrivalDate: '2026-12-07',
    expectedToday: false,
    overdue: false,
    carrier: null,
    trackingNumber: null,
    hazardous: lines.some((candidate) => candidate.hazardous),
    lines,
    attachments: [],
    ...overrides,
  };
}

/** The server's answer to a receipt: it echoes the count; `onHand` is whatever the test says. */
function receiptAnswer(request: ReceiptRequest, partNumber: string, onHand: number): ReceiptResponse {
  return {
    receipt: {
      id: request.releaseLineId * 10,
      releaseLineId: request.releaseLineId,
      releaseNumber: 'R261201-FBS',
      partNumber,
      qty: request.qty,
      shipNoticeId: request.shipNoticeId ?? null,
      discrepancy: request.discrepancy ?? null,
      note: request.note ?? null,
      final: request.close ?? false,
      addedToOnHand: request.qty,
      overAction: request.overAction ?? null,
      excessQty: 0,
      returnedQty: 0,
      appliedTo: [],
      onHandAfter: onHand,
      userEmail: receiving.email,
      receivedAt: '2026-12-01T09:00:00.000Z',
    },
    onHand,
  };
}

/** The server's over-check answer for a count above what is still to come. */
function overCheck(overrides: Partial<OverCheckResponse> & { releaseLineId: number }): OverCheckResponse {
  return {
    orderedQty: 10,
    receivedQty: 0,
    overTolerancePct: 0,
    limitQty: 10,
    over: true,
    excessQty: 0,
    keep: { appliedTo: [], unallocatedQty: 0 },
    ...overrides,
  };
}

/** Answers GET /api/receipts/over-check from the given answers by line, and receipts with their echo. */
function overCheckFetch(answers: Record<number, OverCheckResponse>, onHand = 0) {
  return vi.fn<typeof fetch>((input, init) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname === '/api/receipts/over-check') {
      return Promise.resolve(jsonResponse(200, answers[Number(url.searchParams.get('releaseLineId'))]));
    }
    const body = JSON.parse(String(init?.body)) as ReceiptRequest;
    return Promise.resolve(jsonResponse(201, receiptAnswer(body, 'PAD-26', onHand)));
  });
}

interface SentReceipt {
  key: string | null;
  body: ReceiptRequest;
}

function receiptCalls(fetchMock: ReturnType<typeof vi.fn<typeof fetch>>): SentReceipt[] {
  return fetchMock.mock.calls
    .filter(([input]) => String(input) === '/api/receipts')
    .map(([, init]) => ({
      key: (init?.headers as Record<string, string>)['Idempotency-Key'] ?? null,
      body: JSON.parse(String(init?.body)) as ReceiptRequest,
    }));
}

async function openDialog(item: DockItem, focusLineId: number | null = null) {
  const context = await createAppContext({ user: receiving, path: '/dock' });
  const wrapper = await mountInApp(DockCheckInDialog, context, {
    props: { modelValue: true, item, focusLineId, editable: true },
  });
  await flushPromises();
  return wrapper;
}

function lineElement(partNumber: string): HTMLElement {
  const element = document.querySelector<HTMLElement>(`[data-test="check-in-line"][data-part="${partNumber}"]`);
  if (!element) throw new Error(`no line ${partNumber}`);
  return element;
}

function countBox(partNumber: string): HTMLInputElement {
  return lineElement(partNumber).querySelector<HTMLInputElement>('input[inputmode="decimal"]')!;
}

async function type(input: HTMLInputElement, text: string): Promise<void> {
  input.value = text;
  input.dispatchEvent(new Event('input'));
  await flushPromises();
}

function discrepancyShown(partNumber: string): string {
  return lineElement(partNumber).querySelector('.el-select')?.textContent?.trim() ?? '';
}

/** The discrepancy drop-down of one line, as the component that emits the choice. */
function discrepancySelect(wrapper: Awaited<ReturnType<typeof openDialog>>, partNumber: string) {
  const select = wrapper
    .findAllComponents({ name: 'ElSelect' })
    .find((candidate) => lineElement(partNumber).contains(candidate.element));
  if (!select) throw new Error(`no discrepancy choice on ${partNumber}`);
  return select;
}

async function record(): Promise<void> {
  getButton(document.body, 'Record counts').click();
  await flushPromises();
  await flushPromises();
}

describe('check-in helpers', () => {
  it('reads a count typed with a decimal point or comma, and nothing else', () => {
    expect([
      parseCount('24'),
      parseCount(' 12.5 '),
      parseCount('12,5'),
      parseCount(''),
      parseCount('-3'),
      parseCount('1e3'),
    ]).toEqual([24, 12.5, 12.5, null, null, null]);
  });

  it('says what is wrong with a typed count: a minus sign, half a piece, or no number at all', () => {
    expect([
      countProblem('-4', 'H87'),
      countProblem('-0,5', 'KGM'),
      countProblem('12.5', 'H87'),
      countProblem('abc', 'H87'),
      countProblem('abc', 'KGM'),
      countProblem('24', 'H87'),
      countProblem('12,5', 'KGM'),
    ]).toEqual([
      'Must be 0 or more.',
      'Must be 0 or more.',
      'Must be a whole number of pcs.',
      'Type the counted quantity as a whole number, e.g. 24.',
      'Type the counted quantity as a number, e.g. 24 or 12.5.',
      null,
      null,
    ]);
  });

  it('suggests short below what is still to come, and nothing from the count alone above it', () => {
    // Common practice, no source: a count below the remaining quantity is a short delivery. Above
    // it, only the supplier's tolerance makes a count over, and the server's over-check says so.
    expect([suggestDiscrepancy(8, 10), suggestDiscrepancy(12, 10), suggestDiscrepancy(10, 10)]).toEqual([
      'short',
      null,
      null,
    ]);
  });

  it('makes version-4 UUID keys even where crypto.randomUUID is missing (plain-http pages)', () => {
    // RFC 9562, section 5.4 (UUID version 4): version nibble 4, variant bits 10 (8, 9, a or b).
    const layout = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;
    const realCrypto = globalThis.crypto;
    vi.stubGlobal('crypto', { getRandomValues: (bytes: Uint8Array<ArrayBuffer>) => realCrypto.getRandomValues(bytes) });
    const keys = Array.from({ length: 50 }, () => newIdempotencyKey());
    vi.unstubAllGlobals();

    expect(keys.every((key) => layout.test(key))).toBe(true);
    expect(new Set(keys).size).toBe(50);
  });
});

describe('DockCheckInDialog', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('starts every count box empty, so the clerk has to count', async () => {
    vi.stubGlobal('fetch', vi.fn());
    await openDialog(itemWith([line(1, 'BRUSH-20', 40), line(2, 'PAD-26', 10)]));

    expect(countBox('BRUSH-20').value).toBe('');
    expect(countBox('PAD-26').value).toBe('');
    expect(lineElement('BRUSH-20').querySelector('[data-test="ordered-qty"]')?.textContent).toBe('40 pcs');
    expect(lineElement('BRUSH-20').textContent).toContain('On this shipment 40 pcs');
  });

  it('counts the lines of a card with no ship notice against no shipment', async () => {
    const fetchMock = vi.fn<typeof fetch>((_input, init) =>
      Promise.resolve(
        jsonResponse(201, receiptAnswer(JSON.parse(String(init?.body)) as ReceiptRequest, 'BRUSH-20', 12)),
      ),
    );
    vi.stubGlobal('fetch', fetchMock);
    await openDialog(
      itemWith([line(1, 'BRUSH-20', 12)], {
        id: 'expected-3-2026-12-07',
        kind: 'expected',
        shipNoticeId: null,
        shipDate: null,
      }),
    );
    const shown = lineElement('BRUSH-20').textContent;
    await type(countBox('BRUSH-20'), '12');

    await record();

    expect(shown).toContain('Expected 12 pcs');
    expect(receiptCalls(fetchMock).map((call) => call.body.shipNoticeId)).toEqual([null]);
  });

  it('suggests Short or Over from the count, and keeps a discrepancy chosen by hand', async () => {
    vi.stubGlobal('fetch', overCheckFetch({ 2: overCheck({ releaseLineId: 2, orderedQty: 10, excessQty: 2 }) }));
    const wrapper = await openDialog(itemWith([line(1, 'BRUSH-20', 40), line(2, 'PAD-26', 10)]));

    await type(countBox('BRUSH-20'), '35');
    await type(countBox('PAD-26'), '12');
    const shortThenOver = [discrepancyShown('BRUSH-20'), discrepancyShown('PAD-26')];
    await type(countBox('BRUSH-20'), '40');
    const matched = discrepancyShown('BRUSH-20');
    discrepancySelect(wrapper, 'BRUSH-20').vm.$emit('update:modelValue', 'damaged');
    await flushPromises();
    await type(countBox('BRUSH-20'), '30');

    expect(shortThenOver).toEqual(['Short', 'Over']);
    expect(matched).toBe('None');
    expect(discrepancyShown('BRUSH-20')).toBe('Damaged');
    expect(lineElement('BRUSH-20').textContent).toContain('not added to usable stock');
  });

  it('suggests Short again when an over count is corrected below what is expected', async () => {
    vi.stubGlobal('fetch', overCheckFetch({ 2: overCheck({ releaseLineId: 2, orderedQty: 10, excessQty: 90 }) }));
    await openDialog(itemWith([line(2, 'PAD-26', 10)]));

    await type(countBox('PAD-26'), '100');
    const over = discrepancyShown('PAD-26');
    await type(countBox('PAD-26'), '5');

    expect(over).toBe('Over');
    expect(discrepancyShown('PAD-26')).toBe('Short');
  });

  it('sends one receipt per counted line with its own Idempotency-Key and shows the new on-hand', async () => {
    const fetchMock = vi.fn<typeof fetch>((_input, init) => {
      const body = JSON.parse(String(init?.body)) as ReceiptRequest;
      return Promise.resolve(
        jsonResponse(
          201,
          receiptAnswer(body, body.releaseLineId === 1 ? 'BRUSH-20' : 'PAD-26', body.releaseLineId === 1 ? 50 : 7),
        ),
      );
    });
    vi.stubGlobal('fetch', fetchMock);
    const wrapper = await openDialog(itemWith([line(1, 'BRUSH-20', 40), line(2, 'PAD-26', 10), line(3, 'DECAL-S', 5)]));
    await type(countBox('BRUSH-20'), '40');
    await type(countBox('PAD-26'), '7');

    await record();

    const sent = receiptCalls(fetchMock);
    expect(sent.map((call) => call.body)).toEqual([
      { releaseLineId: 1, shipNoticeId: 9, qty: 40, discrepancy: null, note: null, close: false },
      { releaseLineId: 2, shipNoticeId: 9, qty: 7, discrepancy: 'short', note: null, close: false },
    ]);
    expect(sent[0]!.key).toEqual(expect.any(String));
    expect(sent[0]!.key).not.toBe(sent[1]!.key);
    expect(lineElement('BRUSH-20').querySelector('[data-test="on-hand"]')?.textContent).toBe('On hand now: 50 pcs');
    expect(lineElement('PAD-26').querySelector('[data-test="on-hand"]')?.textContent).toBe('On hand now: 7 pcs');
    expect(countBox('DECAL-S').value).toBe('');
    expect(wrapper.emitted('checked-in')).toHaveLength(1);
  });

  it('sends the same key again when the clerk retries after a lost answer, so nothing counts twice', async () => {
    const fetchMock = vi.fn<typeof fetch>();
    fetchMock.mockRejectedValueOnce(new TypeError('network down'));
    fetchMock.mockImplementationOnce((_input, init) =>
      Promise.resolve(
        jsonResponse(200, receiptAnswer(JSON.parse(String(init?.body)) as ReceiptRequest, 'BRUSH-20', 50)),
      ),
    );
    vi.stubGlobal('fetch', fetchMock);
    await openDialog(itemWith([line(1, 'BRUSH-20', 40)]));
    await type(countBox('BRUSH-20'), '40');

    await record();
    const problem = lineElement('BRUSH-20').querySelector('[role="alert"]')?.textContent ?? '';
    await record();

    const sent = receiptCalls(fetchMock);
    expect(problem).toContain('cannot be reached');
    expect(sent).toHaveLength(2);
    expect(sent[1]!.key).toBe(sent[0]!.key);
    expect(sent[1]!.body).toEqual(sent[0]!.body);
    expect(lineElement('BRUSH-20').querySelector('[data-test="on-hand"]')?.textContent).toBe('On hand now: 50 pcs');
  });

  it('keeps a negative count as typed, says it must be 0 or more and sends nothing', async () => {
    const fetchMock = vi.fn<typeof fetch>();
    vi.stubGlobal('fetch', fetchMock);
    await openDialog(itemWith([line(1, 'BRUSH-20', 40)]));
    await type(countBox('BRUSH-20'), '-4');

    await record();

    expect(fetchMock).not.toHaveBeenCalled();
    expect(countBox('BRUSH-20').value).toBe('-4');
    expect(lineElement('BRUSH-20').querySelector('[role="alert"]')?.textContent).toBe('Must be 0 or more.');

    // A new count takes the message away; half a piece is no shortfall to speak of.
    await type(countBox('BRUSH-20'), '2.5');
    expect(lineElement('BRUSH-20').querySelector('[role="alert"]')).toBeNull();
    expect(lineElement('BRUSH-20').textContent).not.toContain('37.5');
  });

  it('refuses a count of 0 without a discrepancy before sending anything', async () => {
    const fetchMock = vi.fn<typeof fetch>();
    vi.stubGlobal('fetch', fetchMock);
    const wrapper = await openDialog(itemWith([line(1, 'BRUSH-20', 40)]));
    await type(countBox('BRUSH-20'), '0');
    discrepancySelect(wrapper, 'BRUSH-20').vm.$emit('update:modelValue', '');
    await flushPromises();

    await record();

    expect(fetchMock).not.toHaveBeenCalled();
    expect(lineElement('BRUSH-20').textContent).toContain('A count of 0 needs a discrepancy');
  });

  it('asks keep or send back for a count over the tolerance, says what each does, and sends the choice', async () => {
    const answer = overCheck({
      releaseLineId: 2,
      orderedQty: 12,
      limitQty: 12,
      excessQty: 18,
      keep: {
        appliedTo: [
          { releaseLineId: 8, releaseNumber: 'R261209-FBS', due: '2026-12-09', qty: 10, closes: true },
          { releaseLineId: 9, releaseNumber: 'R261214-FBS', due: '2026-12-14', qty: 8, closes: false },
        ],
        unallocatedQty: 0,
      },
    });
    const fetchMock = overCheckFetch({ 2: answer }, 30);
    vi.stubGlobal('fetch', fetchMock);
    await openDialog(itemWith([line(2, 'PAD-26', 12)]));
    await type(countBox('PAD-26'), '30');

    const choice = lineElement('PAD-26').querySelector('[data-test="over-choice"]');
    const keep = choice?.querySelector('[data-test="keep-words"]')?.textContent ?? '';
    const back = choice?.querySelector('[data-test="return-words"]')?.textContent ?? '';
    const shownAs = discrepancyShown('PAD-26');
    await record();
    const refused = lineElement('PAD-26').querySelector('[role="alert"]')?.textContent ?? '';
    const sentBeforeChoice = receiptCalls(fetchMock).length;
    choice!.querySelector<HTMLInputElement>('input[value="return"]')!.click();
    await flushPromises();
    await record();

    expect(keep).toContain('10 pcs go to R261209-FBS, line due Wed 9 Dec (it closes)');
    expect(keep).toContain('8 pcs go to R261214-FBS, line due Mon 14 Dec');
    expect(back).toBe('18 pcs go back to the supplier; this line closes at 12 pcs.');
    expect(shownAs).toBe('Over');
    expect(refused).toContain('Choose Keep them or Send them back for the 18 extra');
    expect(sentBeforeChoice).toBe(0);
    expect(receiptCalls(fetchMock).map((call) => call.body)).toEqual([
      {
        releaseLineId: 2,
        shipNoticeId: 9,
        qty: 30,
        discrepancy: 'over',
        note: null,
        close: false,
        overAction: 'return',
      },
    ]);
  });

  it('asks nothing for a count within the tolerance, and says a short line stays open or closes short', async () => {
    vi.stubGlobal(
      'fetch',
      overCheckFetch({ 1: overCheck({ releaseLineId: 1, orderedQty: 20, limitQty: 22, over: false }) }),
    );
    await openDialog(itemWith([line(1, 'BRUSH-20', 20), line(2, 'PAD-26', 10)]));

    await type(countBox('BRUSH-20'), '22');
    await type(countBox('PAD-26'), '7');
    const open = lineElement('PAD-26').querySelector('[data-test="short-words"]')?.textContent?.trim();
    lineElement('PAD-26').querySelector<HTMLInputElement>('.el-checkbox input')!.click();
    await flushPromises();

    expect(lineElement('BRUSH-20').querySelector('[data-test="over-choice"]')).toBeNull();
    expect(discrepancyShown('BRUSH-20')).toBe('None');
    expect(open).toBe('The line stays open for the other 3 pcs; tick Final to close it short.');
    expect(lineElement('PAD-26').querySelector('[data-test="short-words"]')?.textContent?.trim()).toBe(
      'Closes short: the other 3 pcs will not come.',
    );
  });

  it('says the caution once per part, with its UN number, class, weight and data sheet', async () => {
    vi.stubGlobal('fetch', vi.fn());
    const battery = {
      hazardous: true,
      unNumber: '2800',
      hazardClass: '8',
      unitWeightKg: 31,
      heavyLift: true,
      sdsUrl: 'https://sds.example.com/bat-12.pdf',
    };

    await openDialog(itemWith([line(1, 'BAT-12', 4, battery), line(2, 'BAT-12', 8, battery), line(3, 'BRUSH-20', 40)]));

    const notes = [...document.querySelectorAll('[data-test="safety-note"]')].map((note) => note.textContent?.trim());
    expect(notes).toEqual(['BAT-12: dangerous goods UN 2800, class 8; heavy: 31 kg each safety data sheet']);
    const caution = document.querySelector('[data-test="hazard-caution"]')?.textContent ?? '';
    expect(caution).toContain('use the lifting aid the plant prescribes');
    expect(caution).toContain('the plant’s own safety practice');
  });

  it('shows the handling caution when a line carries a hazardous part, and puts a scanned card’s line first', async () => {
    vi.stubGlobal('fetch', vi.fn());

    await openDialog(
      itemWith([line(1, 'BRUSH-20', 40), line(2, 'BATT-24V', 4, { hazardous: true, cardNumber: '000004500018' })]),
      2,
    );

    const caution = document.querySelector('[data-test="hazard-caution"]')?.textContent ?? '';
    expect(caution).toContain('Hazardous goods: BATT-24V');
    expect(caution).toContain('check the packaging for damage or leaks before handling');
    expect(
      [...document.querySelectorAll('[data-test="check-in-line"]')].map((element) => element.getAttribute('data-part')),
    ).toEqual(['BATT-24V', 'BRUSH-20']);
  });
});
