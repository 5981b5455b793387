import { describe, expect, it } from 'vitest';
import { describeAuditChanges } from '../../shared/domain/audit-changes';

describe('describeAuditChanges', () => {
  it('says each changed field from → to', () => {
    expect(
      describeAuditChanges({ before: { leadTimeDays: 3, packQty: 10 }, after: { leadTimeDays: 5, packQty: 12 } }),
    ).toBe('lead time days: 3 → 5; pack qty: 10 → 12');
  });

  it('shows a new record’s fields from nothing, a plain before/after, and other facts as they are', () => {
    expect(describeAuditChanges({ before: {}, after: { name: 'Supplier C' } })).toBe('name: — → Supplier C');
    expect(describeAuditChanges({ before: '06:00', after: '07:30' })).toBe('06:00 → 07:30');
    expect(describeAuditChanges({ kind: 'parts', imported: 3 })).toBe('kind: parts; imported: 3');
    expect(describeAuditChanges(null)).toBe('');
  });

  it('reads code names as words, keeping acronyms whole', () => {
    expect(describeAuditChanges({ releaseLineId: 109, shipNoticeId: null })).toBe(
      'release line id: 109; ship notice id: —',
    );
    expect(describeAuditChanges({ unit_weight_kg: 12, SKU: 'A', sdsURL: 'x', UNNumber: 'UN2794' })).toBe(
      'unit weight kg: 12; SKU: A; sds URL: x; UN number: UN2794',
    );
  });

  it('names the items of a list, the first eight of a long one with the count, and fields of a record', () => {
    const parts = Array.from({ length: 12 }, (_, index) => `P-${index + 1}`);

    expect(describeAuditChanges({ created: ['P-1', 'P-2'] })).toBe('created: P-1, P-2');
    expect(describeAuditChanges({ created: parts })).toBe(
      'created: P-1, P-2, P-3, P-4, P-5, P-6, P-7, P-8 … (12 in all)',
    );
    expect(describeAuditChanges({ loop: { cards: 4, containerQty: 20 } })).toBe('loop: cards 4, container qty 20');
    expect(describeAuditChanges({ created: [] })).toBe('created: —');
  });
});
