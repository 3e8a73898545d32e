import { useEffect, useRef } from 'react';

type Handlers = { onLeft?: () => void; onRight?: () => void; onEscape?: () => void };

/** True while typing: arrow keys then move the caret, not the cards. */
function typing(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  if (!el || !el.tagName) return false;
  return el.tagName === 'INPUT' || el.tagName === 'TEXTAREA' || el.isContentEditable;
}

/** Left / Right page the cards (outside text fields), Escape stops following. */
export function useBoardKeys(handlers: Handlers) {
  const ref = useRef(handlers);
  useEffect(() => {
    ref.current = handlers;
  });
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.defaultPrevented || e.altKey || e.ctrlKey || e.metaKey) return;
      const h = ref.current;
      if (e.key === 'Escape' && h.onEscape) {
        h.onEscape();
        e.preventDefault();
      } else if (e.key === 'ArrowLeft' && h.onLeft && !typing(e.target)) {
        h.onLeft();
        e.preventDefault();
      } else if (e.key === 'ArrowRight' && h.onRight && !typing(e.target)) {
        h.onRight();
        e.preventDefault();
      }
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, []);
}
