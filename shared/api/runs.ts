// Runs as the API, the worker and the client see them: requests, responses, live events and the job payload.
import { z } from 'zod'
import { safeText } from './text'
import { ArrayDescriptor, FiguresOfMerit, SolverWarning } from '../physics/simulation-result'
import { SimulationConfig } from '../physics/simulation-config'

/**
 * Where a run is in its life. (shared/physics/simulation-result.ts RunStatus is the solver's own outcome of one
 * integration: finished | aborted | failed.)
 */
export const RunState = z.enum(['queued', 'running', 'succeeded', 'failed', 'cancelled'])
export type RunState = z.infer<typeof RunState>
export const FINAL_RUN_STATES: readonly RunState[] = ['succeeded', 'failed', 'cancelled']

export const RUN_TITLE_MAX = 200
export const RUN_NOTES_MAX = 10_000

export const RunCreate = z.object({
  groupId: z.uuid({ error: 'must be the id of one of your groups' }),
  title: safeText().trim().min(1, 'must not be empty').max(RUN_TITLE_MAX).describe('Short name shown in the run list'),
  notes: safeText().max(RUN_NOTES_MAX).default('').describe('Free text kept with the run'),
  config: SimulationConfig,
})
export type RunCreate = z.infer<typeof RunCreate>
export type RunCreateInput = z.input<typeof RunCreate>

/** Optional overrides when cloning a run; the config is copied unchanged. */
export const RunClone = z.object({
  title: safeText().trim().min(1, 'must not be empty').max(RUN_TITLE_MAX).optional(),
  notes: safeText().max(RUN_NOTES_MAX).optional(),
})
export type RunClone = z.infer<typeof RunClone>

/** The one number a list shows per run: what the run was most likely about (storage, gain, or reflection). */
export const KeyFigure = z.object({ label: z.string(), value: z.number(), unit: z.string() })
export type KeyFigure = z.infer<typeof KeyFigure>

export function runKeyFigure(f: FiguresOfMerit | null | undefined): KeyFigure | null {
  const c = f?.channels[0]
  if (!c) return null
  // Energy ratios are fractions, as on the run and sweep pages and in the manifest.
  if (c.retrievalEfficiency !== null) return { label: 'retrieval', value: c.retrievalEfficiency, unit: '' }
  if (c.peakStokesGainDb !== null) return { label: 'Stokes gain', value: c.peakStokesGainDb, unit: 'dB' }
  if (c.reflectivity !== null) return { label: 'reflectivity', value: c.reflectivity, unit: '' }
  return null
}

export const RunSummary = z.object({
  id: z.uuid(),
  groupId: z.uuid(),
  authorId: z.uuid().nullable(),
  authorName: z.string().nullable(),
  title: z.string(),
  status: RunState,
  /** Fraction done of the current attempt, 0 to 1. */
  progress: z.number().min(0).max(1),
  /** 0 until a worker first takes the run; each take (including a retry after a lost worker) adds one. */
  attempt: z.number().int().nonnegative(),
  error: z.string().nullable(),
  configHash: z.string(),
  solverVersion: z.string(),
  expectedSeconds: z.number().nullable(),
  createdAt: z.iso.datetime({ offset: true }),
  startedAt: z.iso.datetime({ offset: true }).nullable(),
  finishedAt: z.iso.datetime({ offset: true }).nullable(),
  waveguideName: z.string().nullable().default(null),
  keyFigure: KeyFigure.nullable().default(null),
  /** The sweep this run is a point of, and which point (0-based); null for a single run. */
  sweepId: z.uuid().nullable().default(null),
  sweepPoint: z.number().int().nonnegative().nullable().default(null),
})
export type RunSummary = z.infer<typeof RunSummary>

export const RunDetail = RunSummary.extend({
  notes: z.string(),
  config: SimulationConfig,
  figures: FiguresOfMerit.nullable(),
  warnings: z.array(SolverWarning),
  /** Result arrays of the finished run (empty before). */
  arrays: z.array(ArrayDescriptor),
  heartbeatAt: z.iso.datetime({ offset: true }).nullable(),
  /** 1 = next to start, among queued single runs of every group (sweep points wait behind them); null otherwise. */
  queuePosition: z.number().int().positive().nullable().default(null),
})
export type RunDetail = z.infer<typeof RunDetail>

