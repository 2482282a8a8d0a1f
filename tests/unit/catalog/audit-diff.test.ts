import { describe, expect, it } from 'vitest';
import { changedFields } from '@/app/(app)/w/[workspace]/history/_components/audit-diff';

describe('changedFields', () => {
  it('lists only the fields that changed, with readable names and values', () => {
    const before = { name: 'GaN-wz', spaceGroup: 186, tags: ['nitride'], kGrid: [8, 8, 6], retractedAt: null };
    const after = { name: 'GaN-wz', spaceGroup: 186, tags: ['nitride', 'semiconductor'], kGrid: [12, 12, 8], retractedAt: null };
    expect(changedFields(before, after)).toEqual([
      { field: 'tags', before: 'nitride', after: 'nitride, semiconductor' },
      { field: 'k grid', before: '8, 8, 6', after: '12, 12, 8' },
    ]);
  });

  it('shows every given field of a creation', () => {
    expect(changedFields(null, { citeKey: 'parker1967', doi: null })).toEqual([{ field: 'cite key', before: '', after: 'parker1967' }]);
  });
});
