import { z } from 'zod';
import { calendarDate } from './columns';

/*
 * Query parameters shared by every list endpoint (sites, agents, OEL list, groups, workers,
 * shift results), so tables in the browser page, sort and search the same way on the server.
 * Query strings arrive as text: numbers and flags are coerced here.
 */

/** Which rows a list shows by their archived flag. Default: only rows in use. */
export const archivedFilter = z.enum(['false', 'true', 'all'], { message: 'Use false, true or all' }).default('false');

/** `true`/`false` in a query string. */
export const queryFlag = z.enum(['true', 'false'], { message: 'Use true or false' }).transform((value) => value === 'true');

/** Positive integer id in a query string. */
export const queryId = z.coerce.number().int('Use a whole number').positive('Use a positive id');

/**
 * `sort=name` sorts ascending, `sort=-name` descending; only the listed fields are allowed.
 * `sortParameter(['name', 'createdAt'], 'name')`.
 */
export function sortParameter<const Field extends string>(fields: readonly [Field, ...Field[]], fallback: Field | `-${Field}`) {
  const allowed = [...fields, ...fields.map((field) => `-${field}` as const)] as [Field | `-${Field}`, ...Array<Field | `-${Field}`>];
  return z.enum(allowed, { message: `Sort by one of ${fields.join(', ')} (prefix - for descending)` }).default(fallback as never);
}

/** Paging and free-text search, the same on every list. */
export const listQueryBase = z.object({
  q: z.string().trim().max(200, 'Use at most 200 characters').optional(),
  page: z.coerce.number().int('Use a whole number').min(1, 'Pages start at 1').default(1),
  pageSize: z.coerce.number().int('Use a whole number').min(1, 'Use at least 1').max(200, 'Use at most 200').default(50),
});

/** One page of a list: `items`, the `total` matching the filters, and where we are. */
export interface ListPage<Item> {
  items: Item[];
  total: number;
  page: number;
  pageSize: number;
  pageCount: number;
}

export const siteListQuery = listQueryBase.extend({
  sort: sortParameter(['name', 'createdAt', 'updatedAt'], 'name'),
  archived: archivedFilter,
});
export type SiteListQuery = z.infer<typeof siteListQuery>;

export const agentListQuery = listQueryBase.extend({
  sort: sortParameter(['name', 'kind', 'casNumber', 'createdAt', 'updatedAt'], 'name'),
  archived: archivedFilter,
  kind: z.enum(['noise', 'chemical'], { message: 'Use noise or chemical' }).optional(),
});
export type AgentListQuery = z.infer<typeof agentListQuery>;

export const oelEntryListQuery = listQueryBase.extend({
  sort: sortParameter(['agentName', 'source', 'value', 'unit', 'averagingTime', 'createdAt'], 'agentName'),
  archived: archivedFilter,
  agentId: queryId.optional(),
});
export type OelEntryListQuery = z.infer<typeof oelEntryListQuery>;

export const exposureGroupListQuery = listQueryBase.extend({
  sort: sortParameter(['name', 'siteName', 'agentName', 'processArea', 'shiftHours', 'resultsChangedAt', 'createdAt', 'updatedAt'], 'name'),
  archived: archivedFilter,
  siteId: queryId.optional(),
  agentId: queryId.optional(),
});
export type ExposureGroupListQuery = z.infer<typeof exposureGroupListQuery>;

export const workerListQuery = listQueryBase.extend({
  sort: sortParameter(['code', 'name', 'jobTitle', 'createdAt', 'updatedAt'], 'code'),
  archived: archivedFilter,
  /** Workers who are members of this group on `memberOn` (default: today). */
  groupId: queryId.optional(),
  memberOn: calendarDate.optional(),
  jobTitle: z.string().trim().max(120).optional(),
});
export type WorkerListQuery = z.infer<typeof workerListQuery>;

/** Archive or bring back a row; the optional reason goes to the audit trail. */
export const archiveRequest = z.object({ reason: z.string().trim().max(500, 'Use at most 500 characters').optional() });
export type ArchiveRequest = z.infer<typeof archiveRequest>;
