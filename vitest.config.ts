import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.{ts,tsx}'],
    // A temp folder for the run that must be empty at its end; a config folder per test file.
    globalSetup: ['tests/helpers/run-temp-folder.ts'],
    setupFiles: ['tests/helpers/isolate-config.ts'],
    // Test files share a worker and its module cache: a fresh process and module graph per file cost
    // more than half the suite's time. So nothing is cleaned up by module-level hooks or state:
    // helpers tie their cleanup to the test (onTestFinished), setup files run again for every file.
    isolate: false,
    // Crash and lock tests start real child processes; keep the pool small on 2 cores.
    maxWorkers: 2,
    // A guard against a hang, not a speed check: fsync-bound tests take several times longer when
    // the machine is shared (a 10 s repair test took 25 s at a load of 20 on 2 cores).
    testTimeout: 60_000,
  },
});
