import { createContext, useCallback, useContext, useEffect, useMemo, useState, type ReactNode } from 'react';

import type { UnitSystem } from './format';
import { readLocal, writeLocal } from './local-store';

type UnitSystemApi = { system: UnitSystem; setSystem: (system: UnitSystem) => void };

const UnitSystemContext = createContext<UnitSystemApi>({ system: 'si', setSystem: () => {} });

const keyFor = (userId: string) => `cyclemoot.units.${userId}`;

/** SI by default; US customary as a per-user switch, kept on this device for now. */
export function UnitSystemProvider({ userId, children }: { userId: string; children: ReactNode }) {
  const [system, setState] = useState<UnitSystem>(() => (readLocal(keyFor(userId)) === 'us' ? 'us' : 'si'));
  useEffect(() => {
    setState(readLocal(keyFor(userId)) === 'us' ? 'us' : 'si');
  }, [userId]);
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
