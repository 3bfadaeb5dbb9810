// Prints the plain closing line CI reads: "N passed, N failed, N skipped".
import type { Reporter, TestModule } from 'vitest/node';

export default class SummaryReporter implements Reporter {
  onTestRunEnd(modules: ReadonlyArray<TestModule>, errors: ReadonlyArray<unknown>): void {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const mod of modules) {
      if (mod.state() === 'failed' && [...mod.children.allTests()].length === 0) failed += 1;
      for (const t of mod.children.allTests()) {
        const s = t.result().state;
        if (s === 'passed') passed += 1;
        else if (s === 'failed') failed += 1;
        else skipped += 1;
      }
    }
    failed += errors.length;
    process.stdout.write(`\n${passed} passed, ${failed} failed, ${skipped} skipped\n`);
  }
}
