// @vitest-environment node
import { describe, expect, it } from 'vitest';
import type { UnitLack } from '@shared/domain/line-risk';
import { lackList, riskDescription } from '@/components/sequence-presentation';

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
      moreLacks: 0,
    };

    expect(lackList(unit)).toBe('BAT-1 ×6 by Tue 8 Dec; TUBE-2 ×0.4 through FRAME-3 by Mon 7 Dec');
    expect(riskDescription(unit)).toBe(
      'At risk: lacks BAT-1 ×6 by Tue 8 Dec; TUBE-2 ×0.4 through FRAME-3 by Mon 7 Dec.',
    );
  });

  it('counts the lacks beyond those named', () => {
    expect(lackList({ lacks: [lack('P-1')], moreLacks: 3 })).toBe('P-1 ×1 by Tue 8 Dec; and 3 more parts');
    expect(lackList({ lacks: [lack('P-1')], moreLacks: 1 })).toBe('P-1 ×1 by Tue 8 Dec; and 1 more part');
  });
});
