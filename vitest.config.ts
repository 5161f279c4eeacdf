import { availableParallelism } from 'node:os';
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    globalSetup: ['test/globalSetup.ts'],
    // Vitest's default leaves one core idle (cores − 1): on a 2-core machine that halves the speed.
    maxWorkers: availableParallelism(),
    // Test files share one module cache per worker: the library holds no state but caches, and
    // importing it afresh for every file cost a third of the run.
    isolate: false,
    testTimeout: 60_000,
  },
});
