/** Whether the browser believes it is online, kept in step with TanStack Query's onlineManager. */
import { useSyncExternalStore } from 'react';
import { onlineManager } from '@tanstack/react-query';

// Both sources notify: the window events may reach us before onlineManager has updated itself.
const subscribe = (notify: () => void) => {
  window.addEventListener('online', notify);
  window.addEventListener('offline', notify);
  const stop = onlineManager.subscribe(notify);
  return () => {
    window.removeEventListener('online', notify);
    window.removeEventListener('offline', notify);
    stop();
  };
};

export function useOnline(): boolean {
  return useSyncExternalStore(
    subscribe,
    () => navigator.onLine && onlineManager.isOnline(),
    () => true,
  );
}
