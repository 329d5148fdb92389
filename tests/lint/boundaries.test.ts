// The lint rules that keep the dependency arrows fire on a breach (fixtures linted as if they lived in
// the named folders) and stay quiet on the allowed direction.
import { ESLint } from 'eslint'
import { describe, expect, it } from 'vitest'
import { REPO_ROOT } from '../../server/env'

const eslint = new ESLint({ cwd: REPO_ROOT })

async function rulesFired(code: string, filePath: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath })
  return result.messages.map((m) => m.ruleId ?? `fatal: ${m.message}`)
}

describe('lint boundaries', () => {
  it('refuses server or client code in the solver', async () => {
    expect(await rulesFired("import { createApp } from '../server/app'\nexport const x = createApp\n", 'solver/fixture.ts')).toContain('no-restricted-imports')
    expect(await rulesFired("import { api } from '@/api/client'\nexport const x = api\n", 'solver/fixture.ts')).toContain('no-restricted-imports')
  })

  it('refuses server, client and solver code in shared', async () => {
    expect(await rulesFired("import { simulate } from '../solver/index'\nexport const x = simulate\n", 'shared/fixture.ts')).toContain('no-restricted-imports')
    expect(await rulesFired("import { loadEnv } from '../server/env'\nexport const x = loadEnv\n", 'shared/fixture.ts')).toContain('no-restricted-imports')
  })

  it('lets the server use the solver only through solver/index.ts', async () => {
    expect(await rulesFired("import { writeNpy } from '../../solver/io/npy'\nexport const x = writeNpy\n", 'server/jobs/fixture.ts')).toContain('no-restricted-imports')
    expect(await rulesFired("import { simulate } from '../../solver/index'\nexport const x = simulate\n", 'server/jobs/fixture.ts')).toEqual([])
  })

  it('refuses server and solver code in the client', async () => {
    expect(await rulesFired("import { simulate } from '../../solver/index'\nexport const x = simulate\n", 'src/api/fixture.ts')).toContain('no-restricted-imports')
  })

  it('reads configuration only in server/env.ts and the scripts', async () => {
    const code = 'export const port = process.env.PORT\n'
    expect(await rulesFired(code, 'server/modules/runs/fixture.ts')).toContain('no-restricted-syntax')
    expect(await rulesFired(code, 'scripts/fixture.mjs')).toEqual([])
  })

  it('flags unused locals', async () => {
    expect(await rulesFired('export function f(): number {\n  const unused = 1\n  return 2\n}\n', 'shared/fixture.ts')).toContain('@typescript-eslint/no-unused-vars')
  })

  it('keeps composables in src/composables and one file-name case per folder', async () => {
    expect(await rulesFired('export const x = 1\n', 'src/components/run/use-thing.ts')).toContain('project/one-file-name-case')
    expect(await rulesFired('export const x = 1\n', 'server/jobs/runQueue.ts')).toContain('project/one-file-name-case')
    expect(await rulesFired('export const x = 1\n', 'server/jobs/run-queue.ts')).toEqual([])
  })
})
