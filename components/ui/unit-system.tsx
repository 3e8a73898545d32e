import { createContext, useCallback, useContext, useEffect, useMemo, useState, type ReactNode } from 'react';

import { useSettingsQuery, useUpdateSettingsMutation } from '@/components/data/settings';

import type { UnitSystem } from './format';
import { readLocal, writeLocal } from './local-store';

type UnitSystemApi = {
  system: UnitSystem;
  setSystem: (system: UnitSystem) => void;
  /** True while a change is on its way to the server. */
  saving: boolean;
  /** Why the last change did not stick (the choice went back), or null. */
  saveError: unknown;
};

const UnitSystemContext = createContext<UnitSystemApi>({
  system: 'si',
  setSystem: () => {},
  saving: false,
  saveError: null,
});

const keyFor = (userId: string) => `cyclemoot.units.${userId}`;

/**
 * The person's unit system, kept with their account on the server (GET/PUT /api/me/settings),
 * so every device shows the same. This device remembers the last value it saw only to paint
 * the first screen in the right units before the server answers. Give the provider
 * `key={userId}` so another user starts from their own.
 */
export function UnitSystemProvider({ userId, children }: { userId: string; children: ReactNode }) {
  const settings = useSettingsQuery();
  const update = useUpdateSettingsMutation();
  const [firstPaint] = useState<UnitSystem>(() => (readLocal(keyFor(userId)) === 'us' ? 'us' : 'si'));
  const system: UnitSystem = settings.data?.unitSystem ?? firstPaint;

  const known = settings.data?.unitSystem;
  useEffect(() => {
    if (known) writeLocal(keyFor(userId), known);
  }, [known, userId]);

  const { mutate } = update;
  const setSystem = useCallback((next: UnitSystem) => mutate({ unitSystem: next }), [mutate]);
  const api = useMemo(
    () => ({ system, setSystem, saving: update.isPending, saveError: update.error }),
    [system, setSystem, update.isPending, update.error],
  );
  return <UnitSystemContext.Provider value={api}>{children}</UnitSystemContext.Provider>;
}

export function useUnitSystem(): UnitSystemApi {
  return useContext(UnitSystemContext);
}
