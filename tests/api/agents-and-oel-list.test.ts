import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, type SignedIn, type TestContext } from '../helpers/test-app';
import { agentId, auditOf } from '../helpers/org-data';

describe('agents and the organization’s OEL list', () => {
  let context: TestContext;
  let ridgeback: number;
  let slateHarbor: number;
  let hygienist: SignedIn;
  let agentsPath: string;
  let entriesPath: string;
  beforeAll(async () => {
    context = await createTestContext();
    ridgeback = context.organizationId('ridgeback');
    slateHarbor = context.organizationId('slateHarbor');
    hygienist = await context.signInAs('hygienist');
    agentsPath = `/api/orgs/${ridgeback}/agents`;
    entriesPath = `/api/orgs/${ridgeback}/oel-entries`;
  });
  afterAll(() => context.close());

  it('creates a chemical with CAS number and molecular weight (201, audited)', async () => {
    const answer = await hygienist.post(agentsPath, { name: 'Toluene', kind: 'chemical', casNumber: '108-88-3', molecularWeight: 92.14 });
    expect(answer.status).toBe(201);
    expect(answer.body).toMatchObject({ name: 'Toluene', kind: 'chemical', casNumber: '108-88-3', molecularWeight: 92.14, archived: false });
    expect(auditOf(context.db, 'agent', answer.body.id)[0]).toMatchObject({ action: 'created', after: { casNumber: '108-88-3', molecularWeight: 92.14 } });
  });

  it('a wrong CAS check digit and a molecular weight for noise answer 400 naming the field', async () => {
    const cas = await hygienist.post(agentsPath, { name: 'Xylene', kind: 'chemical', casNumber: '1330-20-8' });
    expect(cas.status).toBe(400);
    expect(cas.body.error.fields.casNumber).toMatch(/check digit/);
    const noise = await hygienist.post(agentsPath, { name: 'Impact noise', kind: 'noise', molecularWeight: 10 });
    expect(noise.status).toBe(400);
    expect(noise.body.error.fields).toEqual({ molecularWeight: 'Noise has no molecular weight' });
  });

  it('lists agents filtered by kind and searched by CAS number', async () => {
    const chemicals = await hygienist.get(`${agentsPath}?kind=chemical&sort=-name`);
    expect(chemicals.body.items.map((agent: { name: string }) => agent.name)).toEqual(['Toluene', 'Inhalable wood dust']);
    const byCas = await hygienist.get(`${agentsPath}?q=108-88`);
    expect(byCas.body.items).toEqual([expect.objectContaining({ name: 'Toluene' })]);
    const bad = await hygienist.get(`${agentsPath}?kind=dust`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ kind: 'Use noise or chemical' });
  });

  it('the kind of an agent used by groups cannot change (409); one in use is not archived (409)', async () => {
    const woodDust = agentId(context.db, ridgeback, 'Inhalable wood dust');
    const kind = await hygienist.patch(`${agentsPath}/${woodDust}`, { kind: 'noise' });
    expect(kind.status).toBe(409);
    expect(kind.body.error.message).toMatch(/The kind of "Inhalable wood dust" cannot change: 2 exposure group\(s\)/);
    const archive = await hygienist.post(`${agentsPath}/${woodDust}/archive`, {});
    expect(archive.status).toBe(409);
    expect(archive.body.error.message).toMatch(/agent of 2 exposure group\(s\) in use/);
  });

  it('adds an OEL list entry and lists the list with the agent’s name, filtered by agent', async () => {
    const toluene = agentId(context.db, ridgeback, 'Toluene');
    const created = await hygienist.post(entriesPath, {
      agentId: toluene,
      source: 'Example limit (test data)',
      value: 20,
      unit: 'ppm',
      averagingTime: '8h-twa',
    });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ agentName: 'Toluene', agentKind: 'chemical', value: 20, unit: 'ppm', archived: false });
    const list = await hygienist.get(`${entriesPath}?agentId=${toluene}`);
    expect(list.body.total).toBe(1);
    const sorted = await hygienist.get(`${entriesPath}?sort=-value`);
    expect(sorted.body.items[0]).toMatchObject({ agentName: 'Noise', value: 100, unit: 'dose-percent' });
  });

  it('an OEL unit that does not fit the agent, or another organization’s agent, answers 400 naming the field', async () => {
    const noise = agentId(context.db, ridgeback, 'Noise');
    const unit = await hygienist.post(entriesPath, { agentId: noise, source: 'x', value: 1, unit: 'mg/m3', averagingTime: '8h-twa' });
    expect(unit.status).toBe(400);
    expect(unit.body.error.fields.unit).toBe('mg/m³ does not fit noise ("Noise"): use dB(A) or % dose');
    const foreign = agentId(context.db, slateHarbor, 'Respirable crystalline silica (quartz)');
    const other = await hygienist.post(entriesPath, { agentId: foreign, source: 'x', value: 1, unit: 'mg/m3', averagingTime: '8h-twa' });
    expect(other.status).toBe(400);
    expect(other.body.error.fields).toEqual({ agentId: `No agent ${foreign} in this organization` });
    const value = await hygienist.post(entriesPath, { agentId: noise, source: 'x', value: 0, unit: 'dBA', averagingTime: '8h-twa' });
    expect(value.body.error.fields).toEqual({ value: 'Use a limit above 0' });
  });

  it('edits, archives and brings back an OEL list entry, each audited', async () => {
    const toluene = agentId(context.db, ridgeback, 'Toluene');
    const list = await hygienist.get(`${entriesPath}?agentId=${toluene}`);
    const id = list.body.items[0].id;
    const edited = await hygienist.patch(`${entriesPath}/${id}`, { value: 50 });
    expect(edited.body.value).toBe(50);
    const archived = await hygienist.post(`${entriesPath}/${id}/archive`, { reason: 'Superseded' });
    expect(archived.body.archived).toBe(true);
    expect((await hygienist.get(`${entriesPath}?agentId=${toluene}`)).body.total).toBe(0);
    expect((await hygienist.post(`${entriesPath}/${id}/unarchive`, {})).body.archived).toBe(false);
    expect(auditOf(context.db, 'oel_entry', id).map((event) => event.action)).toEqual(['created', 'updated', 'archived', 'unarchived']);
  });

  it('reads one agent (with how many groups and entries use it) and one OEL list entry', async () => {
    const woodDust = agentId(context.db, ridgeback, 'Inhalable wood dust');
    const agent = await hygienist.get(`${agentsPath}/${woodDust}`);
    expect(agent.status).toBe(200);
    expect(agent.body).toMatchObject({ name: 'Inhalable wood dust', kind: 'chemical', exposureGroupCount: 2, oelEntryCount: 2 });
    const entries = await hygienist.get(`${entriesPath}?agentId=${woodDust}&sort=value`);
    const entry = await hygienist.get(`${entriesPath}/${entries.body.items[0].id}`);
    expect(entry.body).toMatchObject({ agentName: 'Inhalable wood dust', value: 1, unit: 'mg/m3', averagingTime: '8h-twa' });
  });

  it('another organization’s agent or OEL entry answers 404', async () => {
    const foreign = agentId(context.db, slateHarbor, 'Respirable crystalline silica (quartz)');
    expect((await hygienist.get(`${agentsPath}/${foreign}`)).status).toBe(404);
    expect((await hygienist.patch(`${agentsPath}/${foreign}`, { notes: 'x' })).status).toBe(404);
    const slateAdmin = await context.signInAs('admin', 'slateHarbor');
    const slateEntries = await slateAdmin.get(`/api/orgs/${slateHarbor}/oel-entries`);
    const foreignEntry = slateEntries.body.items[0].id;
    expect((await hygienist.get(`${entriesPath}/${foreignEntry}`)).status).toBe(404);
    expect((await hygienist.patch(`${entriesPath}/${foreignEntry}`, { value: 1 })).status).toBe(404);
  });

  it('an analyst reads agents and the OEL list but cannot change them (403)', async () => {
    const analyst = await context.signInAs('analyst');
    expect((await analyst.get(agentsPath)).status).toBe(200);
    expect((await analyst.get(entriesPath)).status).toBe(200);
    expect((await analyst.post(agentsPath, { name: 'Benzene', kind: 'chemical' })).status).toBe(403);
    expect((await analyst.post(entriesPath, {})).status).toBe(403);
  });
});
