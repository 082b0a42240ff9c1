import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { can, roles } from '@schema/permissions';
import { checkRouteDefinitions, orgRoute, publicRoute, type RouteDefinition } from '../../backend/src/routes/define-route';
import { apiRoutes } from '../../backend/src/routes';
import { idParametersOf, ownedCollections } from '../../backend/src/routes/owned-collections';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';

const organizationRoutes = apiRoutes.filter((route) => route.access === 'organization');
const changingRoutes = apiRoutes.filter((route) => route.method !== 'get');

/** The route's path with :orgId filled and each id taken from `idOf(collection)`. */
function pathWithIds(route: RouteDefinition, organizationId: number, idOf: (collection: string) => number): string {
  const segments = route.path.split('/');
  const filled = segments.map((segment, index) => {
    if (segment === ':orgId') return String(organizationId);
    if (segment.startsWith(':')) return String(idOf(segments[index - 1] ?? ''));
    return segment;
  });
  return `/api${filled.join('/')}`;
}

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

  it('every route mounted under /api comes from the inventory: nothing reaches Express around mountRoutes', async () => {
    const context = await createTestContext({ seed: false });
    try {
      const mounted = new Set<string>();
      // Express 5 keeps the layers on app.router; the /api router is the layer whose handle has its own stack.
      type Layer = { route?: { path: string; methods: Record<string, boolean> }; handle?: { stack?: Layer[] } };
      const appLayers = (context.app as unknown as { router: { stack: Layer[] } }).router.stack;
      for (const layer of appLayers) {
        for (const inner of layer.handle?.stack ?? []) {
          if (!inner.route) continue;
          for (const method of Object.keys(inner.route.methods)) mounted.add(`${method} ${inner.route.path}`);
        }
      }
      // The e-mail capture runs in this context, so routes enabled only with it are mounted too.
      const declared = new Set(apiRoutes.map((route) => `${route.method} ${route.path}`));
      expect(mounted.size).toBeGreaterThan(0);
      expect([...mounted].filter((name) => !declared.has(name))).toEqual([]);
      expect([...declared].filter((name) => !mounted.has(name))).toEqual([]);
    } finally {
      await context.close();
    }
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

describe('every API route × every role, anonymous and another organization', () => {
  let context: TestContext;
  const signedIn = new Map<string, SignedIn>();
  let ridgeback: number;
  let slateHarbor: number;
  /** One Ridgeback id per collection (for the Slate Harbor admin to try under Slate Harbor's path). */
  const ridgebackIds = new Map<string, number>();

  beforeAll(async () => {
    // Decision records are seeded too, so every collection has a Ridgeback row to try.
    context = await createTestContext({ decisions: true });
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    for (const role of roles) signedIn.set(role, await context.signInAs(role));
    signedIn.set('outsider', await context.signInAs('admin', 'slateHarbor'));
    // The demo has no pending invitation and no lab import: make one of each.
    const admin = signedIn.get('admin')!;
    const invited = await admin.post(`/api/orgs/${ridgeback}/invitations`, { email: 'new.person@ridgeback.example', role: 'analyst' });
    expect(invited.status, JSON.stringify(invited.body)).toBe(201);
    const uploaded = await admin.agent
      .post(`/api/orgs/${ridgeback}/lab-imports`)
      .set('X-CSRF-Token', admin.csrfToken)
      .attach('file', Buffer.from('Worker,Date,Result\nRT-011,2025-01-20,0.4\n'), { filename: 'one.csv', contentType: 'text/csv' });
    expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201);
    // Nor an ISO 9612 noise estimate: make a full-day one on a noise group.
    const noiseGroup = context.db.$client
      .prepare("select id from exposure_groups where organization_id = ? and name = 'Edger operator – noise'")
      .get(ridgeback) as { id: number };
    const estimate = await admin.post(`/api/orgs/${ridgeback}/exposure-groups/${noiseGroup.id}/noise-estimates`, {
      strategy: 'full-day',
      instrument: 'dosimeter',
      effectiveHours: 8,
      measurements: [{ laeqDb: 88 }, { laeqDb: 89 }, { laeqDb: 90 }],
    });
    expect(estimate.status, JSON.stringify(estimate.body)).toBe(201);
    for (const [collection, { table }] of Object.entries(ownedCollections)) {
      const exists = context.db.$client.prepare("select 1 from sqlite_master where type = 'table' and name = ?").get(table);
      if (!exists) continue; // a collection whose table is not in this build's migrations yet
      const row = context.db.$client.prepare(`select id from ${table} where organization_id = ? order by id limit 1`).get(ridgeback) as
        { id: number } | undefined;
      // Without a row, the routes on this collection fail below saying so.
      if (row) ridgebackIds.set(collection, row.id);
    }
    // Seeding the decision records runs the statistics engine: allow for a busy machine.
  }, 120_000);
  afterAll(() => context?.close());

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

    const ids = idParametersOf(route.path);
    if (ids.length > 0) {
      it(`${name}: another organization's ids under one's own organization answer 404`, async () => {
        for (const { parameter, collection } of ids) {
          expect(
            ownedCollections[collection],
            `:${parameter} after "${collection}": add the collection to backend/src/routes/owned-collections.ts`,
          ).toBeDefined();
          expect(ridgebackIds.has(collection), `no Ridgeback row in ${ownedCollections[collection].table} to try`).toBe(true);
        }
        // The Slate Harbor admin (every permission) asks its own organization for Ridgeback's records.
        const path = pathWithIds(route, slateHarbor, (collection) => ridgebackIds.get(collection)!);
        const answer = await call(signedIn.get('outsider')!, route, path);
        expect(answer.status, `${path}: ${JSON.stringify(answer.body)}`).toBe(404);
      });
    }
  }

  for (const route of apiRoutes.filter((candidate) => candidate.access === 'user')) {
    it(`${route.method.toUpperCase()} ${route.path} (signed-in user): 401 without a session, answered when signed in`, async () => {
      const anonymous = await context.client();
      const path = pathFor(route, ridgeback);
      expect((await call(anonymous as SignedIn, route, path)).status).toBe(401);
      const answer = await call(signedIn.get('admin')!, route, path);
      expect(answer.status, JSON.stringify(answer.body)).not.toBe(401);
      expect(answer.status).not.toBe(403);
    });
  }

  for (const route of changingRoutes) {
    it(`${route.method.toUpperCase()} ${route.path}: refused with 403 "csrf" without the token, even for a signed-in admin`, async () => {
      const admin = signedIn.get('admin')!;
      const path = pathFor(route, ridgeback);
      const before = context.db.$client.prepare('select count(*) as n from audit_events').get() as { n: number };
      const answer = await admin.agent[route.method](path).send({});
      expect(answer.status, JSON.stringify(answer.body)).toBe(403);
      expect(answer.body.error.code).toBe('csrf');
      // A wrong token is refused the same way.
      const wrong = await admin.agent[route.method](path).set('X-CSRF-Token', 'x'.repeat(43)).send({});
      expect(wrong.status).toBe(403);
      expect(wrong.body.error.code).toBe('csrf');
      const after = context.db.$client.prepare('select count(*) as n from audit_events').get() as { n: number };
      expect(after.n).toBe(before.n);
    });
  }

  it('public routes answer without a session', async () => {
    expect((await request(context.app).get('/api/health')).status).toBe(200);
    expect((await request(context.app).get('/api/auth/csrf')).status).toBe(200);
  });
});
