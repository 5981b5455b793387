import { createAppContext, getButton, jsonResponse, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { addCalendarDays } from '@shared/domain/date';
import type { LineRiskReport, ShortageDto } from '@shared/schemas/line-risk';
import type { SessionUser } from '@shared/schemas/user';
import LineRiskView from '@/views/LineRiskView.vue';
import {
  actionSentence,
  awaitingNote,
  expediteSentence,
  groupShortages,
  impactLevel,
  impactWhen,
  needByLines,
  needBySummary,
} from '@/components/line-risk-presentation';
import { resequenceSentence } from '@shared/format/rescue-words';
import { formatQuantity, localToday } from '@/format';

const planner: SessionUser = { email: 'planner@example.com', name: 'Pat Planner', role: 'planner', supplierCode: null };

const battery: ShortageDto = {
  partNumber: 'BAT-06-312',
  firstShortDate: '2026-12-03',
  shortQty: 12,
  slotsAtRisk: [
    { date: '2026-12-03', sequence: 13, serial: 'SN26120313', model: 'FS-32R', lackQty: 6, via: null },
    { date: '2026-12-03', sequence: 17, serial: 'SN26120317', model: 'FS-40R', lackQty: 6, via: null },
  ],
  slotsAtRiskCount: 2,
  action: 'expedite',
  needBy: [{ date: '2026-12-03', qty: 12 }],
  releaseBy: null,
  leadTimeDays: 7,
  loop: null,
  description: 'Battery 6 V 312 Ah, flooded lead-acid',
  uom: 'H87',
  supplierCode: 'FBS',
  supplierName: 'Battery Supply Co',
  hazardous: true,
  onHand: 30,
  firmReceiptQty: 0,
  awaitingConfirmation: null,
  daysUntilImpact: 2,
  inFrozenWindow: true,
  rescue: {
    expedite: { qty: 12, needBy: '2026-12-03' },
    resequence: {
      slot: { date: '2026-12-03', sequence: 13, serial: 'SN26120313', model: 'FS-32R' },
      candidate: { date: '2026-12-03', sequence: 14, serial: 'SN26120314', model: 'FS-20W' },
    },
  },
};

const tank: ShortageDto = {
  ...battery,
  partNumber: 'TNK-R60',
  firstShortDate: '2026-12-08',
  shortQty: 3,
  slotsAtRisk: [{ date: '2026-12-08', sequence: 2, serial: 'SN26120802', model: 'FS-26W', lackQty: 1, via: null }],
  slotsAtRiskCount: 1,
  needBy: [{ date: '2026-12-08', qty: 3 }],
  description: 'Recovery tank 60 L',
  supplierCode: 'SRM',
  supplierName: null,
  hazardous: false,
  daysUntilImpact: 5,
  inFrozenWindow: false,
  rescue: { expedite: { qty: 3, needBy: '2026-12-08' }, resequence: null },
};

// A welding wire short through made frames: a loop with too few cards.
const wire: ShortageDto = {
  ...battery,
  partNumber: 'WLD-W10',
  uom: 'KGM',
  action: 'loop',
  firstShortDate: '2026-12-09',
  shortQty: 4.5,
  needBy: [
    { date: '2026-12-09', qty: 2 },
    { date: '2026-12-10', qty: 2.5 },
  ],
  slotsAtRisk: [
    { date: '2026-12-11', sequence: 3, serial: 'SN26121103', model: 'FS-32R', lackQty: 0.35, via: 'FRM-32R' },
  ],
  slotsAtRiskCount: 1,
  loop: { activeCards: 2, recommendedCards: 5 },
  hazardous: false,
  daysUntilImpact: 6,
  inFrozenWindow: false,
  description: 'Welding wire 1.0 mm',
  supplierCode: 'HSS',
  supplierName: null,
  rescue: { expedite: { qty: 2, needBy: '2026-12-09' }, resequence: null },
};

const drum: ShortageDto = {
  ...tank,
  partNumber: 'DRM-R15',
  action: 'count',
  onHand: -2,
  needBy: [{ date: '2026-12-10', qty: 2 }],
  shortQty: 2,
};

// Short in three weeks: the release due on Mon 14 Dec covers it.
const squeegee: ShortageDto = {
  ...tank,
  partNumber: 'SQG-W',
  action: 'release',
  firstShortDate: '2026-12-22',
  releaseBy: '2026-12-14',
  leadTimeDays: 6,
  needBy: [{ date: '2026-12-22', qty: 8 }],
  shortQty: 8,
  daysUntilImpact: 14,
  inFrozenWindow: false,
  rescue: { expedite: { qty: 8, needBy: '2026-12-22' }, resequence: null },
};

function reportOf(shortages: ShortageDto[]): LineRiskReport {
  return {
    from: '2026-12-01',
    to: '2026-12-14',
    today: '2026-12-01',
    days: ['2026-12-01', '2026-12-02', '2026-12-03'],
    frozenWindowDays: 3,
    frozenUntil: '2026-12-03',
    unitsInHorizon: 240,
    unitsBuilt: 237,
    unitsAtRisk: shortages.flatMap((shortage) =>
      shortage.slotsAtRisk.map(({ lackQty, via, ...slot }) => ({
        ...slot,
        lacks: [{ partNumber: shortage.partNumber, qty: lackQty, now: true, via, neededOn: slot.date }],
      })),
    ),
    unitsAtRiskCount: shortages.reduce((sum, shortage) => sum + shortage.slotsAtRisk.length, 0),
    shortages,
  };
}

type Answer = (url: URL) => Response;

/** Answers each API path with a handler; the event stream stays silent unless given. */
function stubApi(answers: Record<string, Answer>, events?: () => Response) {
  const fetchMock = vi.fn<typeof fetch>((input) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname === '/api/events')
      return events ? Promise.resolve(events()) : new Promise<Response>(() => undefined);
    const answer = answers[url.pathname];
    return Promise.resolve(
      answer ? answer(url) : jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }),
    );
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function requestsTo(fetchMock: ReturnType<typeof stubApi>, pathname: string): URL[] {
  return fetchMock.mock.calls
    .map(([input]) => new URL(String(input), 'http://localhost'))
    .filter((url) => url.pathname === pathname);
}

