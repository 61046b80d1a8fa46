import { defineConfig } from 'vitest/config';

// `npm run fuzz`: the reader fuzz suite at full size (issue 7: at least 100,000 cases).
export default defineConfig({
  test: {
    include: ['test/robustness/reader-fuzz.test.ts'],
    env: { ZVET_FUZZ_CASES: '100000' },
    testTimeout: 3_600_000,
    pool: 'forks',
  },
});
