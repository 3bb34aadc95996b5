import { defineConfig } from 'vitest/config';

// Web unit tests cover plain logic only (api client, areas, money), so they run in Node.
export default defineConfig({
  test: { environment: 'node', include: ['src/**/*.test.ts'] },
});
