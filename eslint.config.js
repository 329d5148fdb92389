// Lint rules that keep the project's boundaries (DEVELOPERS.md, "Layout and dependency arrows"):
//   src → shared ← server → solver ← shared, server reaching the solver only through solver/index.ts,
//   configuration read only in server/env.ts and the scripts, one file-name case per folder, no unused code.
import js from '@eslint/js'
import tseslint from 'typescript-eslint'
import vue from 'eslint-plugin-vue'
import globals from 'globals'
import { projectRules } from './eslint/project-rules.js'

const restrict = (patterns) => ['error', { patterns }]
const fromServer = { group: ['**/server', '**/server/**'], message: 'Only the server may import server code.' }
const fromSrc = { group: ['@/**', '**/src/**'], message: 'Only the client may import client code.' }
const fromSolver = { group: ['**/solver', '**/solver/**', '@solver/**'], message: 'Only the server (through solver/index.ts) and tests may use the solver.' }

export default tseslint.config(
  // solver/engine/assembly is AssemblyScript (its own types), compiled by scripts/build-wasm.mjs.
  { ignores: ['dist/**', 'node_modules/**', 'drizzle/**', '.data/**', 'coverage/**', 'tests/lint/fixtures/**', 'solver/engine/assembly/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...vue.configs['flat/essential'],
  {
    files: ['**/*.vue'],
    languageOptions: { parserOptions: { parser: tseslint.parser, extraFileExtensions: ['.vue'] } },
    // vue-tsc checks names in components, including DOM types such as FrameRequestCallback.
    rules: { 'no-undef': 'off' },
  },
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { project: projectRules },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      // The codebase uses `!` where a Float64Array index is known to be in range and `any` at a few typed edges.
      '@typescript-eslint/no-non-null-assertion': 'off',
      '@typescript-eslint/no-explicit-any': 'off',
      'vue/multi-word-component-names': 'off',
      // Vuetify's data-table slots are named item.<column>: a dot in a slot name, not a modifier.
      'vue/valid-v-slot': ['error', { allowModifiers: true }],
      // Comma-joined assignments are an idiom of the numeric loops here, not forgotten expressions.
      '@typescript-eslint/no-unused-expressions': 'off',
      'project/one-file-name-case': 'error',
      'no-restricted-syntax': [
        'error',
        { selector: "MemberExpression[object.name='process'][property.name='env']", message: 'Read configuration in server/env.ts (loadEnv) and pass it down.' },
      ],
    },
  },
  { files: ['solver/**'], rules: { 'no-restricted-imports': restrict([fromServer, fromSrc]) } },
  { files: ['shared/**'], rules: { 'no-restricted-imports': restrict([fromServer, fromSrc, fromSolver]) } },
  { files: ['src/**'], rules: { 'no-restricted-imports': restrict([fromServer, fromSolver]) } },
  // Component specs may load the shipped example scenarios (data, not solver code) as fixtures.
  { files: ['src/**/*.spec.ts'], rules: { 'no-restricted-imports': restrict([fromServer]) } },
  {
    files: ['server/**'],
    rules: {
      'no-restricted-imports': restrict([
        fromSrc,
        { group: ['**/solver/**', '@solver/**', '!**/solver/index'], message: 'The server uses the solver only through solver/index.ts.' },
      ]),
    },
  },
  {
    // Where configuration is read: the server's env module, the npm scripts, and the test and build harnesses.
    files: ['server/env.ts', 'scripts/**', 'tests/**', 'benchmarks/**', '*.config.ts', '*.config.js', 'server/**/*.test.ts'],
    rules: { 'no-restricted-syntax': 'off', 'no-control-regex': 'off' },
  },
)
