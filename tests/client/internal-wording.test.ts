// No internal wording reaches a user: the words of the client (Vue templates and every string in src/) and the
// strings of shared/ (messages, preset sources and notes, schema descriptions) never speak of the project's
// working papers, its validation case numbers or values "from memory" (the user reads "typical values; check
// against the paper" instead). Comments may say where a value came from; only text that can be shown is checked.
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { parse as parseSfc } from '@vue/compiler-sfc'
import ts from 'typescript'
import { describe, expect, it } from 'vitest'
import { REPO_ROOT } from '../../server/env'

const INTERNAL = /\bbrief\b|validation case|\bcase V\d+\b|from memory/i

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    if (statSync(path).isDirectory()) return name === 'test-utils' ? [] : sourceFiles(path)
    return /\.(vue|ts)$/.test(name) && !/\.(spec|test)\.ts$/.test(name) && !name.endsWith('.d.ts') ? [path] : []
  })
}

/** Every string and template-literal piece of a script, without its comments. */
export function scriptStrings(code: string): string[] {
  const out: string[] = []
  const visit = (n: ts.Node) => {
    if (ts.isStringLiteral(n) || ts.isNoSubstitutionTemplateLiteral(n)) out.push(n.text)
    else if (ts.isTemplateHead(n) || ts.isTemplateMiddle(n) || ts.isTemplateTail(n)) out.push(n.text)
    n.forEachChild(visit)
  }
  visit(ts.createSourceFile('x.ts', code, ts.ScriptTarget.Latest, false, ts.ScriptKind.TS))
  return out
}

/** The text of a Vue file a user can see: its template without HTML comments, and the strings of its scripts. */
export function vueTexts(source: string): string[] {
  const { descriptor } = parseSfc(source)
  const template = (descriptor.template?.content ?? '').replace(/<!--[\s\S]*?-->/g, '')
  return [template, ...[descriptor.script, descriptor.scriptSetup].flatMap((s) => (s ? scriptStrings(s.content) : []))]
}

function offenders(dir: string): string[] {
  const found: string[] = []
  for (const file of sourceFiles(join(REPO_ROOT, dir))) {
    const text = readFileSync(file, 'utf8')
    const pieces = file.endsWith('.vue') ? vueTexts(text) : scriptStrings(text)
    for (const p of pieces) {
      const m = INTERNAL.exec(p)
      if (m) found.push(`${relative(REPO_ROOT, file)}: "…${p.slice(Math.max(0, m.index - 30), m.index + 40)}…"`)
    }
  }
  return found
}

describe('internal wording', () => {
  it('finds the words in strings and templates but not in comments (the check itself)', () => {
    expect(scriptStrings('// from memory\nconst a = "values from memory"; const b = `V3 ${1} validation case`')).toEqual(['values from memory', 'V3 ', ' validation case'])
    const sfc = '<template><p>Values from memory</p><!-- validation case --></template>\n<script setup lang="ts">\n/* from memory */ const t = \'ok\'\n</script>'
    expect(vueTexts(sfc).filter((p) => INTERNAL.test(p))).toEqual(['<p>Values from memory</p>'])
  })

  it('has none in the client', () => {
    const files = sourceFiles(join(REPO_ROOT, 'src'))
    expect(files.length).toBeGreaterThan(100)
    expect(offenders('src')).toEqual([])
  })

  it('has none in the strings of shared/', () => {
    expect(offenders('shared')).toEqual([])
  })
})
