import { useEffect, useState } from 'react';

/**
 * The token of a mailed link, read once from the address's fragment (#token=…), which browsers
 * never send to a server; the fragment is then dropped from the address bar and history.
 */
export function useLinkToken(): string {
  const [token] = useState(() => new URLSearchParams(window.location.hash.slice(1)).get('token') ?? '');
  useEffect(() => {
    if (window.location.hash) window.history.replaceState(window.history.state, '', window.location.pathname);
  }, []);
  return token;
}
