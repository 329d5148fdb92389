// Every icon name the client uses has its SVG path (src/plugins/icon-paths.ts): a missing one would render as an empty box.
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { REPO_ROOT } from '../../server/env'
import { ICON_PATHS } from '../../src/plugins/icon-paths'
import { iconPath } from '../../src/plugins/icons'

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    if (statSync(path).isDirectory()) return sourceFiles(path)
    return /\.(vue|ts)$/.test(name) && !/\.(spec|test)\.ts$/.test(name) ? [path] : []
  })
}

describe('icons', () => {
  it('has an SVG path for every mdi- name used in src/', () => {
    const used = new Set<string>()
    for (const file of sourceFiles(join(REPO_ROOT, 'src'))) {
      for (const m of readFileSync(file, 'utf8').matchAll(/['"` ](mdi-[a-z0-9-]+)/g)) used.add(m[1])
    }
    expect(used.size).toBeGreaterThan(20)
    const missing = [...used].filter((name) => !(name in ICON_PATHS))
    expect(missing).toEqual([])
  })

  it('turns a name into its path and leaves paths and aliases alone', () => {
    expect(iconPath('mdi-close')).toMatch(/^M[\d.]+/)
    expect(iconPath('svg:M1,2Z')).toBe('svg:M1,2Z')
  })
})