export const RUN_SORTS = ['created_desc', 'created_asc', 'title_asc', 'title_desc', 'status'] as const
export const RunSort = z.enum(RUN_SORTS)

export const RunListQuery = z.object({
  groupId: z.uuid().optional(),
  status: RunState.optional(),
  /** An author's user id, or "me". */
  author: z.union([z.literal('me'), z.uuid()]).optional(),
  /** Matched against title and notes, case-insensitive. */
  q: safeText().trim().max(200).optional(),
  /**
   * Single runs, points of sweeps, or both; `folded`: single runs and, for each sweep, only its first point's
   * row (the client shows it as the sweep and lists the points on demand).
   */
  kind: z.enum(['all', 'single', 'sweep', 'folded']).default('all'),
  sort: RunSort.default('created_desc'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
})
export type RunListQuery = z.infer<typeof RunListQuery>

export const RunList = z.object({
  items: z.array(RunSummary),
  total: z.number().int().nonnegative(),
  page: z.number().int().positive(),
  pageSize: z.number().int().positive(),
})
export type RunList = z.infer<typeof RunList>

// ---- live events (GET /api/runs/:id/events, server-sent events; `event:` is the key below) ---------

export const RunStatusEvent = z.object({
  status: RunState,
  attempt: z.number().int().nonnegative(),
  error: z.string().nullable().default(null),
})
export type RunStatusEvent = z.infer<typeof RunStatusEvent>

export const RunProgressEvent = z.object({ attempt: z.number().int().nonnegative(), fraction: z.number().min(0).max(1) })
export type RunProgressEvent = z.infer<typeof RunProgressEvent>

/**
 * Map rows [rowStart, rowStart + rowCount) of every space–time map, row-major rowCount × cols, float32
 * little-endian, base64. A new attempt starts its maps from row 0 again: drop blocks of older attempts.
 */
export const RunBlockEvent = z.object({
  attempt: z.number().int().positive(),
  blockIndex: z.number().int().nonnegative(),
  rowStart: z.number().int().nonnegative(),
  rowCount: z.number().int().positive(),
  cols: z.number().int().positive(),
  maps: z.object({ pumpPowerW: z.base64(), stokesPowerW: z.base64(), acousticPhononsPerM: z.base64() }),
})
export type RunBlockEvent = z.infer<typeof RunBlockEvent>

export const RUN_EVENT_KINDS = ['status', 'progress', 'block'] as const
export type RunEventKind = (typeof RUN_EVENT_KINDS)[number]

// ---- queue ----------------------------------------------------------------------------------------

export const RUN_JOB_SCHEMA_VERSION = 1

/** What pg-boss carries; queued jobs outlive deploys, hence the version. */
export const RunJobPayload = z.object({
  schemaVersion: z.literal(RUN_JOB_SCHEMA_VERSION),
  runId: z.uuid(),
})
export type RunJobPayload = z.infer<typeof RunJobPayload>

export const QueueWorker = z.object({
  id: z.string(),
  host: z.string(),
  pid: z.number().int(),
  threads: z.number().int().nonnegative(),
  busy: z.number().int().nonnegative(),
  startedAt: z.iso.datetime({ offset: true }),
  lastSeenAt: z.iso.datetime({ offset: true }),
})
export type QueueWorker = z.infer<typeof QueueWorker>

export const QueueStatus = z.object({
  queued: z.number().int().nonnegative(),
  running: z.number().int().nonnegative(),
  /** Worker processes that reported in the last minute. */
  workers: z.array(QueueWorker),
  /** Mean time from submission to start over runs started in the last hour (s); null without any. */
  meanWaitS: z.number().nonnegative().nullable(),
})
export type QueueStatus = z.infer<typeof QueueStatus>
