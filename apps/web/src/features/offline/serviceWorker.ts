/**
 * Installs the service worker that keeps the app shell and the cab form's data on the phone. The worker
 * takes over as soon as it is installed (skipWaiting and clientsClaim in pwa.config.ts); a page that was
 * already under an older worker reloads once, so it never runs old code against a new worker's caches.
 * Entries waiting to be sent live in IndexedDB and survive the switch. The browser's own API does this
 * without the workbox-window client, which every page would otherwise load first.
 */
export function registerServiceWorker(): void {
  // The development server builds no worker; only the production build has /sw.js.
  if (!import.meta.env.PROD || !('serviceWorker' in navigator)) return;
  const { serviceWorker } = navigator;
  let reloading = false;
  if (serviceWorker.controller) {
    serviceWorker.addEventListener('controllerchange', () => {
      if (reloading) return;
      reloading = true;
      window.location.reload();
    });
  }
  void serviceWorker.register('/sw.js', { scope: '/' }).catch((error: unknown) => {
    console.warn('The offline copy of Hitchbook could not be installed.', error);
  });
}
