// Use cases of measured traces. Group roles as for runs: viewers read, editors upload and delete.
import { ZodError } from 'zod'
import { TraceUploadSettings, type TraceData, type TraceDetail, type TraceImportSettings, type TraceList } from '@shared/api/traces'
import type { Db } from '../../db/client'
import { AppError, notFound } from '../../errors'
import { isUuid } from '../../policy/ids'
import { requireGroupRole, type Role } from '../../policy/access'
import type { AuthContext } from '../auth/auth-context'
import { fromBytes, packSignals, toBytes, unpackSignals } from './trace-arrays'
import { ParseThreadError, traceParsePool, type ParseFailure, type ParseSuccess, type TraceParsePool } from './trace-parse-pool'
import { toDetail, toSummary } from './traces.mapper'
import { deleteTrace, findTraceArrays, findTraceMeta, findTraceOriginal, insertTrace, listTraces, type TraceMeta } from './traces.repo'

export interface TracesDeps {
  db: Db
  /** Where uploads are parsed; the server's one parse thread unless a test brings its own. */
  parsePool?: TraceParsePool
}

export interface UploadedFile {
  originalname: string
  mimetype: string
  buffer: Buffer
}

function readSettings(raw: unknown): TraceUploadSettings {
  if (typeof raw !== 'string') throw new AppError('invalid_input', 400, 'The "settings" part is missing', { fields: [{ path: 'settings', message: 'required' }] })
  let json: unknown
  try {
    json = JSON.parse(raw)
  } catch {
    throw new AppError('invalid_input', 400, 'The "settings" part is not valid JSON', { fields: [{ path: 'settings', message: 'not JSON' }] })
  }
  const parsed = TraceUploadSettings.safeParse(json)
  if (!parsed.success) throw new ZodError(parsed.error.issues.map((i) => ({ ...i, path: ['settings', ...i.path] })))
  return parsed.data
}

/** A refusal from the parser → the answer the uploader sees, naming the file, or the setting to choose. */
function refusal(fileName: string, f: ParseFailure): AppError {
  if (f.field === 'timeUnit') {
    return new AppError('time_unit_required', 422, `${fileName}: ${f.message}`, {
      fields: [{ path: 'settings.timeUnit', message: 'required: the file does not name the unit of its time column' }],
    })
  }
  return new AppError('unreadable_trace', 422, `${fileName}: ${f.message}`, { where: f.where ?? {} })
}

/** Parses in the parse thread (trace-parse-pool.ts); the thread running out of memory or time is the file's doing. */
async function parseUpload(pool: TraceParsePool, file: UploadedFile, settings: TraceImportSettings): Promise<ParseSuccess> {
  let answer
  try {
    answer = await pool.parse(file.buffer, settings)
  } catch (err) {
    if (err instanceof ParseThreadError && err.reason !== 'crash') throw new AppError('unreadable_trace', 422, `${file.originalname}: ${err.message}`, { where: {} })
    throw err
  }
  if (!answer.ok) {
    if (!answer.parseError) throw new Error(`trace parse thread: ${answer.message}`)
    throw refusal(file.originalname, answer)
  }
  return answer
}

