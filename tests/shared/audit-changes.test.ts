import { describe, expect, it } from 'vitest';
import { describeAuditChanges } from '../../shared/domain/audit-changes';

describe('describeAuditChanges', () => {
  it('says each changed field from → to', () => {
    expect(
      describeAuditChanges({ before: { leadTimeDays: 3, packQty: 10 }, after: { leadTimeDays: 5, packQty: 12 } }),
    ).toBe('leadTimeDays: 3 → 5; packQty: 10 → 12');
  });

  it('shows a new record’s fields from nothing, a plain before/after, and other facts as they are', () => {
    expect(describeAuditChanges({ before: {}, after: { name: 'Supplier C' } })).toBe('name: — → Supplier C');
    expect(describeAuditChanges({ before: '06:00', after: '07:30' })).toBe('06:00 → 07:30');
    expect(describeAuditChanges({ kind: 'parts', imported: 3 })).toBe('kind: parts; imported: 3');
    expect(describeAuditChanges(null)).toBe('');
  });
});
