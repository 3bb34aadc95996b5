import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import { pwaPlugin } from './pwa.config';

const apiPort = process.env.API_PORT ?? '3001';
const port = Number(process.env.PORT ?? 3000);

export default defineConfig({
  plugins: [react(), pwaPlugin()],
  server: {
    host: '127.0.0.1',
    port,
    strictPort: true,
    proxy: { '/api': { target: `http://127.0.0.1:${apiPort}`, changeOrigin: false } },
  },
  preview: { host: '127.0.0.1', port },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    sourcemap: true,
    // Mantine and React make a large but cacheable entry chunk; route chunks stay small.
    chunkSizeWarningLimit: 900,
    rolldownOptions: {
      output: {
        // Mantine's own core (provider, factories, styles API) is under every component; left to the
        // splitter it scatters over many small chunks that compress worse than one.
        codeSplitting: { groups: [{ name: 'mantine-core', test: /@mantine[\\/]core[\\/]esm[\\/]core[\\/]/ }] },
      },
    },
  },
});
