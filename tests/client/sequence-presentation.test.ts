// @vitest-environment node
import { describe, expect, it } from 'vitest';
import type { UnitLack } from '@shared/domain/line-risk';
import { LACKS_NAMED, lackList, riskDescription } from '@/components/sequence-presentation';

const lack = (partNumber: string, fields: Partial<UnitLack> = {}): UnitLack => ({
  partNumber,
  qty: 1,
  now: true,
  via: null,
  neededOn: '2026-12-08',
  ...fields,
});

describe('lackList', () => {
  it('names each lack with its quantity, the subassembly it is needed through and its day', () => {
    const unit = {
      lacks: [lack('BAT-1', { qty: 6 }), lack('TUBE-2', { qty: 0.4, via: 'FRAME-3', neededOn: '2026-12-07' })],
    };

    expect(lackList(unit)).toBe('BAT-1 ×6 by Tue 8 Dec; TUBE-2 ×0.4 through FRAME-3 by Mon 7 Dec');
    expect(riskDescription(unit)).toBe(
      'At risk: lacks BAT-1 ×6 by Tue 8 Dec; TUBE-2 ×0.4 through FRAME-3 by Mon 7 Dec.',
    );
  });

  it('names the first lacks and counts the rest, so a unit of a large plant does not list a hundred parts', () => {
    const lacks = Array.from({ length: LACKS_NAMED + 3 }, (_, index) => lack(`P-${index + 1}`));

    const listed = lackList({ lacks });

    expect(listed.split('; ')).toHaveLength(LACKS_NAMED + 1);
    expect(listed).toMatch(/^P-1 ×1 by Tue 8 Dec; P-2 /);
    expect(listed).not.toContain(`P-${LACKS_NAMED + 1} `);
    expect(listed.endsWith('; and 3 more parts')).toBe(true);
    expect(lackList({ lacks: lacks.slice(0, LACKS_NAMED + 1) }).endsWith('; and 1 more part')).toBe(true);
    expect(lackList({ lacks: lacks.slice(0, LACKS_NAMED) })).not.toContain('more');
  });
});
