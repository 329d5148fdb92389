import { Router } from 'express'
import { TraceDataQuery, TraceListQuery } from '@shared/api/traces'
import { validate } from '../../middleware/validate'
import { requireAuth } from '../auth/auth.middleware'
import { receiveTraceUpload } from './trace-upload'
import { getTrace, listTracesFor, removeTrace, traceData, traceOriginal, uploadTrace, type TracesDeps } from './traces.service'

/** RFC 6266 filename: an ASCII fallback plus the UTF-8 name. */
function attachment(name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]|["\\]/g, '_')
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`
}

export function tracesRoutes(deps: TracesDeps): Router {
  const r = Router()

  r.post('/', requireAuth, receiveTraceUpload, async (req, res) => {
    const trace = await uploadTrace(deps, req.auth, req.file, req.body?.settings)
    res.status(201).location(`/api/traces/${trace.id}`).json(trace)
  })

  r.get('/', requireAuth, validate({ query: TraceListQuery }), async (req, res) => {
    res.json(await listTracesFor(deps, req.auth, req.query as unknown as TraceListQuery))
  })

  r.get('/:id', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await getTrace(deps, req.auth, String(req.params.id)))
  })

  r.get('/:id/data', validate({ query: TraceDataQuery }), async (req, res) => {
    const q = req.query as { maxPoints?: number }
    res.set('Cache-Control', 'private, max-age=3600').json(await traceData(deps, req.auth, String(req.params.id), q.maxPoints))
  })

  r.get('/:id/original', async (req, res) => {
    const file = await traceOriginal(deps, req.auth, String(req.params.id))
    // The bytes as uploaded; never rendered by the browser whatever type the uploader claimed.
    res.set({
      'Content-Type': 'application/octet-stream',
      'X-Content-Type-Options': 'nosniff',
      'Content-Disposition': attachment(file.fileName),
      'Content-Length': String(file.original.byteLength),
    })
    res.end(file.original)
  })

  r.delete('/:id', requireAuth, async (req, res) => {
    await removeTrace(deps, req.auth, String(req.params.id))
    res.status(204).end()
  })

  return r
}
