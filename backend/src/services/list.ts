import { asc, desc, eq, getTableName, like, or, sql, type AnyColumn, type SQL } from 'drizzle-orm';
import type { ListPage } from '@schema/list-query';

/*
 * Helpers every list service shares: sort parameters to ORDER BY, free-text search to LIKE,
 * the archived filter, and the page envelope. The query itself stays in each service, where the
 * joins are.
 */

/** `name` → ascending, `-name` → descending, on the column the field maps to; ties broken by id. */
export function orderBy<Field extends string>(sort: Field | `-${Field}`, columns: Record<Field, AnyColumn | SQL>, tieBreaker: AnyColumn): SQL[] {
  const descending = sort.startsWith('-');
  const field = (descending ? sort.slice(1) : sort) as Field;
  const column = columns[field];
  return [descending ? desc(column) : asc(column), asc(tieBreaker)];
}

/** LIKE pattern for "contains", with % and _ in the search taken literally. */
function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
}

/**
 * Rows where any of the columns contains `text` (case-insensitive for ASCII, SQLite's LIKE).
 * Undefined (no condition) for an empty search.
 */
export function searchCondition(text: string | undefined, columns: ReadonlyArray<AnyColumn | SQL>): SQL | undefined {
  if (!text) return undefined;
  const pattern = containsPattern(text);
  return or(...columns.map((column) => sql`${like(column as AnyColumn, pattern)} escape '\\'`));
}

/** The archived filter of list queries: only rows in use (default), only archived rows, or all. */
export function archivedCondition(filter: 'false' | 'true' | 'all', column: AnyColumn): SQL | undefined {
  if (filter === 'all') return undefined;
  return eq(column, filter === 'true');
}

/** LIMIT and OFFSET for a page (pages start at 1). */
export function pageWindow(page: number, pageSize: number): { limit: number; offset: number } {
  return { limit: pageSize, offset: (page - 1) * pageSize };
}

/** The page envelope every list returns. */
export function pageOf<Item>(items: Item[], total: number, page: number, pageSize: number): ListPage<Item> {
  return { items, total, page, pageSize, pageCount: Math.max(1, Math.ceil(total / pageSize)) };
}

/**
 * `"table"."column"`, always qualified. Drizzle writes columns without their table in a query on
 * one table, so a correlated subquery must name the outer row's columns through this (an
 * unqualified `"id"` inside the subquery would mean the inner table's id).
 */
export function qualified(column: AnyColumn): SQL {
  return sql.raw(`"${getTableName(column.table)}"."${column.name}"`);
}
