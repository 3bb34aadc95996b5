import { registerSW } from 'virtual:pwa-register';

/**
 * Installs the service worker that keeps the app shell and the cab form's data on the phone.
 * A new version takes over on the next start; entries waiting to be sent live in IndexedDB and
 * survive the switch.
 */
export function registerServiceWorker(): void {
  if (!('serviceWorker' in navigator)) return;
  registerSW({ immediate: true });
}
