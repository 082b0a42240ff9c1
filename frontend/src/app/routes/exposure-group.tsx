import { Link, useLocation, useParams } from 'react-router';
import { can } from '@schema/permissions';
import { useGroupOverview } from '@frontend/features/exposure-groups/api/get-group-overview';
import { useArchiveExposureGroup } from '@frontend/features/exposure-groups/api/update-exposure-group';
import { GroupDefinition } from '@frontend/features/exposure-groups/components/group-definition';
import { limitText } from '@frontend/features/exposure-groups/components/oel-text';
import { GroupProtectorsPanel } from '@frontend/features/hearing-protectors/components/group-protectors-panel';
import { MixtureResultsPanel } from '@frontend/features/mixtures/components/mixture-results-panel';
import { PlanSection } from '@frontend/features/sampling-plans/components/plan-section';
import { GroupResults } from '@frontend/features/shift-results/components/group-results';
import { GroupMembers } from '@frontend/features/workers/components/group-members';
import { workerLabel } from '@frontend/features/workers/components/worker-name';
import { ArchiveToggle } from '@frontend/components/archive-toggle';
import { ButtonLink } from '@frontend/components/button';
import { DocumentTitle } from '@frontend/components/document-title';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { useCanEdit } from '../use-can-edit';
import { useMembership } from '../use-membership';

const sections = [
  ['definition-title', 'Definition'],
  ['members-title', 'Members'],
  ['plan-title', 'Sampling plan'],
  ['results-title', 'Results'],
] as const;

/**
 * /orgs/:orgId/exposure-groups/:groupId — the hygienist's daily page: the group's definition,
 * members over time, sampling plan and results, with a link to its assessment. One request
 * (the overview) for everything but the results table, which the server pages.
 */
export function Component() {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const { groupId = '' } = useParams();
  const location = useLocation();
  const canEdit = useCanEdit();
  const canSeeNames = can(membership.role, 'workerNames:read');
  const overview = useGroupOverview(organizationId, groupId);
  const archive = useArchiveExposureGroup(organizationId);
  const saved = (location.state as { saved?: string } | null)?.saved;
  const base = `/orgs/${encodeURIComponent(organizationId)}`;

  return (
    <>
      <DocumentTitle title={`${overview.data?.group.name ?? 'Exposure group'} · ${membership.organizationName}`} />
      <QueryState query={overview} loading="Loading the group…" errorTitle="Could not load the group">
        {(data) => {
          const { group } = data;
          // Everyone who was ever a member may have a result; the server checks the date.
          const seen = new Set<number>();
          const workers = data.members
            .filter((member) => !member.worker.archived && !seen.has(member.worker.id) && seen.add(member.worker.id))
            .map((member) => ({ id: member.worker.id, label: workerLabel(member.worker) }))
            .sort((a, b) => a.label.localeCompare(b.label));
          return (
            <>
              <PageHeader
                eyebrow={
                  <>
                    <Link to={`${base}/exposure-groups`} className="underline">
                      Exposure groups
                    </Link>{' '}
                    · {data.site.name}
                  </>
                }
                title={group.name}
                description={`${data.agent.name}, judged against ${limitText(group.effectiveOel.value, group.effectiveOel.unit)}. ${data.counts.valid} valid result${data.counts.valid === 1 ? '' : 's'} (${data.counts.nonDetect} below detection), ${data.counts.void} void.`}
                actions={
                  <>
                    <ButtonLink to={`${base}/exposure-groups/${group.id}/assessment`} variant="primary">
                      Assessment
                    </ButtonLink>
                    {canSeeNames && <ButtonLink to="worker-letters">Worker letters</ButtonLink>}
                    {data.agent.kind === 'noise' && <ButtonLink to="noise-estimates">Noise estimate (ISO 9612)</ButtonLink>}
                    {canEdit && !group.archived && <ButtonLink to="edit">Edit group</ButtonLink>}
                    {canEdit && (
                      <ArchiveToggle
                        size="md"
                        archived={group.archived}
                        name={group.name}
                        what="exposure group"
                        consequence="It leaves the lists and pick lists; its members, plans and results stay and can be brought back."
                        onChange={(archived, reason) => archive.mutateAsync({ groupId: group.id, archived, reason })}
                      />
                    )}
                  </>
                }
              />
              <nav aria-label="On this page" className="-mt-2 mb-4 flex flex-wrap gap-x-4 gap-y-1 text-sm">
                {sections.map(([id, label]) => (
                  <a key={id} href={`#${id}`}>
                    {label}
                  </a>
                ))}
              </nav>
              <div className="space-y-8">
                {saved && <Notice tone="success">{saved}</Notice>}
                {group.archived && <Notice tone="warning">This group is archived: its records are kept and shown, but nothing new can be added.</Notice>}
                <GroupDefinition overview={data} />
                {data.agent.kind === 'noise' && (
                  <GroupProtectorsPanel organizationId={organizationId} groupId={group.id} canEdit={canEdit && !group.archived} />
                )}
                {data.agent.kind === 'mixture' && (
                  <MixtureResultsPanel organizationId={organizationId} groupId={group.id} canEdit={canEdit && !group.archived} />
                )}
                <aside aria-label="Cautions" className="rounded-md border border-amber-300/80 bg-amber-50/70 px-4 py-3 text-sm text-amber-950">
                  <ul className="space-y-1">
                    {data.cautions.map((caution) => (
                      <li key={caution}>{caution}</li>
                    ))}
                  </ul>
                </aside>
                <GroupMembers organizationId={organizationId} group={group} members={data.members} canEdit={canEdit} canSeeNames={canSeeNames} />
                <PlanSection
                  organizationId={organizationId}
                  group={group}
                  plan={data.currentPlan}
                  plans={data.plans}
                  guidance={data.guidance}
                  canEdit={canEdit}
                  canSeeNames={canSeeNames}
                />
                <GroupResults
                  organizationId={organizationId}
                  group={{ id: group.id, name: group.name, unit: group.oelUnit, agentKind: data.agent.kind, archived: group.archived }}
                  workers={workers}
                  canEdit={canEdit}
                  canSeeNames={canSeeNames}
                />
              </div>
            </>
          );
        }}
      </QueryState>
    </>
  );
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
