import { createAppContext, demoUsers, mountInApp } from './helpers';
import { afterEach, describe, expect, it } from 'vitest';
import type { Kit } from '@shared/schemas/builds';
import BuildsKitSheet from '@/components/BuildsKitSheet.vue';

const battery = {
  partNumber: 'BAT-12',
  description: 'Battery 12 V',
  uom: 'H87',
  qty: 2,
  source: 'buy',
  hazardous: true,
  unNumber: '2800',
  hazardClass: '8',
  unitWeightKg: 31,
  heavyLift: true,
};

const kit: Kit = {
  serial: 'SN-1',
  model: 'M-1',
  modelDescription: 'Model one',
  date: '2026-12-02',
  sequence: 1,
  status: 'planned',
  pointsOfUse: [
    { pointOfUse: 'ST08', lines: [battery] },
    // The same battery also fitted at another station: still one caution.
    { pointOfUse: 'ST09', lines: [{ ...battery, qty: 1 }] },
  ],
};

afterEach(() => {
  document.body.innerHTML = '';
  localStorage.clear();
});

describe('BuildsKitSheet', () => {
  it('says the hazard and the heavy lift once per part, deferring to the plant’s rules', async () => {
    const context = await createAppContext({ user: demoUsers.admin, path: '/' });

    const wrapper = await mountInApp(BuildsKitSheet, context, { props: { kit } });

    const caution = wrapper.get('[aria-label="Hazardous parts"]').text();
    expect(caution).toContain('Hazardous parts: BAT-12.');
    expect(wrapper.findAll('[data-test="kit-heavy"]').map((note) => note.text())).toEqual([
      'BAT-12 is heavy: 31 kg each.',
    ]);
    expect(caution).toContain("the plant's own handling rules and local regulations");
  });
});