export async function uploadTrace(deps: TracesDeps, auth: AuthContext | undefined, file: UploadedFile | undefined, rawSettings: unknown): Promise<TraceDetail> {
  const settings = readSettings(rawSettings)
  await requireGroupRole(deps.db, auth, settings.groupId, 'editor', 'Group')
  if (!file) throw new AppError('invalid_input', 400, 'No file was sent; attach it as the "file" part', { fields: [{ path: 'file', message: 'required' }] })
  const { groupId, ...importSettings } = settings
  const parsed = await parseUpload(deps.parsePool ?? traceParsePool, file, importSettings)
  const n = parsed.timeNs.length
  // One insert: the original, the settings and the parsed arrays are stored together or not at all.
  const id = await insertTrace(deps.db, {
    groupId,
    authorId: auth!.userId,
    name: settings.name,
    notes: settings.notes,
    fileName: file.originalname.slice(0, 255) || 'trace',
    contentType: file.mimetype || 'application/octet-stream',
    byteSize: file.buffer.byteLength,
    sha256: parsed.sha256,
    format: parsed.format,
    original: file.buffer,
    // The unit the numbers were read in is stored, also when the file named it and the upload did not.
    settings: { ...importSettings, ...(parsed.timeUnit ? { timeUnit: parsed.timeUnit } : {}) },
    columns: parsed.columns,
    signals: parsed.signals.map(({ values: _values, ...info }) => info),
    sampleCount: n,
    startNs: parsed.timeNs[0],
    endNs: parsed.timeNs[n - 1],
    timeNs: toBytes(parsed.timeNs),
    signalData: toBytes(packSignals(parsed.signals.map((s) => s.values))),
  })
  return toDetail((await findTraceMeta(deps.db, id))!)
}

/** The trace when the caller has at least `minRole` in its group; 404 for ids that are malformed or unknown. */
export async function traceFor(deps: TracesDeps, auth: AuthContext | undefined, id: string, minRole: Role): Promise<TraceMeta> {
  const row = isUuid(id) ? await findTraceMeta(deps.db, id) : null
  if (!row) {
    if (!auth) throw new AppError('unauthorized', 401, 'Sign in first')
    throw notFound('Trace')
  }
  await requireGroupRole(deps.db, auth, row.groupId, minRole, 'Trace')
  return row
}

export async function getTrace(deps: TracesDeps, auth: AuthContext | undefined, id: string): Promise<TraceDetail> {
  return toDetail(await traceFor(deps, auth, id, 'viewer'))
}

export async function listTracesFor(deps: TracesDeps, auth: AuthContext | undefined, q: { groupId: string; q?: string; page: number; pageSize: number }): Promise<TraceList> {
  await requireGroupRole(deps.db, auth, q.groupId, 'viewer', 'Group')
  const { rows, total } = await listTraces(deps.db, q.groupId, q.q, q.page, q.pageSize)
  return { items: rows.map(toSummary), total }
}

/** The parsed arrays as numbers; with maxPoints, every stride-th sample. */
export async function traceData(deps: TracesDeps, auth: AuthContext | undefined, id: string, maxPoints?: number): Promise<TraceData> {
  const meta = await traceFor(deps, auth, id, 'viewer')
  const arrays = await loadTraceArrays(deps.db, meta)
  const stride = maxPoints ? Math.max(1, Math.ceil(meta.sampleCount / maxPoints)) : 1
  const thin = (a: Float64Array) => (stride === 1 ? Array.from(a) : Array.from({ length: Math.ceil(a.length / stride) }, (_, i) => a[i * stride]))
  return { timeNs: thin(arrays.timeNs), signals: meta.signals.map((s, k) => ({ label: s.label, unit: s.unit, values: thin(arrays.signals[k]) })), stride }
}

export async function loadTraceArrays(db: Db, meta: TraceMeta): Promise<{ timeNs: Float64Array; signals: Float64Array[] }> {
  const row = await findTraceArrays(db, meta.id)
  if (!row) throw notFound('Trace')
  return { timeNs: fromBytes(row.timeNs), signals: unpackSignals(fromBytes(row.signalData), meta.signals.length) }
}

export async function traceOriginal(deps: TracesDeps, auth: AuthContext | undefined, id: string) {
  await traceFor(deps, auth, id, 'viewer')
  const row = await findTraceOriginal(deps.db, id)
  if (!row) throw notFound('Trace')
  return row
}

export async function removeTrace(deps: TracesDeps, auth: AuthContext | undefined, id: string): Promise<void> {
  await traceFor(deps, auth, id, 'editor')
  await deleteTrace(deps.db, id)
}
