// Project-specific lint rules (plain JavaScript: ESLint loads them without a build step).
import { readdirSync } from 'node:fs'
import { basename, dirname, extname } from 'node:path'

/** The case of a file's base name (before its first dot); null for one lower-case word, which fits any. */
export function nameCase(file) {
  const stem = basename(file).split('.')[0]
  if (/^[A-Z][A-Za-z0-9]*$/.test(stem)) return 'PascalCase'
  if (/^[a-z0-9]+$/.test(stem)) return null
  if (/^[a-z0-9]+(-[a-z0-9]+)+$/.test(stem)) return 'kebab-case'
  if (/^[a-z][a-zA-Z0-9]*$/.test(stem)) return 'camelCase'
  return 'mixed'
}

const SOURCE = new Set(['.ts', '.js', '.mjs', '.vue'])

/**
 * Vue components are PascalCase; the other modules of a folder share one case (kebab-case, or camelCase
 * for the composables folder), so a newcomer can guess a file's name. A test or spec named after a Vue
 * component (Thing.spec.ts) follows the component.
 */
const oneFileNameCase = {
  meta: { type: 'suggestion', schema: [], messages: { mixed: "'{{name}}' is {{mine}} but this folder's other modules are {{theirs}}: use one case per folder." , vue: "Vue component '{{name}}' must be PascalCase.", composable: "Composable '{{name}}' belongs in src/composables as useThing.ts." } },
  create(context) {
    const file = context.filename
    return {
      Program(node) {
        const name = basename(file)
        if (extname(name) === '.vue') {
          if (nameCase(name) !== 'PascalCase') context.report({ node, messageId: 'vue', data: { name } })
          return
        }
        const stem = name.split('.')[0]
        if (/^use[A-Z-]/.test(stem) && file.includes('/src/') && !file.includes('/src/composables/')) {
          context.report({ node, messageId: 'composable', data: { name } })
          return
        }
        const mine = nameCase(name)
        if (mine === null || mine === 'PascalCase') return
        let siblings
        try {
          siblings = readdirSync(dirname(file))
        } catch {
          return
        }
        const theirs = new Set(
          siblings
            .filter((f) => SOURCE.has(extname(f)) && extname(f) !== '.vue' && !f.endsWith('.d.ts') && f !== name)
            .map(nameCase)
            .filter((c) => c !== null && c !== 'PascalCase' && c !== mine),
        )
        if (theirs.size > 0) context.report({ node, messageId: 'mixed', data: { name, mine, theirs: [...theirs].join(', ') } })
      },
    }
  },
}

export const projectRules = { rules: { 'one-file-name-case': oneFileNameCase } }
