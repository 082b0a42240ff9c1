import { describe, expect, it, vi } from 'vitest';
import { sortingOf } from '@frontend/components/data-table';
import { pathInOrganization } from '@frontend/app/navigation';
import { ApiError } from '@frontend/lib/api-client';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { formatCalendarDate, formatNumber } from '@frontend/lib/format';
import { listQueryString, type ListParams } from '@frontend/lib/list-params';

// Helpers the list pages and forms share: the API query a table sends, the sort it shows, the
// message a form shows next to the server's field errors, and calendar dates read without a time zone.

function params(overrides: Partial<ListParams> & { filters?: Record<string, string> } = {}): ListParams {
  const { filters = {}, ...rest } = overrides;
  return { q: '', sort: 'name', page: 1, pageSize: 25, filter: (name) => filters[name], update: () => {}, ...rest };
}

describe('listQueryString', () => {
  it('sends the trimmed search, the sort, the page and the page size', () => {
    expect(listQueryString(params({ q: '  saw ', sort: '-name', page: 3, pageSize: 50 }))).toBe('q=saw&sort=-name&page=3&pageSize=50');
  });

  it('leaves out an empty search and filters that are not set, and adds fixed values such as the group', () => {
    const query = listQueryString(params({ filters: { status: 'void' } }), ['status', 'source'], { groupId: 12, from: undefined });
    expect(query).toBe('sort=name&page=1&pageSize=25&status=void&groupId=12');
  });
});

describe('sortingOf', () => {
  it('reads the API sort parameter as one column, descending when it starts with a minus', () => {
    expect(sortingOf('-resultsChangedAt')).toEqual([{ id: 'resultsChangedAt', desc: true }]);
    expect(sortingOf('code')).toEqual([{ id: 'code', desc: false }]);
  });
});

describe('applyServerErrorsInline', () => {
  const placed: Array<[string, string]> = [];
  const setError = ((field: string, error: { message?: string }) => placed.push([field, error.message ?? ''])) as never;

  it('points at the fields when every field error sits under its input', () => {
    placed.length = 0;
    const error = new ApiError(400, 'bad_request', 'Check the request body: workerId: RT-003 is not a member', { workerId: 'RT-003 is not a member' });
    expect(applyServerErrorsInline(error, setError, ['workerId', 'date'])).toBe('Correct the fields marked above.');
    expect(placed).toEqual([['workerId', 'RT-003 is not a member']]);
  });

  it('keeps the full message when a field error has no input on the form', () => {
    placed.length = 0;
    const error = new ApiError(400, 'bad_request', 'Check the request body: seed: Use a seed from 1', { seed: 'Use a seed from 1' });
    expect(applyServerErrorsInline(error, setError, ['title'])).toBe('Check the request body: seed: Use a seed from 1 (seed: Use a seed from 1)');
  });

  it('shows the message of an error without fields (a 409) as it is', () => {
    const error = new ApiError(409, 'conflict', 'Worker code "RT-001" is already used in this organization (worker 1)');
    expect(applyServerErrorsInline(error, setError, ['code'])).toBe('Worker code "RT-001" is already used in this organization (worker 1)');
  });
});

describe('formatCalendarDate', () => {
  it('shows a calendar date on its own day west of Greenwich, where reading it as local time would give the day before', async () => {
    const before = process.env.TZ;
    process.env.TZ = 'America/Los_Angeles';
    try {
      // Fresh module, so its formatters are built in the Los Angeles time zone.
      vi.resetModules();
      const format = await import('@frontend/lib/format');
      expect(format.formatCalendarDate('2024-01-01')).toContain('2024');
      expect(format.formatCalendarDate('2024-01-01')).not.toContain('2023');
      // The timestamp formatter reads the same text as UTC midnight and shows it in local time: 31 Dec 2023.
      expect(format.formatDate('2024-01-01')).toContain('2023');
    } finally {
      process.env.TZ = before;
      vi.resetModules();
    }
  });

  it('prints a dash for a missing date and leaves text that is not a date as it is', () => {
    expect(formatCalendarDate(null)).toBe('—');
    expect(formatCalendarDate('not a date')).toBe('not a date');
  });
});

describe('formatNumber', () => {
  it('keeps three significant digits by default and more when asked', () => {
    expect(formatNumber(0.0412345).replace(/\D/g, '')).toBe('00412');
    expect(formatNumber(0.8625, 4).replace(/\D/g, '')).toBe('08625');
    expect(formatNumber(Number.NaN)).toBe('—');
  });
});

describe('navigation between organizations', () => {
  it('keeps a data page when switching, and falls back to the overview for the import when the role there may not change data', () => {
    expect(pathInOrganization('/orgs/1/exposure-groups/12', '2', 'consultant')).toBe('/orgs/2/exposure-groups');
    expect(pathInOrganization('/orgs/1/lab-imports/5', '2', 'consultant')).toBe('/orgs/2');
    expect(pathInOrganization('/orgs/1/lab-imports', '2', 'hygienist')).toBe('/orgs/2/lab-imports');
  });
});
