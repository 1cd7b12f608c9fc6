import { useEffect, useRef } from 'react';

// Inline panels that behave like dialogs (a form opened by a button, closed by Cancel) close on
// Escape too, the most recently opened first, as a dialog would. One document listener serves all.
const openPanels: { close: () => void }[] = [];

function onKeyDown(event: KeyboardEvent) {
  if (event.key !== 'Escape' || event.defaultPrevented) return;
  const top = openPanels.at(-1);
  if (!top) return;
  event.preventDefault();
  top.close();
}

/** While `open`, Escape calls `close` (the latest opened panel first). */
export function useCloseOnEscape(open: boolean, close: () => void): void {
  const latest = useRef(close);
  useEffect(() => {
    latest.current = close;
  }, [close]);
  useEffect(() => {
    if (!open) return undefined;
    const entry = { close: () => latest.current() };
    openPanels.push(entry);
    if (openPanels.length === 1) document.addEventListener('keydown', onKeyDown);
    return () => {
      openPanels.splice(openPanels.indexOf(entry), 1);
      if (openPanels.length === 0) document.removeEventListener('keydown', onKeyDown);
    };
  }, [open]);
}
