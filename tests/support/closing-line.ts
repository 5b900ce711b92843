// Adds one plain closing line after vitest's own summary ("Tests: 12 passed, 0 failed"), the
// form that CI reads whatever the runner.
import type { Reporter, TestModule } from 'vitest/node'

export default class ClosingLine implements Reporter {
  onTestRunEnd(testModules: ReadonlyArray<TestModule>) {
    let passed = 0
    let failed = 0
    let skipped = 0
    for (const mod of testModules) {
      for (const test of mod.children.allTests()) {
        const state = test.result().state
        if (state === 'passed') passed++
        else if (state === 'failed') failed++
        else skipped++
      }
    }
    process.stdout.write(`Tests: ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}\n`)
  }
}
