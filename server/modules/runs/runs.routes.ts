import { Router, type Request } from 'express'
import { z } from 'zod'
import { RunClone, RunCreate, RunListQuery } from '@shared/api/runs'
import { RunEstimateRequest } from '@shared/api/estimates'
import { ShareTokenQuery } from '@shared/api/shares'
import { safeText } from '@shared/api/text'
import { AppError, conflict, notFound } from '../../errors'
import { validate } from '../../middleware/validate'
import { isUuid } from '../../policy/ids'
import { requireAuth } from '../auth/auth.middleware'
import { ArrayQuery, sendArray } from './run-arrays'
import { streamRunZip } from './run-download'
import type { RunEventRelay } from './run-event-relay'
import { streamRunEvents } from './run-events.routes'
import { registerShareable, shareTokenOf } from '../shares'
import { findArray, findRun } from './runs.repo'
import { loadSpeedCalibration } from '../estimates/speed-calibration.service'
import { cancelRun, cloneRun, createRun, estimateRun, getRun, listRunsFor, runFor, type RunsDeps } from './runs.service'

const IdempotencyKey = z.string().regex(/^[\x21-\x7e]{1,200}$/, 'must be 1 to 200 visible ASCII characters')
// Array names reach a query: the shared text rule keeps NUL (which PostgreSQL cannot take) out.
const ArrayName = z.object({ id: z.string(), name: safeText().max(200) })

function idempotencyKey(req: Request): string | undefined {
  const raw = req.get('idempotency-key')
  if (raw === undefined) return undefined
  const parsed = IdempotencyKey.safeParse(raw)
  if (!parsed.success) throw new AppError('invalid_input', 400, 'The Idempotency-Key header is not valid', { fields: [{ path: 'Idempotency-Key', message: parsed.error.issues[0].message }] })
  return parsed.data
}

// Runs get share links (read-only: detail, events, arrays, download).
registerShareable('run', { groupOf: async (db, id) => (isUuid(id) ? ((await findRun(db, id))?.groupId ?? null) : null), pathOf: (id) => `/runs/${id}` })

export function runsRoutes(deps: RunsDeps & { relay: RunEventRelay }): Router {
  const r = Router()

  r.post('/', requireAuth, validate({ body: RunCreate }), async (req, res) => {
    const { run, replayed } = await createRun(deps, req.auth, req.body, idempotencyKey(req))
    if (replayed) res.set('Idempotent-Replayed', 'true')
    res.status(202).location(`/api/runs/${run.id}`).json(run)
  })

  // Before '/:id', which would take these words for an id.
  r.post('/estimate', requireAuth, validate({ body: RunEstimateRequest }), async (req, res) => {
    res.json(await estimateRun(deps, req.body))
  })

  r.get('/speed', requireAuth, async (_req, res) => {
    res.set('Cache-Control', 'no-store').json((await loadSpeedCalibration(deps.pool, deps.log)) ?? { kernels: [] })
  })

  r.get('/', requireAuth, validate({ query: RunListQuery }), async (req, res) => {
    res.json(await listRunsFor(deps, req.auth, req.query as unknown as RunListQuery))
  })

  r.get('/:id', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await getRun(deps, req.auth, String(req.params.id), shareTokenOf(req)))
  })

  r.post('/:id/cancel', requireAuth, async (req, res) => {
    res.json(await cancelRun(deps, req.auth, String(req.params.id)))
  })

  r.post('/:id/clone', requireAuth, validate({ body: RunClone }), async (req, res) => {
    const run = await cloneRun(deps, req.auth, String(req.params.id), req.body)
    res.status(202).location(`/api/runs/${run.id}`).json(run)
  })

  r.get('/:id/events', async (req, res) => {
    const run = await runFor(deps, req.auth, String(req.params.id), 'viewer', shareTokenOf(req))
    await streamRunEvents(req, res, run, deps.pool, deps.relay)
  })

  r.get('/:id/arrays/:name', validate({ params: ArrayName, query: ArrayQuery.extend(ShareTokenQuery.shape) }), async (req, res) => {
    const run = await runFor(deps, req.auth, String(req.params.id), 'viewer', shareTokenOf(req))
    if (run.status !== 'succeeded') throw conflict(`The run has no results yet (it is ${run.status})`)
    const a = await findArray(deps.db, run.id, run.attempt, String(req.params.name))
    if (!a) throw notFound(`Array ${String(req.params.name)}`)
    sendArray(req, res, a)
  })

  r.get('/:id/download', async (req, res) => {
    const run = await runFor(deps, req.auth, String(req.params.id), 'viewer', shareTokenOf(req))
    if (run.status !== 'succeeded' || !run.manifest) throw conflict(`Only finished runs can be downloaded; this one is ${run.status}`)
    await streamRunZip(res, deps.db, run, req.log)
  })

  return r
}
