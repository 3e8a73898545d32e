import { useEffect } from 'react';

/** Names the browser tab after the screen ("Reviews · Cyclemoot"). */
export function useDocumentTitle(title: string | undefined) {
  useEffect(() => {
    if (title) document.title = `${title} · Cyclemoot`;
  }, [title]);
}
