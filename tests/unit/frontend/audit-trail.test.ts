import { describe, expect, it } from 'vitest';
import { pathInOrganization } from '@frontend/app/navigation';
import { auditCsvUrl, auditQueryString } from '@frontend/features/audit-trail/api/get-audit-events';
import { changeLines } from '@frontend/features/audit-trail/components/change-summary';

// The audit-trail page's pure parts: the field-by-field change lines, the query string shared by the
// table and the CSV export, and the page's place in the navigation (audit:read = admin, consultant).

describe('changeLines', () => {
  it('lists each field once with its before and after, and only the side that exists otherwise', () => {
    expect(changeLines({ status: 'draft', category: 2 }, { status: 'approved', reviewDate: '2025-03-20' })).toEqual([
      { field: 'status', before: 'draft', after: 'approved' },
      { field: 'category', before: '2', after: undefined },
      { field: 'reviewDate', before: undefined, after: '2025-03-20' },
    ]);
  });

  it('shows blanks and nulls in words, objects as JSON, and shortens long values', () => {
    const long = 'x'.repeat(200);
    const [blank, nothing, object, shortened] = changeLines(null, { note: '', removed: null, exclusions: [{ resultId: 4 }], rationale: long });
    expect(blank!.after).toBe('(blank)');
    expect(nothing!.after).toBe('(blank)');
    expect(object!.after).toBe('[{"resultId":4}]');
    expect(shortened!.after).toHaveLength(118);
    expect(shortened!.after!.endsWith('…')).toBe(true);
    expect(changeLines(null, null)).toEqual([]);
  });
});

describe('audit query strings', () => {
  it('sends only the filters that are set, and the CSV export uses the same ones without paging', () => {
    const filters = { person: '3', entityType: 'decision_record', from: '2025-01-01', to: undefined };
    expect(auditQueryString(filters, { page: 2, pageSize: 25 })).toBe('person=3&entityType=decision_record&from=2025-01-01&page=2&pageSize=25');
    expect(auditCsvUrl('7', filters)).toBe('/api/orgs/7/audit-events.csv?person=3&entityType=decision_record&from=2025-01-01');
    expect(auditCsvUrl('7', {})).toBe('/api/orgs/7/audit-events.csv');
  });
});

describe('the audit trail in the navigation', () => {
  it('keeps the audit page for admins and consultants when switching organization, and not for other roles', () => {
    expect(pathInOrganization('/orgs/1/audit', '2', 'admin')).toBe('/orgs/2/audit');
    expect(pathInOrganization('/orgs/1/audit', '2', 'consultant')).toBe('/orgs/2/audit');
    expect(pathInOrganization('/orgs/1/audit', '2', 'hygienist')).toBe('/orgs/2');
  });
});
