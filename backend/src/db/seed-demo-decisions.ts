import { and, eq } from 'drizzle-orm';
import { exposureGroups } from '@schema/exposure-groups';
import { organizations } from '@schema/organizations';
import { users } from '@schema/users';
import type { Clock } from '../clock';
import { createAssessmentEngine } from '../services/assessment';
import { acknowledgeDecision, approveDecisionDraft, createDecisionDraft, returnDecisionDraft } from '../services/decision-records';
import type { Db } from './client';

/*
 * Demo decision records (issue 7), made through the same services as the API so every figure, hash and
 * audit event is what a real approval would give: at Ridgeback Timber two approved records (the saw filer's
 * acknowledged by the manager), one draft waiting for review and one returned; at Slate Harbor one approved.
 * Every rationale is invented.
 */

type Step = 'approved' | 'acknowledged' | 'draft' | 'returned';

interface DemoDecision {
  slug: string;
  group: string;
  domain: string;
  step: Step;
  rationale: string;
  actions: string;
  returnComment?: string;
}

const demoDecisions: DemoDecision[] = [
  {
    slug: 'ridgeback-timber',
    group: 'Saw filer – noise',
    domain: 'ridgeback.example',
    step: 'acknowledged',
    rationale: 'Eight full-shift doses from the autumn campaign, all well below the limit; the filing room wall keeps mill noise out.',
    actions: 'Keep hearing protection available at the grinders; re-measure if the grinders are replaced.',
  },
  {
    slug: 'ridgeback-timber',
    group: 'Edger operator – noise',
    domain: 'ridgeback.example',
    step: 'approved',
    rationale: 'Seven full-shift doses, most above 100 %; the open workstation beside the edger saws is the source.',
    actions:
      'Hearing protection compulsory at the edger now; engineering study of an enclosed booth by the next quarter; audiometric tests for both operators.',
  },
  {
    slug: 'ridgeback-timber',
    group: 'Head sawyer – noise',
    domain: 'ridgeback.example',
    step: 'draft',
    rationale: 'Eight of ten planned shifts measured; the upper tolerance limit is above the limit while the 95th percentile is below it.',
    actions: 'Finish the sampling plan; check the booth window seals.',
  },
  {
    slug: 'ridgeback-timber',
    group: 'Planer feeder – wood dust',
    domain: 'ridgeback.example',
    step: 'returned',
    rationale: 'Nine valid results; one void for a pump fault.',
    actions: 'Review the extraction at the planer infeed.',
    returnComment: 'Say why the void result does not change the picture, and name who reviews the extraction and by when.',
  },
  {
    slug: 'slate-harbor',
    group: 'Installer – respirable crystalline silica',
    domain: 'slateharbor.example',
    step: 'approved',
    rationale: 'Six full-shift results on site installs; dry cutting of sink openings gives the highest values.',
    actions: 'Wet cutting or shrouded tools with extraction on every install; respirators until the next campaign shows control.',
  },
];

function userId(db: Db, email: string): number {
  const row = db.select({ id: users.id }).from(users).where(eq(users.email, email)).get();
  if (!row) throw new Error(`Demo decisions: no demo user ${email}`);
  return row.id;
}

/** Adds the demo decision records to a freshly seeded database (called by seedDemo after its transaction). */
export async function seedDemoDecisions(db: Db, clock: Clock): Promise<void> {
  const engine = createAssessmentEngine();
  try {
    for (const demo of demoDecisions) {
      const organization = db.select({ id: organizations.id }).from(organizations).where(eq(organizations.slug, demo.slug)).get();
      if (!organization) throw new Error(`Demo decisions: no organization ${demo.slug}`);
      const group = db
        .select({ id: exposureGroups.id })
        .from(exposureGroups)
        .where(and(eq(exposureGroups.organizationId, organization.id), eq(exposureGroups.name, demo.group)))
        .get();
      if (!group) throw new Error(`Demo decisions: no group "${demo.group}" in ${demo.slug}`);
      const hygienist = { id: userId(db, `hygienist@${demo.domain}`) };
      const analyst = { id: userId(db, `analyst@${demo.domain}`) };
      const record = await createDecisionDraft(db, clock, engine, {
        organizationId: organization.id,
        groupId: group.id,
        actor: hygienist,
        draft: { rationale: demo.rationale, actions: demo.actions, exclusions: [], prior: 'reference' },
      });
      const ids = { organizationId: organization.id, recordId: record.id };
      if (demo.step === 'returned') returnDecisionDraft(db, clock, { ...ids, actor: analyst, comment: demo.returnComment ?? 'Please revise.' });
      if (demo.step === 'approved' || demo.step === 'acknowledged') await approveDecisionDraft(db, clock, engine, { ...ids, actor: analyst });
      if (demo.step === 'acknowledged') acknowledgeDecision(db, clock, { ...ids, actor: { id: userId(db, `manager@${demo.domain}`) } });
    }
  } finally {
    await engine.close();
  }
}
