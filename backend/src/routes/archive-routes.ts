import { z } from 'zod';
import { idParam } from '@schema/columns';
import { archiveRequest } from '@schema/list-query';
import { parseBody, parseParams } from '../validation';
import { orgRoute, type OrganizationContext, type OrganizationRoute } from './define-route';

/**
 * `POST …/archive` and `POST …/unarchive` for one resource (body `{ reason? }`, data:edit): rows
 * are archived, never deleted. `apply` sets the flag through the resource's own update service,
 * so its rules (e.g. no site archived while its groups are in use) and its audit apply.
 */
export function archiveRoutes(options: {
  /** The resource's path, e.g. `/orgs/:orgId/sites/:siteId`. */
  path: string;
  /** The id parameter in it, e.g. `siteId`. */
  param: string;
  summaries: { archive: string; unarchive: string };
  apply: (context: OrganizationContext, id: number, archived: boolean, reason: string | undefined) => unknown;
}): OrganizationRoute[] {
  const params = z.object({ [options.param]: idParam });
  return (['archive', 'unarchive'] as const).map((verb) =>
    orgRoute({
      method: 'post',
      path: `${options.path}/${verb}`,
      permission: 'data:edit',
      summary: options.summaries[verb],
      handler: (context) => {
        const id = parseParams(params, context.req.params)[options.param] as number;
        const { reason } = parseBody(archiveRequest, context.req.body);
        context.res.json(options.apply(context, id, verb === 'archive', reason));
      },
    }),
  );
}
