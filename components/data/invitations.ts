import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { authCall } from '@/components/auth/auth-call';
import { authClient } from '@/components/auth/auth-client';
import type { PublicInvitation } from '@/server/contracts/team';

import { api } from './api';
import { meKeys } from './me';
import { STALE } from './stale-times';

/** GET /api/invitations/:id — readable before sign-in, so the screen can say who invited whom. */
export type InvitationSummary = PublicInvitation;

export const invitationKeys = {
  detail: (invitationId: string) => ['invitation', invitationId] as const,
};

export function useInvitationQuery(invitationId: string | undefined) {
  return useQuery({
    queryKey: invitationKeys.detail(invitationId ?? ''),
    queryFn: ({ signal }) =>
      api.get<InvitationSummary>(`/api/invitations/${encodeURIComponent(invitationId!)}`, signal),
    staleTime: STALE.minutes.one,
    enabled: !!invitationId,
  });
}

/** Accepts as the signed-in user (whose e-mail must match); answers the joined Team's id. */
export function useAcceptInvitationMutation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ invitationId }: { invitationId: string }) => {
      const result = (await authCall(authClient.organization.acceptInvitation({ invitationId }))) as {
        member?: { organizationId?: string };
        invitation?: { organizationId?: string };
      } | null;
      return { teamId: result?.member?.organizationId ?? result?.invitation?.organizationId ?? null };
    },
    onSuccess: async (_, { invitationId }) => {
      await qc.invalidateQueries({ queryKey: meKeys.all });
      void qc.invalidateQueries({ queryKey: invitationKeys.detail(invitationId) });
    },
  });
}
