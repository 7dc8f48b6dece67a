import type { Reporter, TestModule } from 'vitest/node';

/**
 * Prints one plain closing line, "Tests: N passed, N failed, N skipped",
 * after vitest's own summary, so any CI can read the outcome.
 */
export default class SummaryReporter implements Reporter {
  onTestRunEnd(testModules: ReadonlyArray<TestModule>, unhandledErrors: ReadonlyArray<unknown>) {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const module of testModules) {
      for (const test of module.children.allTests()) {
        const state = test.result().state;
        if (state === 'passed') passed += 1;
        else if (state === 'failed') failed += 1;
        else skipped += 1;
      }
      // A file that failed to load counts as a failure even with no tests in it.
      if (module.state() === 'failed' && ![...module.children.allTests()].some((t) => t.result().state === 'failed')) failed += 1;
    }
    failed += unhandledErrors.length;
    console.log(`\nTests: ${passed} passed, ${failed} failed, ${skipped} skipped`);
  }
}
