/**
 * Prints one plain closing line after the run, "Sealwork: N passed, N failed, N skipped",
 * so anything reading the log (a person, CI) sees the count without colours or layout.
 */
import type { Reporter, TestModule } from 'vitest/node';

export default class PlainSummaryReporter implements Reporter {
  onTestRunEnd(testModules: ReadonlyArray<TestModule>): void {
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
    }
    console.log(`Sealwork: ${passed} passed, ${failed} failed, ${skipped} skipped`);
  }
}
