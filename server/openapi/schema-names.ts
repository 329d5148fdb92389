// The name a shared schema is exported under, found by identity, so the API description names
// components exactly as the code does without a list to keep up to date.
import type { z } from 'zod'
import * as apiError from '@shared/api/api-error'
import * as auth from '@shared/api/auth'
import * as fits from '@shared/api/fits'
import * as groups from '@shared/api/groups'
import * as health from '@shared/api/health'
import * as queue from '@shared/api/queue'
import * as runs from '@shared/api/runs'
import * as shares from '@shared/api/shares'
import * as sweeps from '@shared/api/sweeps'
import * as traces from '@shared/api/traces'
import * as waveguidesApi from '@shared/api/waveguides-api'

const MODULES: Record<string, unknown>[] = [apiError, auth, fits, groups, health, queue, runs, shares, sweeps, traces, waveguidesApi]

let names: Map<unknown, string> | null = null

function isSchema(value: unknown): value is z.ZodType {
  return typeof value === 'object' && value !== null && '_zod' in value
}

/** `RunCreate` for the RunCreate schema of shared/api/runs.ts; undefined for a schema no API module exports. */
export function schemaName(schema: z.ZodType): string | undefined {
  if (!names) {
    names = new Map()
    // First export wins: a schema re-exported under a second name keeps its first one.
    for (const mod of MODULES) for (const [name, value] of Object.entries(mod)) if (isSchema(value) && !names.has(value)) names.set(value, name)
  }
  return names.get(schema)
}