async function openLineRisk(path = '/line-risk') {
  const context = await createAppContext({ user: planner, path });
  const wrapper = await mountInApp(LineRiskView, context);
  await flushPromises();
  return { wrapper, router: context.router };
}

describe('LineRiskView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('heads the page with units at risk, parts short and the earliest impact', async () => {
    stubApi({ '/api/line-risk': () => jsonResponse(200, reportOf([battery, tank])) });

    const { wrapper } = await openLineRisk();

    const summary = wrapper.get('[aria-label="Line risk in numbers"]');
    expect(summary.get('[data-test="summary-units"]').text()).toContain('3 units at risk');
    expect(summary.get('[data-test="summary-units"]').text()).toContain('of 240 units in the sequence');
    expect(summary.get('[data-test="summary-parts"]').text()).toContain('2 parts to act on');
    expect(summary.get('[data-test="summary-parts"]').text()).toContain('1 in the frozen window');
    expect(summary.get('[data-test="summary-impact"]').text()).toContain('in 2 working days');
    expect(summary.get('[data-test="summary-impact"]').text()).toContain('BAT-06-312 runs short Thu 3 Dec');
  });

  it('lists short parts in order with impact words, quantities, the hazard and the units at risk', async () => {
    stubApi({ '/api/line-risk': () => jsonResponse(200, reportOf([battery, tank])) });

    const { wrapper } = await openLineRisk();

    // Rows of the parts table itself, not of the units table inside an opened row.
    const rows = wrapper
      .findAll('tr.el-table__row')
      .filter((row) => row.find('.line-risk-table__part-number').exists());
    expect(rows.map((row) => row.get('.line-risk-table__part-number').text())).toEqual(['BAT-06-312', 'TNK-R60']);
    expect(rows[0]!.text()).toContain('In frozen window');
    expect(rows[0]!.text()).toContain('Hazardous');
    expect(rows[0]!.text()).toContain('12 pcs');
    expect(rows[1]!.text()).toContain('Within a week');
    expect(rows[1]!.text()).not.toContain('Hazardous');
    // The first, most urgent part opens with its rescue and the exact units it stops.
    const detail = wrapper.get('[aria-label="Rescue for BAT-06-312"]');
    expect(detail.text()).toContain('Expedite 12 pcs of BAT-06-312 from FBS (Battery Supply Co) by Thu 3 Dec.');
    expect(detail.text()).toContain(
      'Build SN26120314 (FS-20W) in slot 13 of Thu 3 Dec, ahead of SN26120313: all its parts are present, so the line keeps running while SN26120313 waits for the part.',
    );
    expect(detail.text()).toContain("Hazardous goods: follow the plant's handling and transport rules.");
    const units = wrapper.get('[aria-label="Units that lack BAT-06-312"]');
    expect(units.text()).toContain('SN26120313');
    expect(units.text()).toContain('SN26120317');
  });

  it('lists the first units that lack a part and fetches all of them when asked, keeping the keyboard on the list', async () => {
    const every = Array.from({ length: 7 }, (_, index) => ({
      date: '2026-12-03',
      sequence: 13 + index,
      serial: `SN261203${String(13 + index).padStart(2, '0')}`,
      model: 'FS-32R',
      lackQty: 6,
      via: null,
    }));
    const many: ShortageDto = { ...battery, slotsAtRisk: every.slice(0, 2), slotsAtRiskCount: 7 };
    let slotCalls = 0;
    const fetchMock = stubApi({
      '/api/line-risk': () => jsonResponse(200, reportOf([many])),
      '/api/line-risk/parts/BAT-06-312/slots': (url) => {
        slotCalls += 1;
        if (slotCalls === 1)
          return jsonResponse(503, { error: { code: 'unavailable', message: 'The database is busy.' } });
        const offset = Number(url.searchParams.get('offset'));
        return jsonResponse(200, {
          total: 7,
          slots: every.slice(offset, offset + Number(url.searchParams.get('limit'))),
        });
      },
    });
    const { wrapper } = await openLineRisk();
    const units = () => wrapper.get('[aria-label="Units that lack BAT-06-312"]');

    expect(units().get('[data-test="units-title"]').text()).toBe('7 units lack it (the first 2 listed)');
    expect(units().text()).not.toContain('SN26120315');
    getButton(units().element as HTMLElement, 'Show all 7 units').click();
    await flushPromises();
    // A failure says why and leaves the button to try again.
    expect(units().get('[role="alert"]').text()).toContain('The units could not be loaded: The database is busy.');
    getButton(units().element as HTMLElement, 'Show all 7 units').click();
    await flushPromises();

    expect(units().get('[data-test="units-title"]').text()).toBe('7 units lack it');
    for (const slot of every) expect(units().text()).toContain(slot.serial);
    expect(units().find('[role="alert"]').exists()).toBe(false);
    expect(units().find('[data-test="show-all-units"]').exists()).toBe(false);
    expect(document.activeElement).toBe(units().get('[data-test="units-title"]').element);
    const [, asked] = requestsTo(fetchMock, '/api/line-risk/parts/BAT-06-312/slots');
    const today = localToday();
    expect(Object.fromEntries(asked!.searchParams)).toEqual({
      from: today,
      to: addCalendarDays(today, 13),
      offset: '0',
      limit: '500',
    });
  });

  it('keeps the full list of a part open when the server announces a planning change', async () => {
    const every = Array.from({ length: 7 }, (_, index) => ({
      date: '2026-12-03',
      sequence: 13 + index,
      serial: `SN261203${String(13 + index).padStart(2, '0')}`,
      model: 'FS-32R',
      lackQty: 6,
      via: null,
    }));
    let reports = 0;
    let push: (text: string) => void = () => undefined;
    const events = () =>
      new Response(
        new ReadableStream<Uint8Array>({
          start(controller) {
            push = (text) => controller.enqueue(new TextEncoder().encode(text));
          },
        }),
        { status: 200, headers: { 'Content-Type': 'text/event-stream' } },
      );
    // After the change one unit fewer lacks the battery.
    const fetchMock = stubApi(
      {
        '/api/line-risk': () => {
          reports += 1;
          const slots = reports === 1 ? every : every.slice(1);
          return jsonResponse(
            200,
            reportOf([{ ...battery, slotsAtRisk: slots.slice(0, 2), slotsAtRiskCount: slots.length }]),
          );
        },
        '/api/line-risk/parts/BAT-06-312/slots': (url) => {
          const slots = reports === 1 ? every : every.slice(1);
          const offset = Number(url.searchParams.get('offset'));
          return jsonResponse(200, { total: slots.length, slots: slots.slice(offset, offset + 500) });
        },
      },
      events,
    );
    const { wrapper } = await openLineRisk();
    const units = () => wrapper.get('[aria-label="Units that lack BAT-06-312"]');
    getButton(units().element as HTMLElement, 'Show all 7 units').click();
    await flushPromises();
    expect(units().get('[data-test="units-title"]').text()).toBe('7 units lack it');

    // The first version is the baseline; the second announces a change.
    push('event: planning\ndata: {"version":1}\n\nevent: planning\ndata: {"version":2}\n\n');
    await vi.waitFor(() => expect(requestsTo(fetchMock, '/api/line-risk/parts/BAT-06-312/slots')).toHaveLength(2));
    await flushPromises();

    expect(units().get('[data-test="units-title"]').text()).toBe('6 units lack it');
    expect(units().text()).not.toContain('SN26120313');
    for (const slot of every.slice(1)) expect(units().text()).toContain(slot.serial);
  });

  it('draws a long list of short parts a page at a time, in the order the server gave', async () => {
    // 120 parts short in the same way, P-001 … P-120, already in the server's order.
    const many = Array.from({ length: 120 }, (_, index) => ({
      ...tank,
      partNumber: `P-${String(index + 1).padStart(3, '0')}`,
    }));
    stubApi({ '/api/line-risk': () => jsonResponse(200, reportOf(many)) });

    const { wrapper } = await openLineRisk();
    const drawn = () => wrapper.findAll('tr.el-table__row .line-risk-table__part-number').map((cell) => cell.text());

    expect(drawn()).toHaveLength(50);
    expect(drawn()[0]).toBe('P-001');
    expect(wrapper.get('.line-risk-table__pager').text()).toContain('Total 120');
    await wrapper.get('.line-risk-table__pager .btn-next').trigger('click');
    await flushPromises();
    expect(drawn()[0]).toBe('P-051');
    expect(drawn()).toHaveLength(50);
  });

  it('asks for the horizon picked, two weeks unless the link says otherwise', async () => {
    const fetchMock = stubApi({ '/api/line-risk': () => jsonResponse(200, reportOf([battery])) });
    const { wrapper, router } = await openLineRisk();

    const radio = wrapper
      .findAll('[aria-label="Horizon"] input[type="radio"]')
      .find((input) => (input.element as HTMLInputElement).value === '4');
    await radio!.setValue(true);
    await flushPromises();

    const today = localToday();
    const [first, second] = requestsTo(fetchMock, '/api/line-risk');
    // Two weeks are 14 calendar days from today, four weeks 28.
    expect(Object.fromEntries(first!.searchParams)).toEqual({ from: today, to: addCalendarDays(today, 13) });
    expect(Object.fromEntries(second!.searchParams)).toEqual({ from: today, to: addCalendarDays(today, 27) });
    expect(router.currentRoute.value.query.weeks).toBe('4');
  });

  it('says so when no unit in the horizon lacks a part', async () => {
    stubApi({ '/api/line-risk': () => jsonResponse(200, reportOf([])) });

    const { wrapper } = await openLineRisk('/line-risk?weeks=1');

    expect(wrapper.text()).toContain('No unit in the next week lacks a part.');
    expect(wrapper.get('[data-test="summary-units"]').text()).toContain('0 units at risk');
  });

  it('reports a failed load with a Retry that asks again', async () => {
    let calls = 0;
    const fetchMock = stubApi({
      '/api/line-risk': () =>
        ++calls === 1
          ? jsonResponse(503, { error: { code: 'unavailable', message: 'The database is busy.' } })
          : jsonResponse(200, reportOf([tank])),
    });
    const { wrapper } = await openLineRisk();

    expect(wrapper.get('[role="alert"]').text()).toContain('The database is busy.');
    getButton(wrapper.element, 'Retry').click();
    await flushPromises();

    expect(requestsTo(fetchMock, '/api/line-risk')).toHaveLength(2);
    expect(wrapper.find('[role="alert"]').exists()).toBe(false);
    expect(wrapper.text()).toContain('TNK-R60');
  });

  it('refreshes without a spinner when the server announces a planning change', async () => {
    let calls = 0;
    const events = () =>
      new Response(
        new ReadableStream<Uint8Array>({
          start(controller) {
            const encoder = new TextEncoder();
            controller.enqueue(encoder.encode('event: planning\ndata: {"version":1}\n\n'));
            controller.enqueue(encoder.encode('event: planning\ndata: {"version":2}\n\n'));
          },
        }),
        { status: 200, headers: { 'Content-Type': 'text/event-stream' } },
      );
    const fetchMock = stubApi(
      { '/api/line-risk': () => jsonResponse(200, reportOf(++calls === 1 ? [battery, tank] : [tank])) },
      events,
    );

    const { wrapper } = await openLineRisk();
    await waitFor(() => expect(requestsTo(fetchMock, '/api/line-risk')).toHaveLength(2));
    await flushPromises();

    expect(wrapper.text()).not.toContain('BAT-06-312');
    expect(wrapper.text()).toContain('Updated just now');
  });

  it('puts expedite and loop parts first, then count, and keeps releases closed with their send-by date', async () => {
    stubApi({ '/api/line-risk': () => jsonResponse(200, reportOf([battery, wire, drum, squeegee])) });

    const { wrapper } = await openLineRisk();

    const groups = wrapper.findAll('[data-test="action-group"]');
    expect(groups.map((group) => group.attributes('data-action'))).toEqual(['expedite', 'loop', 'count', 'release']);
    // Each group says its action in words beside its icon, never by colour alone.
    expect(groups[0]!.get('h2').text()).toContain('Expedite now (1)');
    expect(groups[1]!.get('h2').text()).toContain('Kanban loop cannot keep up (1)');
    expect(groups[2]!.get('h2').text()).toContain('Count the stock first (1)');
    expect(groups[3]!.text()).toContain(
      '1 part covered by the normal release; the first must be released by Mon 14 Dec',
    );
    expect(groups[3]!.find('.el-collapse-item.is-active').exists()).toBe(false);
    expect(groups[1]!.text()).toContain('through FRM-32R');
  });

  it('shows an expedite as a dated schedule, not one lump', async () => {
    const spread: ShortageDto = {
      ...battery,
      shortQty: 30,
      needBy: [
        { date: '2026-12-03', qty: 6 },
        { date: '2026-12-04', qty: 12 },
        { date: '2026-12-07', qty: 12 },
      ],
      rescue: { ...battery.rescue, expedite: { qty: 6, needBy: '2026-12-03' } },
    };
    stubApi({ '/api/line-risk': () => jsonResponse(200, reportOf([spread])) });

    const { wrapper } = await openLineRisk();

    const schedule = wrapper.get('[data-test="need-by"]');
    const rows = schedule.findAll('tbody tr').map((row) => row.findAll('th, td').map((cell) => cell.text()));
    expect(rows).toEqual([
      ['Thu 3 Dec', '6 pcs', '6 pcs'],
      ['Fri 4 Dec', '12 pcs', '18 pcs'],
      ['Mon 7 Dec', '12 pcs', '30 pcs'],
    ]);
    expect(wrapper.get('[aria-label="Rescue for BAT-06-312"]').text()).toContain(
      'Expedite 6 pcs of BAT-06-312 from FBS (Battery Supply Co) by Thu 3 Dec.',
    );
  });

  it('lists each unit at risk with the parts that stop it', async () => {
    stubApi({ '/api/line-risk': () => jsonResponse(200, reportOf([battery, tank])) });
    const { wrapper } = await openLineRisk();

    const units = wrapper.get('[aria-label="Units at risk"]');

    expect(units.text()).toContain('SN26120802');
    expect(units.text()).toContain('TNK-R60 ×1');
    expect(units.text()).toContain('BAT-06-312 ×6');
  });
});

