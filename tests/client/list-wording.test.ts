import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { deliveryCycleText } from '@/components/master-data-presentation';
import ImportsProblemTable from '@/components/ImportsProblemTable.vue';

describe('deliveryCycleText', () => {
  it('writes a set cycle days–deliveries–delay, and a dash when the cycle is derived', () => {
    expect(deliveryCycleText({ cycleDays: 5, deliveriesPerCycle: 2, deliveryDelay: 1 })).toBe('5–2–1');
    expect(deliveryCycleText({ cycleDays: null, deliveriesPerCycle: null, deliveryDelay: null })).toBe('—');
  });
});

describe('ImportsProblemTable', () => {
  const problem = (row: number) => ({ row, column: 'qty', message: 'Must be a number.' });

  it('says one row needs fixing, and several rows need it', () => {
    const one = mount(ImportsProblemTable, { props: { problems: [problem(2), problem(2)], fileName: 'parts.csv' } });
    const two = mount(ImportsProblemTable, { props: { problems: [problem(2), problem(3)], fileName: 'parts.csv' } });

    expect(one.text()).toContain('1 row of parts.csv needs fixing.');
    expect(two.text()).toContain('2 rows of parts.csv need fixing.');
  });
});
