import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['src/**/*.test.ts', 'src/**/*.test.mjs'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
    // The browser tests share one seeded database and one API; running files side by side
    // would let one test's sign-ins and edits show up in another's screens.
    fileParallelism: false,
  },
});
