// Prints how many browser tests ran, so a run that silently ran none is visible.
import type { Reporter, TestModule } from 'vitest/node';

export default class BrowserCountReporter implements Reporter {
  onTestRunEnd(testModules: ReadonlyArray<TestModule>): void {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    const browserModules = testModules.filter((m) => m.project.name === 'e2e');
    if (browserModules.length === 0) return;
    for (const module of browserModules) {
      for (const test of module.children.allTests()) {
        const state = test.result().state;
        if (state === 'passed') passed++;
        else if (state === 'failed') failed++;
        else skipped++;
      }
    }
    console.log(`\nBrowser tests in Chromium: ${passed + failed} ran, ${passed} passed, ${failed} failed, ${skipped} skipped`);
  }
}
