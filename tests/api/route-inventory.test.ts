import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { can, roles } from '@schema/permissions';
import { checkRouteDefinitions, orgRoute, publicRoute, type RouteDefinition } from '../../backend/src/routes/define-route';
import { apiRoutes } from '../../backend/src/routes';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

const organizationRoutes = apiRoutes.filter((route) => route.access === 'organization');

/** Fills a route's path: :orgId with the organization, any other id with 1. */
function pathFor(route: RouteDefinition, organizationId: number): string {
  return `/api${route.path.replace(':orgId', String(organizationId)).replace(/:[A-Za-z]+/g, '1')}`;
}

function call(client: SignedIn, route: RouteDefinition, path: string) {
  switch (route.method) {
    case 'get':
      return client.get(path);
    case 'post':
      return client.post(path, {});
    case 'put':
      return client.put(path, {});
    case 'patch':
      return client.patch(path, {});
    case 'delete':
      return client.delete(path);
  }
}

describe('the route inventory', () => {
  it('declares a permission for every route under /orgs/:orgId', () => {
    expect(organizationRoutes.length).toBeGreaterThan(0);
    for (const route of apiRoutes) {
      if (route.path.startsWith('/orgs')) {
        expect(route.access, `${route.method} ${route.path}`).toBe('organization');
        expect(route.access === 'organization' && route.permission).toBeTruthy();
      }
    }
    expect(() => checkRouteDefinitions(apiRoutes)).not.toThrow();
  });

  it('refuses a route under /orgs that is not declared with orgRoute and a permission', () => {
    const sneaky = publicRoute({ method: 'get', path: '/orgs/:orgId/secrets', summary: 'x', handler: () => undefined });
    expect(() => checkRouteDefinitions([sneaky])).toThrow('a route under /orgs must be declared with orgRoute and a permission');
  });

  it('refuses an organization route outside /orgs/:orgId, an unknown permission and duplicates', () => {
    const outside = orgRoute({ method: 'get', path: '/groups', permission: 'org:read', summary: 'x', handler: () => undefined });
    expect(() => checkRouteDefinitions([outside])).toThrow('organization routes live under /orgs/:orgId');
    const unknown = orgRoute({
      method: 'get',
      path: '/orgs/:orgId/x',
      permission: 'everything' as never,
      summary: 'x',
      handler: () => undefined,
    });
    expect(() => checkRouteDefinitions([unknown])).toThrow('unknown permission "everything"');
    const twice = orgRoute({ method: 'get', path: '/orgs/:orgId/x', permission: 'org:read', summary: 'x', handler: () => undefined });
    expect(() => checkRouteDefinitions([twice, twice])).toThrow('declared twice');
  });
});

describe('every organization route × every role', () => {
  let context: TestContext;
  const signedIn = new Map<string, SignedIn>();
  let ridgeback: number;
  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    for (const role of roles) signedIn.set(role, await context.signInAs(role));
    signedIn.set('outsider', await context.signInAs('admin', 'slateHarbor'));
  });
  afterAll(() => context.close());

  for (const route of organizationRoutes) {
    const name = `${route.method.toUpperCase()} ${route.path} (${route.access === 'organization' ? route.permission : ''})`;

    it(`${name}: 401 without a session, 404 for another organization's admin`, async () => {
      const path = pathFor(route, ridgeback);
      const anonymous = await context.client();
      expect((await call(anonymous as SignedIn, route, path)).status).toBe(401);
      expect((await call(signedIn.get('outsider')!, route, path)).status).toBe(404);
    });

    it(`${name}: 403 exactly for the roles without the permission`, async () => {
      if (route.access !== 'organization') throw new Error('not an organization route');
      const path = pathFor(route, ridgeback);
      for (const role of roles) {
        const answer = await call(signedIn.get(role)!, route, path);
        if (can(role, route.permission)) expect(answer.status, `${role}: ${JSON.stringify(answer.body)}`).not.toBe(403);
        else expect(answer.status, role).toBe(403);
      }
    });
  }

  it('public routes answer without a session', async () => {
    expect((await request(context.app).get('/api/health')).status).toBe(200);
    expect((await request(context.app).get('/api/auth/csrf')).status).toBe(200);
  });
});
