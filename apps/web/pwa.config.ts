import { VitePWA } from 'vite-plugin-pwa';
import { ENTRY_DATA_CACHE } from './src/features/offline/cacheNames';

export function pwaPlugin() {
  return VitePWA({
    registerType: 'autoUpdate',
    injectRegister: false,
    manifestFilename: 'manifest.webmanifest',
    includeAssets: ['favicon.svg', 'icons/apple-touch-icon.png'],
    manifest: {
      name: 'Hitchbook',
      short_name: 'Hitchbook',
      description: 'Log machine and operator time in the cab, with or without signal.',
      start_url: '/',
      scope: '/',
      display: 'standalone',
      orientation: 'portrait',
      background_color: '#f3f5f6',
      theme_color: '#1f4f57',
      icons: [
        { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png' },
        { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png' },
        { src: '/icons/icon-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        { src: '/icons/icon.svg', sizes: 'any', type: 'image/svg+xml' },
      ],
    },
    workbox: {
      globPatterns: ['**/*.{js,css,html,svg,png,woff2,webmanifest}'],
      // Room for the charting chunk too: every chunk is precached, so any page's code opens without signal.
      maximumFileSizeToCacheInBytes: 4 * 1024 * 1024,
      navigateFallback: '/index.html',
      navigateFallbackDenylist: [/^\/api(\/|$)/],
      clientsClaim: true,
      skipWaiting: true,
      cleanupOutdatedCaches: true,
      // The cab form's reads (pickers and last meter readings), marked by the app with a header.
      // ENTRY_DATA_CACHE is deleted when the person on the phone changes.
      runtimeCaching: [
        {
          // Serialized into the worker, so the header name is written out here (networkMode.ts).
          urlPattern: ({ request, sameOrigin }) => sameOrigin && request.method === 'GET' && request.headers.get('X-Hitchbook-Offline') === 'keep',
          handler: 'NetworkFirst',
          options: {
            cacheName: ENTRY_DATA_CACHE,
            // A field edge with one bar of signal: fall back to the kept copy rather than wait.
            networkTimeoutSeconds: 10,
            cacheableResponse: { statuses: [200] },
            expiration: { maxEntries: 300, maxAgeSeconds: 30 * 24 * 60 * 60 },
          },
        },
      ],
    },
  });
}
