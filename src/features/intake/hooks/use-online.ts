import { useSyncExternalStore } from 'react';

function subscribe(callback: () => void) {
  window.addEventListener('online', callback);
  window.addEventListener('offline', callback);
  return () => {
    window.removeEventListener('online', callback);
    window.removeEventListener('offline', callback);
  };
}

/** What the browser believes about the connection (it can say online while the hall's Wi-Fi is down). */
export const useOnline = () => useSyncExternalStore(subscribe, () => navigator.onLine);
