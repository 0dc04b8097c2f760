/**
 * Runs `fetch` now, then every `ms` while the page is visible and the browser is online, and
 * again whenever the page comes back into view or the connection returns. One call at a time;
 * the last failure is kept until a call succeeds. (A data-fetching library would do this too,
 * but the runner's single poll is not worth its weight in the page every technician loads.)
 */
import { useEffect, useRef, useState } from 'react';

export function usePoll(fetch: () => Promise<unknown>, ms: number, enabled: boolean): { error: Error | null } {
  const [error, setError] = useState<Error | null>(null);
  const fetchRef = useRef(fetch);
  fetchRef.current = fetch;

  useEffect(() => {
    if (!enabled) return;
    let live = true;
    let busy = false;
    const tick = async () => {
      if (busy || document.visibilityState === 'hidden') return;
      busy = true;
      try {
        await fetchRef.current();
        if (live) setError(null);
      } catch (e) {
        if (live) setError(e instanceof Error ? e : new Error(String(e)));
      } finally {
        busy = false;
      }
    };
    const onVisible = () => document.visibilityState === 'visible' && void tick();
    void tick();
    const timer = setInterval(() => void tick(), ms);
    document.addEventListener('visibilitychange', onVisible);
    window.addEventListener('focus', onVisible);
    return () => {
      live = false;
      clearInterval(timer);
      document.removeEventListener('visibilitychange', onVisible);
      window.removeEventListener('focus', onVisible);
    };
  }, [ms, enabled]);

  return { error };
}
