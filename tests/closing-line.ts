import type { Reporter, TestModule } from 'vitest/node'

// CI reads the plain "N passed, N failed" line; vitest's own summary is not in that form.
export class ClosingLine implements Reporter {
  onTestRunEnd(modules: ReadonlyArray<TestModule>, errors: ReadonlyArray<unknown>): void {
    let passed = 0
    let failed = 0
    let skipped = 0
    for (const m of modules) {
      let moduleFailures = 0
      for (const t of m.children.allTests()) {
        const s = t.result().state
        if (s === 'passed') passed++
        else if (s === 'failed') {
          failed++
          moduleFailures++
        } else skipped++
      }
      // A load error or a failing beforeAll fails the module without failing a test.
      if (m.state() === 'failed' && moduleFailures === 0) failed++
    }
    failed += errors.length
    console.log(`vitest: ${passed} passed, ${failed} failed, ${skipped} skipped`)
  }
}
