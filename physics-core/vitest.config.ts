import { defineConfig } from 'vitest/config';

export default defineConfig({
  resolve: { conditions: ['@phasewright/source'] },
  ssr: { resolve: { conditions: ['@phasewright/source'] } },
  test: {
    include: ['src/**/*.test.ts', 'cli/**/*.test.ts'],
    environment: 'node',
    testTimeout: 60_000,
  },
});
