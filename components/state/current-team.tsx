import { createContext, useCallback, useContext, useMemo, useState, type ReactNode } from 'react';

import { readLocal, writeLocal } from '@/components/ui/local-store';
import type { TeamMembership } from '@/server/contracts/team';

type CurrentTeamApi = {
  /** The Team the screens show, or null when the user belongs to none. */
  team: TeamMembership | null;
  teams: TeamMembership[];
  selectTeam: (teamId: string) => void;
};

const CurrentTeamContext = createContext<CurrentTeamApi | null>(null);
const keyFor = (userId: string) => `cyclemoot.team.${userId}`;

/**
 * The chosen Team, remembered per user across reloads. Falls back to the first Team when
 * the remembered one is gone (left, removed, or another user on this browser).
 */
export function CurrentTeamProvider({
  userId,
  teams,
  children,
}: {
  userId: string;
  teams: TeamMembership[];
  children: ReactNode;
}) {
  const [chosenId, setChosenId] = useState<string | null>(() => readLocal(keyFor(userId)));
  const team = useMemo(() => teams.find((t) => t.id === chosenId) ?? teams[0] ?? null, [teams, chosenId]);
  const selectTeam = useCallback(
    (teamId: string) => {
      writeLocal(keyFor(userId), teamId);
      setChosenId(teamId);
    },
    [userId],
  );
  const api = useMemo(() => ({ team, teams, selectTeam }), [team, teams, selectTeam]);
  return <CurrentTeamContext.Provider value={api}>{children}</CurrentTeamContext.Provider>;
}

export function useCurrentTeam(): CurrentTeamApi {
  const api = useContext(CurrentTeamContext);
  if (!api) throw new Error('useCurrentTeam needs a CurrentTeamProvider above it.');
  return api;
}

/** Remembers a Team as current for a user without a provider (e.g. right after accepting an invitation). */
export function rememberTeam(userId: string, teamId: string) {
  writeLocal(keyFor(userId), teamId);
}
