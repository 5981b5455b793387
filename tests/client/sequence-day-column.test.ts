import { createAppContext, demoUsers, mountInApp } from './helpers';
import { afterEach, describe, expect, it } from 'vitest';
import type { BoardUnitAtRisk } from '@/stores/board-risk-engine';
import type { SequenceDay, SequenceUnit } from '@shared/schemas/sequence';
import SequenceDayColumn from '@/components/SequenceDayColumn.vue';
import { DAY_UNITS_DRAWN } from '@/components/sequence-presentation';

const DATE = '2026-12-07';

function dayOf(count: number): SequenceDay {
  const units: SequenceUnit[] = Array.from({ length: count }, (_, index) => ({
    id: index + 1,
    date: DATE,
    sequence: index + 1,
    model: index % 2 ? 'M-B' : 'M-A',
    serial: `S${index + 1}`,
    qty: 1,
    status: 'planned',
    builtAt: null,
  }));
  return { date: DATE, working: true, frozen: false, past: false, capacity: count, load: count, units, version: 'v1' };
}

function atRisk(unit: SequenceUnit): BoardUnitAtRisk {
  return { serial: unit.serial, date: unit.date, sequence: unit.sequence, model: unit.model, lacks: [], moreLacks: 0 };
}

describe('SequenceDayColumn', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('draws the first units of a long day and counts the rest, with those at risk, on a button that draws them', async () => {
    const day = dayOf(DAY_UNITS_DRAWN + 40);
    const hiddenAtRisk = [day.units[DAY_UNITS_DRAWN + 3]!, day.units[DAY_UNITS_DRAWN + 30]!];
    const context = await createAppContext({ user: demoUsers.admin, path: '/sequence' });
    const wrapper = await mountInApp(SequenceDayColumn, context, {
      props: {
        day,
        modelOrder: ['M-A', 'M-B'],
        editable: true,
        openMenuSerial: null,
        risks: new Map(hiddenAtRisk.map((unit) => [unit.serial, atRisk(unit)])),
      },
    });

    const serials = () => wrapper.findAll('[data-test="unit-card"]').map((card) => card.attributes('data-serial'));
    expect(serials()).toEqual(day.units.slice(0, DAY_UNITS_DRAWN).map((unit) => unit.serial));
    expect(wrapper.get('[data-test="day-load"]').text()).toBe(
      `${DAY_UNITS_DRAWN + 40} / ${DAY_UNITS_DRAWN + 40} units`,
    );
    const more = wrapper.get('[data-test="day-more"]');
    expect(more.text()).toBe('Show 40 more units (2 at risk)');

    await more.trigger('click');

    expect(serials()).toEqual(day.units.map((unit) => unit.serial));
    expect(wrapper.find('[data-test="day-more"]').exists()).toBe(false);
  });

  it('draws a day within the limit whole, without a button', async () => {
    const day = dayOf(DAY_UNITS_DRAWN);
    const context = await createAppContext({ user: demoUsers.admin, path: '/sequence' });
    const wrapper = await mountInApp(SequenceDayColumn, context, {
      props: { day, modelOrder: ['M-A', 'M-B'], editable: false, openMenuSerial: null },
    });

    expect(wrapper.findAll('[data-test="unit-card"]')).toHaveLength(DAY_UNITS_DRAWN);
    expect(wrapper.find('[data-test="day-more"]').exists()).toBe(false);
  });
});
