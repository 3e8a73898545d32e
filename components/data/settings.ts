import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { defaultSettings, type Settings, type UpdateSettingsInput } from '@/server/contracts/settings';

import { api } from './api';
import { meKeys } from './me';
import { STALE } from './stale-times';

export const settingsKeys = {
  mine: [...meKeys.all, 'settings'] as const,
};

/** GET /api/me/settings — the signed-in person's settings, the same on every device. */
export function useSettingsQuery(enabled = true) {
  return useQuery({
    queryKey: settingsKeys.mine,
    queryFn: ({ signal }) => api.get<Settings>('/api/me/settings', signal),
    // Changed only by this person; another device's change shows on the next focus or visit.
    staleTime: STALE.minutes.five,
    enabled,
  });
}

/**
 * PUT /api/me/settings. The choice shows at once (the cache is set before the answer) and
 * goes back to what it was when the server refuses it or cannot be reached.
 */
export function useUpdateSettingsMutation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateSettingsInput) => api.put<Settings>('/api/me/settings', input),
    onMutate: async (input) => {
      // A fetch still on its way must not put the old value back over the new one.
      await qc.cancelQueries({ queryKey: settingsKeys.mine });
      const before = qc.getQueryData<Settings>(settingsKeys.mine);
      qc.setQueryData<Settings>(settingsKeys.mine, (old) => ({ ...(old ?? defaultSettings), ...input }));
      return { before };
    },
    onError: (_error, _input, context) => {
      if (context?.before) qc.setQueryData(settingsKeys.mine, context.before);
      else void qc.invalidateQueries({ queryKey: settingsKeys.mine });
    },
    onSuccess: (saved) => qc.setQueryData(settingsKeys.mine, saved),
  });
}
