/**
 * Committing a lab import (PRODUCT.md capability 3): a CSV of single full-shift samples for one new
 * group with ten members is uploaded, then committed through the API (supertest, in process, the demo
 * database). The commit checks every row, stores each result with its audit event in one transaction
 * and reads the results back. No target in the issues; the rows show the cost per row so a change shows.
 * Preparing the three per-row statements once per commit (services/shift-results.ts `shiftResultWriter`)
 * took a first 3,000-row commit from 2.26 s to 1.2–1.3 s (single cold runs, 2026-12-02, the machine in
 * docs/benchmarks.md). The 20,000-row file is the largest the upload accepts.
 */
import { singleSampleCommit, singleSampleLabFile } from '../helpers/lab-files';
import { createTestContext, type SignedIn } from '../helpers/test-app';
import { loadNote, type BenchRow } from './types';

/** A new group, its ten members, and an uploaded (not yet committed) file of `rows` results for it; answers the batch id. */
async function uploadBatch(client: SignedIn, base: string, name: string, rows: number): Promise<number> {
  const sites = (await client.get(`${base}/sites`)).body.items as Array<{ id: number }>;
  const agent = ((await client.get(`${base}/agents?kind=chemical`)).body.items as Array<{ id: number; name: string }>)[0]!;
  const group = await client.post(`${base}/exposure-groups`, {
    siteId: sites[0]!.id,
    agentId: agent.id,
    name,
    oelValue: 1,
    oelUnit: 'mg/m3',
    oelSource: 'Bench limit',
    oelAveragingTime: '8h-twa',
  });
  if (group.status !== 201) throw new Error(`lab-import bench: group answered ${group.status}: ${JSON.stringify(group.body)}`);
  const workers = (await client.get(`${base}/workers?pageSize=10`)).body.items as Array<{ id: number; code: string }>;
  for (const worker of workers) await client.post(`${base}/group-memberships`, { workerId: worker.id, exposureGroupId: group.body.id, fromDate: '2015-01-01' });
  const text = singleSampleLabFile({
    workerCodes: workers.map((worker) => worker.code),
    groupName: name,
    agentName: agent.name,
    rows,
    samplePrefix: name,
    lab: 'Bench lab',
  });
  const uploaded = await client.agent
    .post(`${base}/lab-imports`)
    .set('X-CSRF-Token', client.csrfToken)
    .attach('file', Buffer.from(text, 'utf8'), { filename: `${name}.csv`, contentType: 'text/csv' });
  if (uploaded.status !== 201) throw new Error(`lab-import bench: upload answered ${uploaded.status}: ${JSON.stringify(uploaded.body).slice(0, 300)}`);
  return uploaded.body.batch.id as number;
}

async function timedCommit(client: SignedIn, base: string, batchId: number, rows: number): Promise<number> {
  const start = performance.now();
  const answer = await client.post(`${base}/lab-imports/${batchId}/commit`, singleSampleCommit);
  const seconds = (performance.now() - start) / 1000;
  if (answer.status !== 201 || answer.body.batch.resultCount !== rows)
    throw new Error(`lab-import bench: commit answered ${answer.status}: ${JSON.stringify(answer.body).slice(0, 300)}`);
  return seconds;
}

export async function run(): Promise<BenchRow[]> {
  const context = await createTestContext({ capture: false });
  try {
    const hygienist = await context.signInAs('hygienist');
    const base = `/api/orgs/${context.organizationId('ridgeback')}`;
    const small: number[] = [];
    for (let repeat = 0; repeat < 3; repeat += 1)
      small.push(await timedCommit(hygienist, base, await uploadBatch(hygienist, base, `Bench group ${repeat}`, 3000), 3000));
    small.sort((a, b) => a - b);
    const large = await timedCommit(hygienist, base, await uploadBatch(hygienist, base, 'Bench group large', 20_000), 20_000);
    return [
      {
        suite: 'lab import',
        name: 'commit a 3,000-row lab file (check, store with audit events, read back)',
        value: small[1]!,
        unit: 's',
        note: `median of 3 (${small.map((value) => value.toFixed(2)).join(', ')} s), ${((small[1]! * 1000) / 3000).toFixed(2)} ms per row; in process through the API; no target; ${loadNote()}`,
      },
      {
        suite: 'lab import',
        name: 'commit a 20,000-row lab file (the upload limit)',
        value: large,
        unit: 's',
        note: `one run, ${((large * 1000) / 20_000).toFixed(2)} ms per row; no target; ${loadNote()}`,
      },
    ];
  } finally {
    await context.close();
  }
}
