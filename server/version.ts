import { readFileSync } from 'node:fs'

/** The package version, reported by /api/health. */
export const APP_VERSION: string = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')).version
