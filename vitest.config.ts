import { defineConfig } from 'vitest/config';

// Plain vitest config (no Astro Vite plugins) so generator tests stay fast.
// Browser tests under test/site/ build the demo once in a global setup.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    testTimeout: 60_000,
    hookTimeout: 600_000,
    pool: 'forks',
    reporters: ['default'],
  },
});
