import { createContext, useContext, useEffect, useMemo, useState, type ReactNode } from 'react';

/**
 * Whether a screen's own bottom bar stands in for the main one on a phone (a Review's bar:
 * Board · Matrix · Decision · Activity). The shell hides its bar while any such bar is shown,
 * so a phone never shows two; the screen decides, not a list of paths.
 */
const MainBarContext = createContext<{ claim(): () => void }>({ claim: () => () => {} });

export function MainBarProvider({ children }: { children: (hidden: boolean) => ReactNode }) {
  const [claims, setClaims] = useState(0);
  const value = useMemo(
    () => ({
      claim: () => {
        setClaims((n) => n + 1);
        return () => setClaims((n) => n - 1);
      },
    }),
    [],
  );
  return <MainBarContext.Provider value={value}>{children(claims > 0)}</MainBarContext.Provider>;
}

/** While mounted (and `active`), the main bar gives way to the caller's own bar. */
export function useReplacesMainBar(active = true) {
  const { claim } = useContext(MainBarContext);
  useEffect(() => (active ? claim() : undefined), [active, claim]);
}
