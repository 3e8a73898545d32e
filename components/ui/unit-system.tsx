import { createContext, useCallback, useContext, useMemo, useState, type ReactNode } from 'react';

import type { UnitSystem } from './format';
import { readLocal, writeLocal } from './local-store';

type UnitSystemApi = { system: UnitSystem; setSystem: (system: UnitSystem) => void };

const UnitSystemContext = createContext<UnitSystemApi>({ system: 'si', setSystem: () => {} });

const keyFor = (userId: string) => `cyclemoot.units.${userId}`;

/**
 * SI by default; US customary as a per-user switch, kept on this device for now. The choice
 * is read once: give the provider `key={userId}` so another user starts from their own.
 */
export function UnitSystemProvider({ userId, children }: { userId: string; children: ReactNode }) {
  const [system, setState] = useState<UnitSystem>(() => (readLocal(keyFor(userId)) === 'us' ? 'us' : 'si'));
  const setSystem = useCallback(
    (next: UnitSystem) => {
      writeLocal(keyFor(userId), next);
      setState(next);
    },
    [userId],
  );
  const api = useMemo(() => ({ system, setSystem }), [system, setSystem]);
  return <UnitSystemContext.Provider value={api}>{children}</UnitSystemContext.Provider>;
}

export function useUnitSystem(): UnitSystemApi {
  return useContext(UnitSystemContext);
}