describe('line-risk wording', () => {
  it('grades impact: frozen window first, then within five working days, then later', () => {
    expect(impactLevel({ inFrozenWindow: true, daysUntilImpact: 9 })).toBe('frozen');
    expect(impactLevel({ inFrozenWindow: false, daysUntilImpact: 5 })).toBe('week');
    expect(impactLevel({ inFrozenWindow: false, daysUntilImpact: 6 })).toBe('later');
  });

  it('says when in working days and quantities with the unit people use', () => {
    expect([0, 1, 4].map(impactWhen)).toEqual(['today', 'in 1 working day', 'in 4 working days']);
    expect(formatQuantity(1, 'H87')).toBe('1 pc');
    expect(formatQuantity(1250.5, 'KGM')).toBe('1,250.5 kg');
  });

  it('groups alarms in action order and leaves out empty groups', () => {
    const { alarms, releases } = groupShortages([squeegee, drum, battery]);

    expect(alarms.map((group) => group.action)).toEqual(['expedite', 'count']);
    expect(releases.map((shortage) => shortage.partNumber)).toEqual(['SQG-W']);
  });

  it('words the dated need and what each action asks', () => {
    expect(needBySummary(wire)).toBe('2 kg by Wed 9 Dec, then 2.5 kg more to Thu 10 Dec');
    expect(needByLines(wire).map((line) => line.cumulative)).toEqual(['2 kg', '4.5 kg']);
    expect(actionSentence(wire)).toBe(
      'The loop has 2 cards in circulation and needs 5. Add cards (Loops) so the loop covers the demand over its replenishment time.',
    );
    expect(actionSentence(drum)).toBe('On-hand reads -2 pcs: count DRM-R15 before expediting anything.');
    expect(actionSentence(squeegee)).toBe(
      'The normal release covers it if sent by Mon 14 Dec (lead time 6 working days).',
    );
  });

  it('words the rescues as instructions', () => {
    expect(expediteSentence(tank)).toBe('Expedite 3 pcs of TNK-R60 from SRM by Tue 8 Dec.');
    expect(awaitingNote(tank)).toBeNull();
  });

  it('starts the rescue from a release that already asks for the part and awaits an answer', () => {
    const asked = (qty: number, releaseNumbers: string[]) => ({
      ...battery,
      awaitingConfirmation: { qty, releaseNumbers },
    });

    // It asks for all that must arrive: chase the confirmation, expedite nothing more.
    expect(expediteSentence(asked(18, ['R-000123']))).toBe(
      'Ask FBS (Battery Supply Co) to confirm R-000123 (18 pcs) so that 12 pcs of BAT-06-312 arrive by Thu 3 Dec.',
    );
    // It asks for less: the rest (12 − 5) is expedited beside it.
    expect(expediteSentence(asked(5, ['R-000123', 'R-000130']))).toBe(
      'Ask FBS (Battery Supply Co) to confirm R-000123 and R-000130 (5 pcs) and to expedite 7 pcs more, so that 12 pcs of BAT-06-312 arrive by Thu 3 Dec.',
    );
    expect(awaitingNote(asked(18, ['R-000123']))).toBe('18 pcs asked for on R-000123, not yet confirmed');
    expect(actionSentence(asked(18, ['R-000123']))).toBe(
      'Short inside the lead time of 7 working days: a release already asks for it; get it confirmed to arrive by the dates below, or resequence.',
    );
    expect(actionSentence({ ...squeegee, awaitingConfirmation: { qty: 40, releaseNumbers: ['R-000140'] } })).toBe(
      'Already asked for on R-000140: it counts as supply once the supplier confirms it.',
    );
    expect(resequenceSentence(battery.rescue.resequence!)).toBe(
      'Build SN26120314 (FS-20W) in slot 13 of Thu 3 Dec, ahead of SN26120313: all its parts are present, so the line keeps running while SN26120313 waits for the part.',
    );
  });
});
