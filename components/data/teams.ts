import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { authCall } from '@/components/auth/auth-call';
import { authClient } from '@/components/auth/auth-client';
import type { TeamRole } from '@/server/contracts/roles';
import { teamSlug, type TeamDetail } from '@/server/contracts/team';

import { activityKeys } from './activity';
import { api } from './api';
import { meKeys } from './me';
import { STALE } from './stale-times';

export const teamKeys = {
  all: ['team'] as const,
  detail: (teamId: string) => ['team', teamId] as const,
};

/** GET /api/teams/:teamId — members with roles and pending invitations. */
export function useTeamQuery(teamId: string | undefined) {
  return useQuery({
    queryKey: teamKeys.detail(teamId ?? ''),
    queryFn: ({ signal }) => api.get<TeamDetail>(`/api/teams/${encodeURIComponent(teamId!)}`, signal),
    staleTime: STALE.seconds.thirty,
    enabled: !!teamId,
  });
}

function randomTail(): string {
  return Math.random().toString(36).slice(2, 8);
}

/** Creates a Team (better-auth organization); the creator becomes its Owner. */
export function useCreateTeamMutation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ name }: { name: string }) => {
      const team = await authCall(
        authClient.organization.create({ name: name.trim(), slug: teamSlug(name, randomTail()) }),
        { ORGANIZATION_ALREADY_EXISTS: 'name', ORGANIZATION_SLUG_ALREADY_TAKEN: 'name' },
      );
      return team as { id: string; name: string; slug: string };
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: meKeys.all }),
  });
}

function useTeamChange(teamId: string) {
  const qc = useQueryClient();
  return () =>
    Promise.all([
      qc.invalidateQueries({ queryKey: teamKeys.detail(teamId) }),
      qc.invalidateQueries({ queryKey: activityKeys.team(teamId) }),
    ]);
}

export function useInviteMemberMutation(teamId: string) {
  const refresh = useTeamChange(teamId);
  return useMutation({
    mutationFn: ({ email, role }: { email: string; role: TeamRole }) =>
      authCall(authClient.organization.inviteMember({ email, role, organizationId: teamId }), {
        INVALID_EMAIL: 'email',
        USER_IS_ALREADY_A_MEMBER_OF_THIS_ORGANIZATION: 'email',
        USER_IS_ALREADY_INVITED_TO_THIS_ORGANIZATION: 'email',
      }),
    onSuccess: refresh,
  });
}

export function useCancelInvitationMutation(teamId: string) {
  const refresh = useTeamChange(teamId);
  return useMutation({
    mutationFn: ({ invitationId }: { invitationId: string }) =>
      authCall(authClient.organization.cancelInvitation({ invitationId })),
    onSuccess: refresh,
  });
}

export function useUpdateMemberRoleMutation(teamId: string) {
  const qc = useQueryClient();
  const refresh = useTeamChange(teamId);
  return useMutation({
    mutationFn: ({ memberId, role }: { memberId: string; role: TeamRole }) =>
      authCall(authClient.organization.updateMemberRole({ memberId, role, organizationId: teamId })),
    onMutate: ({ memberId, role }) => {
      // Show the new role at once; the refetch below settles it either way.
      qc.setQueryData<TeamDetail>(teamKeys.detail(teamId), (team) =>
        team ? { ...team, members: team.members.map((m) => (m.memberId === memberId ? { ...m, role } : m)) } : team,
      );
    },
    onSettled: () => {
      void refresh();
      void qc.invalidateQueries({ queryKey: meKeys.all });
    },
  });
}

export function useRemoveMemberMutation(teamId: string) {
  const refresh = useTeamChange(teamId);
  return useMutation({
    mutationFn: ({ memberId }: { memberId: string }) =>
      authCall(authClient.organization.removeMember({ memberIdOrEmail: memberId, organizationId: teamId })),
    onSuccess: refresh,
  });
}
