import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router';

/**
 * The state of a server-side list (search, sort, page, page size, filters) kept in the page's
 * address, so a reload, the back button or a shared link shows the same rows. Two lists on one
 * page keep apart with a `prefix` ("oel." → `?oel.q=…&oel.page=2`).
 *
 * Values are read leniently: a hand-edited or stale address falls back to the defaults rather
 * than break the page; the server checks the query again and answers 400 for anything it refuses.
 */
export interface ListParams {
  q: string;
  /** `name` ascending, `-name` descending (the API's `sort` parameter). */
  sort: string;
  /** 1-based, as the API counts pages. */
  page: number;
  pageSize: number;
  /** A filter by name (`archived`, `kind`, `status` …), or undefined when not set. */
  filter: (name: string) => string | undefined;
  /**
   * Changes some values; undefined or '' removes one. Any change other than the page itself
   * goes back to page 1 (the old page may no longer exist). Typing in a search box replaces
   * the history entry instead of adding one per keystroke.
   */
  update: (changes: Record<string, string | number | undefined>, options?: { replace?: boolean }) => void;
}

export const pageSizes = [10, 25, 50, 100] as const;

export interface ListParamsOptions {
  defaultSort: string;
  /** Sort fields the API accepts (without the "-"); anything else falls back to the default. */
  sortFields: readonly string[];
  defaultPageSize?: number;
  prefix?: string;
}

export function useListParams({ defaultSort, sortFields, defaultPageSize = 25, prefix = '' }: ListParamsOptions): ListParams {
  const [searchParams, setSearchParams] = useSearchParams();
  const read = useCallback((name: string) => searchParams.get(prefix + name) ?? undefined, [searchParams, prefix]);

  const sortText = read('sort');
  const sort = sortText && sortFields.includes(sortText.replace(/^-/, '')) ? sortText : defaultSort;
  const page = Math.max(1, Math.floor(Number(read('page'))) || 1);
  const sizeText = Number(read('pageSize'));
  const pageSize = (pageSizes as readonly number[]).includes(sizeText) ? sizeText : defaultPageSize;

  const update = useCallback<ListParams['update']>(
    (changes, options) => {
      setSearchParams(
        (current) => {
          const next = new URLSearchParams(current);
          for (const [name, value] of Object.entries(changes)) {
            if (value === undefined || value === '') next.delete(prefix + name);
            else next.set(prefix + name, String(value));
          }
          if (!('page' in changes)) next.delete(`${prefix}page`);
          return next;
        },
        { replace: options?.replace ?? false, preventScrollReset: true },
      );
    },
    [setSearchParams, prefix],
  );

  return useMemo(() => ({ q: read('q') ?? '', sort, page, pageSize, filter: read, update }), [read, sort, page, pageSize, update]);
}

/**
 * The API query string for a list: q, sort, page and pageSize, plus the named filters when set.
 * `listQueryString(params, ['archived'])` → "q=saw&sort=-name&page=2&pageSize=25&archived=all".
 */
export function listQueryString(params: ListParams, filters: readonly string[] = [], extra: Record<string, string | number | undefined> = {}): string {
  const query = new URLSearchParams();
  if (params.q.trim()) query.set('q', params.q.trim());
  query.set('sort', params.sort);
  query.set('page', String(params.page));
  query.set('pageSize', String(params.pageSize));
  for (const name of filters) {
    const value = params.filter(name);
    if (value) query.set(name, value);
  }
  for (const [name, value] of Object.entries(extra)) if (value !== undefined && value !== '') query.set(name, String(value));
  return query.toString();
}
