// The committed WebAssembly engine (solver/engine/svea-step-binary.ts) is the compile of its AssemblyScript
// source: scripts/build-wasm.mjs --check recompiles the source with the pinned compiler and compares the bytes.
// No binary without its source: an edit of the source without a rebuild, or a hand-edited binary, fails here.
import { spawnSync } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { SVEA_STEP_WASM_BASE64 } from '../../solver/engine/svea-step-binary'

const ROOT = fileURLToPath(new URL('../..', import.meta.url))

describe('WebAssembly engine build', () => {
  it('the committed module matches a fresh compile of its source', () => {
    const r = spawnSync(process.execPath, ['scripts/build-wasm.mjs', '--check'], { cwd: ROOT, encoding: 'utf8' })
    expect(r.stderr).toBe('')
    expect(r.stdout).toMatch(/matches its source/)
    expect(r.status).toBe(0)
  })

  it('the module is WebAssembly (magic number and version 1, WebAssembly Core Specification §5.5.16)', () => {
    const bytes = Buffer.from(SVEA_STEP_WASM_BASE64, 'base64')
    expect([...bytes.subarray(0, 8)]).toEqual([0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00])
  })
})
