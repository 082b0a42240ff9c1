import { useCallback, useState } from 'react';
import { Link, useNavigate } from 'react-router';
import { useAgentChoices } from '@frontend/features/agents/api/get-agents';
import { useOelEntriesOfAgent } from '@frontend/features/agents/api/get-oel-entries';
import { GroupForm } from '@frontend/features/exposure-groups/components/group-form';
import { useSiteChoices } from '@frontend/features/sites/api/get-sites';
import { EmptyState, ErrorState, LoadingState } from '@frontend/components/states';
import type { ExposureGroupView } from '@frontend/lib/api-types';
import { useMembership } from './use-membership';

/**
 * The group form with what it picks from: sites and agents in use, and the OEL list entries of
 * the agent chosen. Shared by /exposure-groups/new and /exposure-groups/:groupId/edit.
 */
export function GroupFormPage({ group }: { group?: ExposureGroupView }) {
  const membership = useMembership();
  const organizationId = membership.organizationKey;
  const navigate = useNavigate();
  const sites = useSiteChoices(organizationId);
  const agents = useAgentChoices(organizationId);
  const [agentId, setAgentId] = useState<number | undefined>(group?.agentId);
  const entries = useOelEntriesOfAgent(organizationId, agentId);
  const onAgentChange = useCallback((next: number | undefined) => setAgentId(next), []);
  const base = `/orgs/${encodeURIComponent(organizationId)}`;

  if (sites.isError || agents.isError)
    return (
      <ErrorState
        title="Could not load the sites and agents"
        error={sites.error ?? agents.error}
        onRetry={() => void Promise.all([sites.refetch(), agents.refetch()])}
      />
    );
  if (!sites.data || !agents.data) return <LoadingState label="Loading sites and agents…" />;
  if (!group && (sites.data.items.length === 0 || agents.data.items.length === 0)) {
    return (
      <EmptyState title="Set up a site and an agent first">
        A group belongs to a <Link to={`${base}/sites`}>site</Link> and is judged for one <Link to={`${base}/agents`}>agent</Link>.
      </EmptyState>
    );
  }
  return (
    <GroupForm
      organizationId={organizationId}
      group={group}
      sites={sites.data.items}
      agents={agents.data.items}
      oelEntries={entries.data?.items ?? []}
      agentOfEntries={entries.data ? agentId : undefined}
      onAgentChange={onAgentChange}
      onCancel={() => navigate(group ? `${base}/exposure-groups/${group.id}` : `${base}/exposure-groups`)}
      onSaved={(saved) =>
        navigate(`${base}/exposure-groups/${saved.id}`, { state: { saved: group ? 'Group saved.' : 'Group created. Add its members next.' } })
      }
    />
  );
}
